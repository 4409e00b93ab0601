/**
 * `npx tsx bench/bundles.ts`: one release of a synthetic site with 20,000 tags in 200
 * groups on 10 gateways — every bundle rendered, validated against the bundle schema,
 * digested and signed, and diffed against the bundle of a slightly different previous
 * configuration (rendered beforehand, as a stored release would be). Target: ≤ 1 s for the
 * whole release. Beside it, in the same run, a plain reference: JSON.stringify of the same
 * bundle contents. Times are the median (and best) of 5 round-robin runs, min(wall, CPU).
 * Validation reads bytes in the renderer's own form directly (lib/bundles/yaml-in.ts); the
 * row "through the full YAML parser" shows the cost for any other text.
 */
import { cpus, loadavg } from "node:os";
import type { GroupConfig, SiteConfig } from "@/lib/config/site-config";
import { diffBundles } from "@/lib/bundles/diff";
import { digestHex } from "@/lib/bundles/digest";
import { renderSiteBundles, bundleContent, type BundleGateway, type BundleTag, type SiteBundlesInput } from "@/lib/bundles/render";
import { resolveSite } from "@/lib/bundles/resolve";
import { generateSigningKey, signBytes } from "@/lib/bundles/signing";
import { summarizeChange } from "@/lib/bundles/summary";
import { validateBundle } from "@/lib/bundles/validate";
import type { Profile } from "@/lib/reduction/profile";
import { roundRobin } from "./timing";

const TAGS = 20_000;
const GROUPS = 200;
const GATEWAYS = 10;
const ROUNDS = 5;
const WARMUPS = 1;
const TARGET_MS = 1000;

const gateways: BundleGateway[] = Array.from({ length: GATEWAYS }, (_, i) => ({ slug: `gw-${String(i + 1).padStart(2, "0")}`, pollSeconds: 60 }));
const RANGES = [100, 150, 200, 250, 400];

/** 200 process units of 98 tags each, spread over four gateways per unit; the rest in no group. */
function inventory(): BundleTag[] {
  const tags: BundleTag[] = [];
  const perGroup = Math.floor(TAGS / GROUPS) - 2;
  for (let u = 0; u < GROUPS; u++) {
    const unit = `U${String(u + 1).padStart(3, "0")}`;
    for (let n = 0; n < perGroup; n++) {
      const kind = u % 10 === 9 ? "counter" : "analog";
      tags.push({
        name: `${unit}/${kind === "counter" ? "FQ" : "TT"}-${String(n + 1).padStart(3, "0")}/PV`,
        kind,
        unit: kind === "counter" ? "m3" : u % 5 === 4 ? "degF" : "degC",
        euLow: kind === "counter" ? null : 0,
        // Half of the units share one range (a scalar parameter), the others vary per tag (a map).
        euHigh: kind === "counter" ? null : u % 2 === 0 ? 150 : RANGES[n % RANGES.length],
        samplePeriodMs: 1000,
        gateway: gateways[(u + Math.floor(n / 25)) % GATEWAYS].slug,
        area: `area-${u % 7}`,
        equipment: unit,
      });
    }
  }
  for (let n = 0; tags.length < TAGS; n++) {
    tags.push({ name: `SPARE/AI-${String(n + 1).padStart(4, "0")}/PV`, kind: "analog", unit: "degC", euLow: 0, euHigh: 100, samplePeriodMs: 1000, gateway: gateways[n % GATEWAYS].slug, area: null, equipment: null });
  }
  return tags;
}

const shape = (deviation: number): Profile => ({
  name: "Temperature shape",
  kinds: ["analog"],
  outputs: [{ name: "shape", steps: [{ method: "quality-filter", keep: "good" }, { method: "swinging-door", deviation: { percent: deviation }, "max-interval": 600 }] }],
});
const stats: Profile = {
  name: "One-minute statistics",
  kinds: ["analog"],
  outputs: ["mean", "min", "max"].map((fn) => ({ name: fn === "mean" ? "avg" : fn === "min" ? "lo" : "hi", steps: [{ method: "aggregate" as const, fn: fn as "mean", window: 60 }] })),
};
const deadband: Profile = { name: "Deadband", kinds: ["analog"], outputs: [{ name: "db", steps: [{ method: "deadband", deadband: { value: 0.5, unit: "degC" }, "max-interval": 300 }] }] };
const counter: Profile = { name: "Counter delta", kinds: ["counter"], outputs: [{ name: "delta", steps: [{ method: "counter-delta", window: 60, rollover: 4294967296 }] }] };

function configs(): { before: SiteConfig; after: SiteConfig; profiles: Map<number, Profile> } {
  const profiles = new Map<number, Profile>([[1, shape(0.5)], [2, stats], [3, deadband], [4, counter], [5, shape(0.4)]]);
  const group = (u: number, revisionId: number): GroupConfig => {
    const doc = profiles.get(revisionId)!;
    const unit = `U${String(u + 1).padStart(3, "0")}`;
    return {
      name: `unit-${unit.toLowerCase()}`,
      description: "",
      priority: u + 1,
      regulated: u % 20 === 0,
      selector: { patterns: [`${unit}/**`] } as GroupConfig["selector"],
      assignment: { profileId: revisionId, profile: doc.name, revision: revisionId === 5 ? 2 : 1, revisionId, overrides: [], tags: [] },
    };
  };
  const pick = (u: number) => (u % 10 === 9 ? 4 : u % 5 === 4 ? 3 : u % 3 === 0 ? 2 : 1);
  const before = { groups: Array.from({ length: GROUPS }, (_, u) => group(u, pick(u))) };
  // The change: one group on a new revision, one tag override, two groups swapped in priority.
  const after = structuredClone(before);
  after.groups[1] = group(1, 5);
  after.groups[2].assignment!.tags = [{ tag: "U003/TT-007/PV", overrides: [{ output: "shape", step: 1, parameter: "deviation", value: { percent: 1 } }] }];
  [after.groups[10].priority, after.groups[11].priority] = [after.groups[11].priority, after.groups[10].priority];
  return { before, after, profiles };
}

function main() {
  const tags = inventory();
  const { before, after, profiles } = configs();
  const base = { site: { slug: "bench-site", timeZone: "Europe/London", defaultHandling: "pass-through" as const }, issued: "2026-12-01T10:00:00Z", keyId: "k1", tags, profiles };
  const key = generateSigningKey("k1");
  const previous = renderSiteBundles({ ...base, release: 1, config: before }, gateways);
  const input: SiteBundlesInput = { ...base, release: 2, config: after };

  const release = () => {
    const bundles = renderSiteBundles(input, gateways);
    let changed = 0;
    for (const [slug, text] of bundles) {
      const checked = validateBundle(text);
      if (!checked.ok) throw new Error(`${slug}: ${JSON.stringify(checked.problems.slice(0, 3))}`);
      digestHex(text);
      signBytes(key, text);
      changed += diffBundles(previous.get(slug) ?? null, text).added;
    }
    return changed;
  };
  const reference = () => {
    const model = resolveSite(input);
    return gateways.map((gw) => JSON.stringify(bundleContent(model, input, gw), (_k, v) => (v instanceof Map ? Object.fromEntries(v) : v))).join("").length;
  };
  const bundles = [...previous.values()];
  const next = renderSiteBundles(input, gateways);
  const bytes = bundles.reduce((n, t) => n + Buffer.byteLength(t), 0);
  const [whole, ref] = roundRobin([release, reference], ROUNDS, WARMUPS);
  const commented = bundles.map((t) => `${t}# not in the form the renderer writes\n`);
  const [render, validate, fullParser, sign, diff, summary] = roundRobin(
    [
      () => renderSiteBundles(input, gateways),
      () => bundles.forEach(validateBundle),
      () => commented.forEach(validateBundle),
      () => bundles.forEach((t) => (digestHex(t), signBytes(key, t))),
      () => [...previous].forEach(([slug, t]) => diffBundles(t, next.get(slug)!)),
      () => summarizeChange({ config: before, profiles }, { config: after, profiles }, tags, gateways.map((g) => g.slug)),
    ],
    ROUNDS,
    WARMUPS,
  );
  const lines = release();
  console.log(`Sluice bundles: ${TAGS} tags, ${GROUPS} groups, ${GATEWAYS} gateways, ${(bytes / 1024).toFixed(0)} KB of bundles, ${lines} lines added by the change; ${cpus().length} cores, load ${loadavg()[0].toFixed(1)}`);
  const row = (label: string, t: { medianMs: number; bestMs: number }, note = "") =>
    console.log(`  ${label.padEnd(44)} median ${t.medianMs.toFixed(0).padStart(5)} ms   best ${t.bestMs.toFixed(0).padStart(5)} ms${note}`);
  row("release: render + validate + sign + diff", whole, `   target ≤ ${TARGET_MS} ms: ${whole.medianMs <= TARGET_MS ? "met" : "MISSED"}`);
  row("  of which render (10 bundles)", render);
  row("  of which validate (10 bundles)", validate);
  row("    validate through the full YAML parser", fullParser, "   (text not in the renderer's form)");
  row("  of which digest + sign (10 bundles)", sign);
  row("  of which diff (10 bundles)", diff);
  row("summary in words (not part of the release)", summary);
  row("reference: resolve + JSON.stringify", ref);
}

main();
