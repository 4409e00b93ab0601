import type { AssignmentConfig, SiteConfig } from "@/lib/config/site-config";
import { describeProfileDiff } from "@/lib/profiles/describe-diff";
import type { Profile } from "@/lib/reduction/profile";
import { byPriority } from "@/lib/tags/selector";
import type { BundleTag } from "./resolve";
import { affectedGateways, count, effective, membership, names, stable, tagMoves } from "./summary-tags";

export type ConfigSnapshot = { config: SiteConfig; profiles: Map<number, Profile> };
export type StatementKind =
  | "group-added"
  | "group-removed"
  | "groups-reordered"
  | "group-changed"
  | "assignment"
  | "parameters"
  | "outputs"
  | "overrides"
  | "tags-moved"
  | "tags-unassigned"
  | "tags-assigned"
  | "regulated"
  | "gateways";
export type ChangeStatement = { kind: StatementKind; text: string; group?: string; regulated?: boolean };
export type ChangeSummary = { statements: ChangeStatement[]; regulatedTouched: string[]; gatewaysAffected: string[] };

const EMPTY: ConfigSnapshot = { config: { groups: [] }, profiles: new Map() };

/**
 * A change in words for review (DESIGN.md "Review and release"), from the configuration
 * of the current release (null before the first) to the proposed one, over today's
 * inventory: groups added, removed or reordered; per group, profile revision and
 * parameter changes (`describeProfileDiff`), outputs added, renamed or removed (what the
 * cloud receives changes) and override changes; tags moving between groups or out of
 * every group; the regulated-record groups touched; and the gateways whose bundle content
 * changes (compared on what the renderer reads: group order, membership, pinned
 * revision, overrides — release number and issue time aside).
 */
export function summarizeChange(before: ConfigSnapshot | null, after: ConfigSnapshot, tags: readonly BundleTag[], gateways: readonly string[]): ChangeSummary {
  const old = before ?? EMPTY;
  const statements: ChangeStatement[] = [];
  const regulated = new Set([...old.config.groups, ...after.config.groups].filter((g) => g.regulated).map((g) => g.name));
  const say = (kind: StatementKind, text: string, group?: string) =>
    statements.push({ kind, text, ...(group !== undefined ? { group, regulated: regulated.has(group) } : {}) });

  const was = new Map(old.config.groups.map((g) => [g.name, g]));
  const now = new Map(after.config.groups.map((g) => [g.name, g]));
  const afterOrder = [...after.config.groups].sort(byPriority);
  for (const g of afterOrder) {
    const o = was.get(g.name);
    if (!o) {
      const what = g.assignment ? `assigned ${ref(g.assignment)}` : "with no profile (its tags get the site's default handling)";
      say("group-added", `Group "${g.name}" added${g.regulated ? " as a regulated record" : ""}, ${what}`, g.name);
      if (g.assignment) outputStatements(say, g.name, null, doc(after, g.assignment));
      continue;
    }
    if (o.regulated !== g.regulated) say("group-changed", `Group "${g.name}" is ${g.regulated ? "now" : "no longer"} a regulated record`, g.name);
    if (stable(o.selector) !== stable(g.selector)) say("group-changed", `Group "${g.name}": selector changed`, g.name);
    assignmentStatements(say, g.name, o.assignment, g.assignment, old, after);
  }
  for (const g of [...old.config.groups].sort(byPriority)) if (!now.has(g.name)) say("group-removed", `Group "${g.name}" removed`, g.name);
  const moved = reordered([...old.config.groups].sort(byPriority).map((g) => g.name).filter((n) => now.has(n)), afterOrder.map((g) => g.name).filter((n) => was.has(n)));
  if (moved.length) {
    const at = (n: string) => `"${n}" moved to position ${afterOrder.findIndex((g) => g.name === n) + 1}`;
    say("groups-reordered", `Priority order changed: ${moved.map(at).join(", ")} of ${afterOrder.length}`);
  }

  const touched = new Set(statements.flatMap((s) => (s.group !== undefined ? [s.group] : [])));
  const x = membership(old.config, tags);
  const y = membership(after.config, tags);
  for (const s of tagMoves(x, y)) {
    say(s.kind, s.text, s.group);
    for (const g of s.groups) touched.add(g);
  }
  const regulatedTouched = [...touched].filter((g) => regulated.has(g)).sort();
  if (regulatedTouched.length) {
    say("regulated", `Regulated-record groups touched: ${regulatedTouched.map((g) => `"${g}"`).join(", ")} — the reviewer acknowledges the caution at approval`);
  }
  const gatewaysAffected = affectedGateways(old.config, x, after.config, y, gateways);
  say("gateways", gatewaysAffected.length ? `Gateways affected: ${gatewaysAffected.join(", ")} (${gatewaysAffected.length} of ${gateways.length})` : "No gateway's bundle changes");
  return { statements, regulatedTouched, gatewaysAffected };
}

type Say = (kind: StatementKind, text: string, group?: string) => void;
const ref = (a: AssignmentConfig) => `"${a.profile}" revision ${a.revision}`;

function doc(s: ConfigSnapshot, a: AssignmentConfig): Profile | null {
  return s.profiles.get(a.revisionId) ?? null;
}

function assignmentStatements(say: Say, group: string, a: AssignmentConfig | null, b: AssignmentConfig | null, old: ConfigSnapshot, after: ConfigSnapshot) {
  if (a === null && b === null) return;
  if (a === null) {
    say("assignment", `Group "${group}": assigned ${ref(b!)}; its tags had the site's default handling`, group);
    return outputStatements(say, group, null, doc(after, b!));
  }
  if (b === null) {
    say("assignment", `Group "${group}": assignment of ${ref(a)} removed; its tags get the site's default handling (what the cloud receives changes)`, group);
    return;
  }
  if (a.revisionId !== b.revisionId) {
    const to = a.profile === b.profile ? `revision ${b.revision}` : ref(b);
    say("assignment", `Group "${group}": ${ref(a)} → ${to}`, group);
    const from = doc(old, a);
    const into = doc(after, b);
    if (from && into) {
      const common = (p: Profile, other: Profile) => ({ ...p, outputs: p.outputs.filter((o) => other.outputs.some((x) => x.name === o.name)) });
      for (const line of describeProfileDiff(common(from, into), common(into, from))) say("parameters", `Group "${group}": ${line}`, group);
    }
    outputStatements(say, group, from, into);
  }
  overrideStatements(say, group, a, b);
}

/** Outputs added, removed, or renamed (same steps under a new name): each changes the series the cloud receives. */
function outputStatements(say: Say, group: string, from: Profile | null, to: Profile | null) {
  const a = from?.outputs ?? [];
  const b = to?.outputs ?? [];
  const gone = a.filter((o) => !b.some((x) => x.name === o.name));
  const come = b.filter((o) => !a.some((x) => x.name === o.name));
  for (const o of gone) {
    const i = come.findIndex((x) => stable(x.steps) === stable(o.steps));
    if (i >= 0) {
      say("outputs", `Group "${group}": output "${o.name}" renamed to "${come[i].name}" — what the cloud receives changes`, group);
      come.splice(i, 1);
    } else say("outputs", `Group "${group}": output "${o.name}" removed — what the cloud receives changes`, group);
  }
  for (const o of come) say("outputs", `Group "${group}": output "${o.name}" added — what the cloud receives changes`, group);
}

function overrideStatements(say: Say, group: string, a: AssignmentConfig, b: AssignmentConfig) {
  const x = effective(a.overrides);
  const y = effective(b.overrides);
  for (const key of [...new Set([...x.keys(), ...y.keys()])].sort()) {
    if (stable(x.get(key)) === stable(y.get(key))) continue;
    const [output, step, parameter] = key.split("\u0000");
    const where = `override of ${parameter} (output "${output}", step ${Number(step) + 1})`;
    const text = !x.has(key) ? `${where} set to ${show(y.get(key))}` : !y.has(key) ? `${where} removed (back to the profile's ${show(x.get(key))})` : `${where} ${show(x.get(key))} → ${show(y.get(key))}`;
    say("overrides", `Group "${group}": ${text}`, group);
  }
  const mine = (c: AssignmentConfig) => new Map(c.tags.map((t) => [t.tag, stable([...effective(t.overrides)].sort())]));
  const p = mine(a);
  const q = mine(b);
  const changed = [...new Set([...p.keys(), ...q.keys()])].filter((t) => p.get(t) !== q.get(t)).sort();
  if (changed.length) say("overrides", `Group "${group}": overrides for ${count(changed.length, "tag")} changed: ${names(changed)}`, group);
}

function show(v: unknown): string {
  if (typeof v === "object" && v !== null) {
    if ("percent" in v) return `${(v as { percent: number }).percent} % of range`;
    if ("unit" in v) return `${(v as { value?: unknown }).value} ${(v as { unit: string }).unit}`;
  }
  return String(v);
}

/** Groups outside a longest common subsequence of the two orders: the ones that moved. */
function reordered(a: string[], b: string[]): string[] {
  if (a.join("\u0000") === b.join("\u0000")) return [];
  const n = a.length;
  const m = b.length;
  const len = Array.from({ length: n + 1 }, () => new Int32Array(m + 1));
  for (let i = n - 1; i >= 0; i--) for (let j = m - 1; j >= 0; j--) len[i][j] = a[i] === b[j] ? len[i + 1][j + 1] + 1 : Math.max(len[i + 1][j], len[i][j + 1]);
  const kept = new Set<string>();
  for (let i = 0, j = 0; i < n && j < m; ) {
    if (a[i] === b[j]) (kept.add(a[i]), i++, j++);
    else if (len[i + 1][j] >= len[i][j + 1]) i++;
    else j++;
  }
  return b.filter((g) => !kept.has(g));
}
