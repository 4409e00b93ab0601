import { METHODS, type ResolvedStep } from "@/lib/reduction/profile";
import { DEFAULT_GAP_FACTOR } from "@/lib/reduction/signal";
import { BundleError, type BundleGateway, type BundleInput, type ResolvedGroup, type SiteBundlesInput, type SiteModel, resolveSite } from "./resolve";
import { Flow, type Scalar, type YamlValue, toYaml as writeYaml } from "./yaml-out";

export { BundleError, type BundleGateway, type BundleInput, type BundleSite, type BundleTag, type SiteBundlesInput } from "./resolve";

/** The header of a bundle: `sluice: bundle/1`. */
export const BUNDLE_FORMAT = "bundle/1";

/**
 * One gateway's bundle (DESIGN.md "Bundle"): YAML 1.2 holding the header (site, gateway,
 * release, issue time, poll interval, signing key id, the site's time zone), the default
 * handling with this gateway's tags in no group, then the groups in priority order that
 * hold any of its tags, each with its tags, their gap threshold and its profile's outputs. A step parameter
 * equal for every one of the group's tags here is a plain value; otherwise a map from tag
 * to value (only the tags that have it, for an optional parameter set on some tags).
 * Keys come in a fixed order (steps: `method`, then the parameters in METHODS order),
 * tags in code-unit order, and `toYaml` (./yaml-out) writes numbers in their shortest
 * round-trip form and quotes any string a YAML 1.1 or 1.2 reader could take for something
 * else; so the same content always gives the same bytes. Throws a {@link BundleError}.
 */
export function renderBundle(input: BundleInput): string {
  return toYaml(resolveSite(input, input.gateway.slug), input, input.gateway);
}

/**
 * Every gateway's bundle for one release, by gateway slug (in slug order), with group
 * membership and each tag's steps resolved once for the whole site. A gateway with no
 * tags still gets a bundle (its default handling and no groups).
 */
export function renderSiteBundles(input: SiteBundlesInput, gateways: readonly BundleGateway[]): Map<string, string> {
  const model = resolveSite(input);
  const out = new Map<string, string>();
  for (const gw of [...gateways].sort((a, b) => (a.slug < b.slug ? -1 : a.slug > b.slug ? 1 : 0))) out.set(gw.slug, toYaml(model, input, gw));
  return out;
}

function toYaml(model: SiteModel, input: SiteBundlesInput, gw: BundleGateway): string {
  return writeYaml(bundleContent(model, input, gw));
}

/**
 * The bundle as data for the writer: one-line steps and the profile reference as `Flow`,
 * per-tag maps as `Map` (so tag names keep their order as keys).
 */
export function bundleContent(model: SiteModel, input: SiteBundlesInput, gw: BundleGateway): { [key: string]: YamlValue } {
  const mine = (t: { gateway: string }) => t.gateway === gw.slug;
  const groups: { [key: string]: YamlValue }[] = [];
  for (const g of model.groups) {
    const idx: number[] = [];
    g.tags.forEach((t, i) => mine(t) && idx.push(i));
    if (idx.length > 0) groups.push(groupContent(g, idx, input.site.defaultHandling));
  }
  return {
    sluice: BUNDLE_FORMAT,
    site: input.site.slug,
    gateway: gw.slug,
    release: input.release,
    issued: input.issued,
    poll: gw.pollSeconds,
    key: input.keyId,
    "time-zone": input.site.timeZone,
    unassigned: { handling: input.site.defaultHandling, tags: model.unassigned.filter(mine).map((t) => t.name) },
    groups,
  };
}

function groupContent(g: ResolvedGroup, idx: number[], defaultHandling: string): { [key: string]: YamlValue } {
  const names = idx.map((i) => g.tags[i].name);
  const head = { name: g.name, regulated: g.regulated };
  if (g.profile === null) return { ...head, handling: defaultHandling, tags: names };
  const first = g.outputs[idx[0]];
  return {
    ...head,
    profile: new Flow({ name: g.profile.name, revision: g.profile.revision }),
    tags: names,
    gap: gapSeconds(idx.map((i) => g.tags[i].samplePeriodMs), names),
    outputs: first.map((o, k) => ({
      name: o.name,
      steps: o.steps.map((step, s) => {
        try {
          return collapseStep(idx.map((i) => g.outputs[i][k].steps[s]), names);
        } catch (e) {
          throw new BundleError(`group "${g.name}", output "${o.name}": ${(e as Error).message}`, { group: g.name, output: o.name });
        }
      }),
    })),
  };
}

/**
 * The group's `gap` (DESIGN.md "Signals"): for each tag, the time step in seconds beyond
 * which its samples are a gap — DEFAULT_GAP_FACTOR (3) × its sample period — so that the
 * gateway, like the console's previews, never interpolates across one and keeps the
 * samples on both sides. One value when the tags agree, else a map tag → seconds.
 */
function gapSeconds(periodsMs: number[], names: string[]): Scalar | Map<string, Scalar> {
  const gaps = periodsMs.map((ms) => (ms * DEFAULT_GAP_FACTOR) / 1000);
  if (gaps.every((g) => g === gaps[0])) return gaps[0];
  return new Map(names.map((name, i) => [name, gaps[i]]));
}

/**
 * One step for several tags: each parameter a value when all tags agree, else a map tag →
 * value; a step of values only is written on one line.
 */
function collapseStep(steps: ResolvedStep[], names: string[]): Flow | { [key: string]: YamlValue } {
  const method = steps[0].method;
  if (steps.some((s) => s.method !== method)) throw new Error(`step methods differ between tags (${method})`);
  const known = METHODS[method].params.map((p) => p.name);
  const extraKeys = new Set<string>();
  let last: ResolvedStep | undefined;
  for (const s of steps) {
    if (s === last) continue; // tags that resolve alike share one step object
    last = s;
    for (const k in s) if (k !== "method" && !known.includes(k)) extraKeys.add(k);
  }
  const extra = [...extraKeys].sort();
  const out: Record<string, Scalar | Map<string, Scalar>> = { method };
  let perTagMaps = false;
  for (const key of [...known, ...extra]) {
    const first = (steps[0] as Record<string, unknown>)[key];
    let same = true;
    let present = first !== undefined;
    let all = present;
    for (let i = 1; i < steps.length; i++) {
      const v = (steps[i] as Record<string, unknown>)[key];
      if (v === undefined) all = false;
      else present = true;
      if (typeof v === "object" && v !== null) throw new Error(`step ${method}: parameter "${key}" did not resolve to a value`);
      if (v !== first) same = false;
    }
    if (!present) continue;
    if (same && all) out[key] = first as Scalar;
    else {
      const perTag = new Map<string, Scalar>();
      steps.forEach((s, i) => {
        const v = (s as Record<string, unknown>)[key];
        if (v !== undefined) perTag.set(names[i], v as Scalar);
      });
      out[key] = perTag;
      perTagMaps = true;
    }
  }
  return perTagMaps ? out : new Flow(out as Record<string, Scalar>);
}
