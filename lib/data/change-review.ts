import "server-only";
import type { Transaction } from "sequelize";
import { summarizeChange } from "@/lib/bundles/summary";
import type { Actor } from "@/lib/auth/guard";
import { stable, type AssignmentConfig, type SiteConfig } from "@/lib/config/site-config";
import { previewProfile } from "@/lib/preview";
import type { Profile } from "@/lib/reduction/profile";
import { unpackSeries } from "@/lib/samples/storage";
import { convertUnit } from "@/lib/units";
import { Bundle, Release, SampleSet, Site, TagGroup, type ChangeReview } from "@/models";
import { siteEstimate } from "./estimates";
import { pinnedProfiles, renderAndValidate, siteContext } from "./release-render";
import { issuedAt, issuedNow } from "./releases";
import { signingKeys } from "./signing-keys";

type Accuracy = { ratio: number | null; maxAbsError: number | null; rmse: number | null };
export type Impact = {
  accuracy: { group: string; output: string; sampleSet: string; before: Accuracy | null; after: Accuracy | null }[];
  bandwidth: { before: BandwidthFigures | null; after: BandwidthFigures; budgetKbps: number; usableKbps: number };
};
type BandwidthFigures = { meanKbps: number; peakKbps: number; gbPerMonth: number; storageCostPerMonthAtRetention: number };

const same = (a: AssignmentConfig | null, b: AssignmentConfig | null) => stable(a) === stable(b);

function runOn(set: SampleSet, doc: Profile, a: AssignmentConfig, timeZone: string): Map<string, Accuracy> {
  const series = unpackSeries(set.encoding, set.data);
  const tag = { name: set.tagName, kind: set.kind, unit: set.unit, euLow: set.euLow, euHigh: set.euHigh, samplePeriodMs: set.samplePeriodMs };
  const out = new Map<string, Accuracy>();
  try {
    for (const o of previewProfile(series, doc, tag, { convert: convertUnit, timeZone, overrides: a.overrides })) {
      out.set(o.name, { ratio: Number.isFinite(o.metrics.ratio) ? o.metrics.ratio : null, maxAbsError: o.metrics.maxAbsError, rmse: o.metrics.rmse });
    }
  } catch {
    // The sample set's tag does not suit this profile: no figures for this side.
  }
  return out;
}

/** Accuracy before → after on the saved sample set of each group whose assignment changed. */
async function accuracyImpact(site: Site, base: SiteConfig, next: SiteConfig, profiles: Map<number, Profile>, transaction?: Transaction): Promise<Impact["accuracy"]> {
  const before = new Map(base.groups.map((g) => [g.name, g.assignment]));
  const rows: Impact["accuracy"] = [];
  for (const g of next.groups) {
    const old = before.get(g.name) ?? null;
    if (same(old, g.assignment)) continue;
    const group = await TagGroup.findOne({ where: { siteId: site.id, name: g.name }, attributes: ["id"], transaction });
    const set = group ? await SampleSet.findOne({ where: { groupId: group.id }, order: [["createdAt", "DESC"], ["id", "DESC"]], transaction }) : null;
    if (!set) continue;
    const a = old ? runOn(set, profiles.get(old.revisionId)!, old, site.timeZone) : new Map<string, Accuracy>();
    const b = g.assignment ? runOn(set, profiles.get(g.assignment.revisionId)!, g.assignment, site.timeZone) : new Map<string, Accuracy>();
    for (const output of [...new Set([...a.keys(), ...b.keys()])]) {
      rows.push({ group: g.name, output, sampleSet: set.name, before: a.get(output) ?? null, after: b.get(output) ?? null });
    }
  }
  return rows;
}

/** The current release's bundle texts; rendered from its snapshot when it has none stored. */
async function currentBundles(site: Site, base: SiteConfig, transaction?: Transaction): Promise<Map<string, string>> {
  const release = await Release.findOne({ where: { siteId: site.id }, order: [["number", "DESC"]], attributes: ["id", "number", "releasedAt"], transaction });
  if (!release) return new Map();
  const rows = await Bundle.findAll({ where: { releaseId: release.id }, attributes: ["gatewaySlug", "bytes"], transaction });
  if (rows.length) return new Map(rows.map((b) => [b.gatewaySlug, b.bytes.toString("utf8")]));
  return renderAndValidate(await siteContext(site, transaction), base, release.number, issuedAt(release.releasedAt), signingKeys().active.id, transaction);
}

/**
 * What a reviewer sees, rendered when the change is submitted: each gateway's bundle
 * before (the current release) and after (this change as the next release), the summary
 * in words, regulated-record groups touched, and the accuracy and bandwidth impact.
 */
export async function renderReview(actor: Actor, site: Site, base: SiteConfig, next: SiteConfig, transaction?: Transaction): Promise<ChangeReview> {
  const release = site.releaseCounter + 1;
  const issued = issuedNow();
  const ctx = await siteContext(site, transaction);
  const [after, before] = await Promise.all([renderAndValidate(ctx, next, release, issued, signingKeys().active.id, transaction), currentBundles(site, base, transaction)]);
  const [baseProfiles, nextProfiles] = await Promise.all([pinnedProfiles(base, transaction), pinnedProfiles(next, transaction)]);
  const profiles = new Map([...baseProfiles, ...nextProfiles]);
  const summary = summarizeChange(base.groups.length || site.releaseCounter > 0 ? { config: base, profiles: baseProfiles } : null, { config: next, profiles: nextProfiles }, ctx.tags, ctx.gateways.map((g) => g.slug));
  const estimate = await siteEstimate(actor, site.slug);
  const figures = (e: NonNullable<typeof estimate.released>): BandwidthFigures => ({
    meanKbps: e.totals.meanKbps,
    peakKbps: e.totals.peakKbps,
    gbPerMonth: e.totals.gbPerMonthPlain,
    storageCostPerMonthAtRetention: e.storageCostPerMonthAtRetention,
  });
  const impact: Impact = {
    accuracy: await accuracyImpact(site, base, next, profiles, transaction),
    bandwidth: { before: estimate.released ? figures(estimate.released) : null, after: figures(estimate.working), budgetKbps: estimate.site.uplinkBudgetKbps, usableKbps: estimate.working.usableKbps },
  };
  return {
    release,
    issued,
    gateways: ctx.gateways.map((g) => ({ gateway: g.slug, before: before.get(g.slug) ?? null, after: after.get(g.slug)! })),
    summary: summary.statements,
    regulatedTouched: summary.regulatedTouched,
    gatewaysAffected: summary.gatewaysAffected,
    impact,
  };
}
