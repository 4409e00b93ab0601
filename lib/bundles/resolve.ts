import type { SiteConfig } from "@/lib/config/site-config";
import { METHODS, type Profile, type ResolvedStep } from "@/lib/reduction/profile";
import { resolveSteps } from "@/lib/reduction/profile-resolve";
import { assignGroups, byPriority } from "@/lib/tags/selector";
import { convertUnit } from "@/lib/units";

/**
 * One tag of the site inventory as a bundle needs it. `area` and `equipment` are read by
 * selectors that filter on them; leaving them out is refused when a selector does.
 */
export type BundleTag = {
  name: string;
  kind: "analog" | "discrete" | "counter";
  unit: string;
  euLow: number | null;
  euHigh: number | null;
  samplePeriodMs: number;
  gateway: string;
  area?: string | null;
  equipment?: string | null;
};

export type BundleSite = { slug: string; timeZone: string; defaultHandling: "pass-through" | "drop" };
export type BundleGateway = { slug: string; pollSeconds: number };

/** Everything a release renders, except the gateway: one site's bundles share it. */
export type SiteBundlesInput = {
  site: BundleSite;
  release: number;
  /** ISO 8601 UTC to the second, e.g. 2026-12-01T10:00:00Z. */
  issued: string;
  keyId: string;
  config: SiteConfig;
  /** The whole site inventory, in any order. */
  tags: BundleTag[];
  /** Profile documents by revision id (every revision the configuration pins). */
  profiles: Map<number, Profile>;
};

export type BundleInput = SiteBundlesInput & { gateway: BundleGateway };

/** A bundle that cannot be rendered: a profile that does not resolve for a tag, a missing revision, a duplicate tag. */
export class BundleError extends Error {
  readonly group: string | undefined;
  readonly tag: string | undefined;
  readonly output: string | undefined;

  constructor(message: string, where: { group?: string; tag?: string; output?: string } = {}, options?: { cause?: unknown }) {
    super(message, options);
    this.name = "BundleError";
    this.group = where.group;
    this.tag = where.tag;
    this.output = where.output;
  }
}

/** A group with its tags (sorted by name, code-unit order) and each tag's resolved outputs. */
export type ResolvedGroup = {
  name: string;
  regulated: boolean;
  profile: { name: string; revision: number } | null;
  tags: BundleTag[];
  /** Aligned with `tags`; empty lists when the group has no assignment. */
  outputs: { name: string; steps: ResolvedStep[] }[][];
};

/** The site's groups in priority order (groups without tags included) and the tags in no group, sorted. */
export type SiteModel = { groups: ResolvedGroup[]; unassigned: BundleTag[] };

export const byName = (a: { name: string }, b: { name: string }) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0);

/**
 * Group membership (the first group in priority order that matches, `assignGroups`) and
 * every member tag's steps resolved with the group's and the tag's overrides
 * (`resolveSteps`: percent parameters to the tag's engineering unit, absolute ones
 * converted). Tags that resolve alike (same kind, unit, range and period, no overrides
 * of their own) share one resolution. With `gateway`, only that gateway's tags. Throws a
 * {@link BundleError} naming group, tag and output.
 */
export function resolveSite(input: Pick<SiteBundlesInput, "site" | "config" | "tags" | "profiles">, gateway?: string): SiteModel {
  let tags = [...input.tags].sort(byName);
  for (let i = 1; i < tags.length; i++) {
    if (tags[i].name === tags[i - 1].name) throw new BundleError(`tag ${tags[i].name} is listed twice in the inventory`, { tag: tags[i].name });
  }
  // A tag's group depends on the tag alone, so one gateway's tags can be assigned by themselves.
  if (gateway !== undefined) tags = tags.filter((t) => t.gateway === gateway);
  const groups = [...input.config.groups].sort(byPriority);
  for (let i = 1; i < groups.length; i++) {
    const name = groups[i].name;
    if (groups.slice(0, i).some((g) => g.name === name)) throw new BundleError(`group "${name}" appears twice in the configuration`, { group: name });
  }
  checkHierarchy(groups, tags);
  const { winner } = assignGroups(
    tags.map((t) => ({ ...t, area: t.area ?? null, equipment: t.equipment ?? null })),
    groups,
  );
  const members = new Map<string, BundleTag[]>(groups.map((g) => [g.name, []]));
  const unassigned: BundleTag[] = [];
  tags.forEach((t, i) => (winner[i] === null ? unassigned : members.get(winner[i]!)!).push(t));
  return {
    groups: groups.map((g) => {
      const list = members.get(g.name)!;
      const a = g.assignment;
      if (a === null) return { name: g.name, regulated: g.regulated, profile: null, tags: list, outputs: list.map(() => []) };
      const doc = input.profiles.get(a.revisionId);
      if (doc === undefined) {
        throw new BundleError(`group "${g.name}": revision ${a.revision} of profile "${a.profile}" (id ${a.revisionId}) was not given`, { group: g.name });
      }
      const own = new Map(a.tags.map((t) => [t.tag, t.overrides]));
      const cache = new Map<string, { name: string; steps: ResolvedStep[] }[]>();
      const outputs = list.map((tag) => {
        const mine = own.get(tag.name);
        const key = mine ? null : `${tag.kind}\u0000${tag.unit}\u0000${tag.euLow}\u0000${tag.euHigh}\u0000${tag.samplePeriodMs}`;
        const hit = key === null ? undefined : cache.get(key);
        if (hit) return hit;
        let result;
        try {
          const resolved = resolveSteps(doc, tag, { convert: convertUnit, timeZone: input.site.timeZone, overrides: mine ? [...a.overrides, ...mine] : a.overrides });
          result = resolved.outputs.map((o) => ({ name: o.name, steps: o.steps.map(canonicalStep) }));
        } catch (e) {
          const output = (e as { output?: string }).output;
          throw new BundleError(`group "${g.name}", tag ${tag.name}: ${(e as Error).message}`, { group: g.name, tag: tag.name, output }, { cause: e });
        }
        if (key !== null) cache.set(key, result);
        return result;
      });
      return { name: g.name, regulated: g.regulated, profile: { name: a.profile, revision: a.revision }, tags: list, outputs };
    }),
    unassigned,
  };
}

/** A selector filtering by area or equipment needs the inventory to carry them (null for none). */
export function checkHierarchy(groups: readonly SiteConfig["groups"][number][], tags: readonly BundleTag[]) {
  for (const key of ["area", "equipment"] as const) {
    const list = key === "area" ? "areas" : "equipment";
    const group = groups.find((g) => (g.selector[list]?.length ?? 0) > 0);
    const missing = group && tags.find((t) => t[key] === undefined);
    if (group && missing) {
      throw new BundleError(`group "${group.name}" selects by ${key}, but tag ${missing.name} was given without its ${key}`, { group: group.name, tag: missing.name });
    }
  }
}

/**
 * Magnitudes rounded to 15 significant digits (every such decimal survives a round trip
 * through a double), so arithmetic noise such as 0.30000000000000004 prints as 0.3;
 * −0 becomes 0. Other parameters are kept exactly.
 */
function canonicalStep(step: ResolvedStep): ResolvedStep {
  const s = { ...step } as Record<string, unknown>;
  for (const name of METHODS[step.method].magnitudes) {
    const v = s[name];
    if (typeof v === "number") s[name] = canonicalNumber(v);
  }
  return s as ResolvedStep;
}

export function canonicalNumber(v: number): number {
  if (!Number.isFinite(v)) throw new Error(`a parameter resolves to ${v}, not a finite number`);
  const n = Number(v.toPrecision(15));
  return n === 0 ? 0 : n;
}
