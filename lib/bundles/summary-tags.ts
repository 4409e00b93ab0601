import type { SiteConfig } from "@/lib/config/site-config";
import type { ParameterOverride } from "@/lib/reduction/profile";
import { assignGroups, byPriority } from "@/lib/tags/selector";
import { type BundleTag, byName, checkHierarchy } from "./resolve";

/** The site's tags sorted by name, and each one's group under a configuration. */
export type Membership = { tags: BundleTag[]; winner: (string | null)[] };

export function membership(config: SiteConfig, tags: readonly BundleTag[]): Membership {
  const sorted = [...tags].sort(byName);
  checkHierarchy(config.groups, sorted);
  const { winner } = assignGroups(sorted.map((t) => ({ ...t, area: t.area ?? null, equipment: t.equipment ?? null })), config.groups);
  return { tags: sorted, winner };
}

/** Tags whose group changes, by (from, to): counts and the first few names. */
export function tagMoves(x: Membership, y: Membership) {
  const moves = new Map<string, { from: string | null; to: string | null; tags: string[] }>();
  x.tags.forEach((t, i) => {
    const from = x.winner[i];
    const to = y.winner[i];
    if (from === to) return;
    const key = `${from ?? ""}\u0000${to ?? ""}`;
    const m = moves.get(key) ?? { from, to, tags: [] };
    m.tags.push(t.name);
    moves.set(key, m);
  });
  return [...moves.keys()].sort().map((key) => {
    const { from, to, tags: list } = moves.get(key)!;
    const n = count(list.length, "tag");
    const one = list.length === 1;
    const groups = [from, to].filter((g): g is string => g !== null);
    if (to === null) return { kind: "tags-unassigned" as const, group: from!, groups, text: `${n} ${one ? "leaves" : "leave"} "${from}" and ${one ? "is" : "are"} in no group now (site default handling): ${names(list)}` };
    if (from === null) return { kind: "tags-assigned" as const, group: to, groups, text: `${n} in no group ${one ? "joins" : "join"} "${to}": ${names(list)}` };
    return { kind: "tags-moved" as const, group: to, groups, text: `${n} ${one ? "moves" : "move"} from "${from}" to "${to}": ${names(list)}` };
  });
}

/**
 * Per gateway, what its bundle is made of — for each of its tags in bundle order, the
 * group's name, flag, pinned revision and overrides, the tag, and its own overrides;
 * gateways whose makings differ are affected.
 */
export function affectedGateways(a: SiteConfig, x: Membership, b: SiteConfig, y: Membership, gateways: readonly string[]): string[] {
  const makings = (config: SiteConfig, m: Membership) => {
    const rank = new Map([...config.groups].sort(byPriority).map((g, i) => [g.name, i] as const));
    const heads = new Map<string, string>();
    const own = new Map<string, Map<string, string>>();
    for (const g of config.groups) {
      const a = g.assignment;
      heads.set(g.name, `${g.name}\u0000${g.regulated}\u0000${a ? `${a.revisionId}\u0000${a.profile}\u0000${a.revision}\u0000${stable([...effective(a.overrides)].sort())}` : "-"}`);
      own.set(g.name, new Map((a?.tags ?? []).map((t) => [t.tag, stable([...effective(t.overrides)].sort())])));
    }
    const out = new Map<string, string[]>(gateways.map((g) => [g, []]));
    const r = m.winner.map((w) => (w === null ? -1 : rank.get(w)!));
    const order = m.tags.map((_, i) => i).sort((i, j) => r[i] - r[j] || i - j);
    for (const i of order) {
      const list = out.get(m.tags[i].gateway);
      const g = m.winner[i];
      if (list) list.push(g === null ? `-\u0000${m.tags[i].name}` : `${heads.get(g)}\u0000${m.tags[i].name}\u0000${own.get(g)!.get(m.tags[i].name) ?? ""}`);
    }
    return out;
  };
  const p = makings(a, x);
  const q = makings(b, y);
  return [...gateways].sort().filter((g) => p.get(g)!.join("\n") !== q.get(g)!.join("\n"));
}

/** The value each overridden parameter ends up with (later overrides win), by output/step/parameter. */
export function effective(list: readonly ParameterOverride[]): Map<string, unknown> {
  return new Map(list.map((o) => [`${o.output}\u0000${o.step}\u0000${o.parameter}`, o.value]));
}

/** Lists of tags name this many and count the rest. */
export const FIRST_NAMES = 3;

export const count = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;
export const names = (list: readonly string[]) =>
  list.slice(0, FIRST_NAMES).join(", ") + (list.length > FIRST_NAMES ? ` and ${list.length - FIRST_NAMES} more` : "");

/** JSON with object keys sorted. */
export function stable(v: unknown): string {
  return JSON.stringify(v, (_k, x: unknown) =>
    x !== null && typeof x === "object" && !Array.isArray(x) ? Object.fromEntries(Object.entries(x as Record<string, unknown>).sort(([p], [q]) => (p < q ? -1 : p > q ? 1 : 0))) : x,
  ) ?? "undefined";
}
