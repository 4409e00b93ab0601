import type { ParameterOverride } from "@/lib/reduction/profile";
import type { Selector } from "@/schemas/tag";

/** A group's pinned profile revision with its overrides, as a release snapshots it. */
export type AssignmentConfig = {
  profileId: number;
  profile: string;
  revision: number;
  revisionId: number;
  /** Overrides for the whole group, in order (later ones win). */
  overrides: ParameterOverride[];
  /** Overrides for single tags, by tag name (sorted), applied after the group's. */
  tags: { tag: string; overrides: ParameterOverride[] }[];
};

/** The part of a site's configuration that changes go through review for. */
export type GroupConfig = {
  name: string;
  description: string;
  priority: number;
  regulated: boolean;
  selector: Selector;
  assignment: AssignmentConfig | null;
};
export type SiteConfig = { groups: GroupConfig[] };

export type RevisionRef = { profile: string; revision: number };

export type DraftEdit =
  | { key: string; kind: "group-added"; group: string; assignment: RevisionRef | null }
  | { key: string; kind: "group-removed"; group: string }
  | { key: string; kind: "group-changed"; group: string; fields: string[] }
  | { key: string; kind: "groups-reordered"; from: string[]; to: string[] }
  | { key: string; kind: "assignment-set"; group: string; from: RevisionRef | null; to: RevisionRef | null }
  | { key: string; kind: "overrides-changed"; group: string; groupOverrides: boolean; tags: string[] };

/** JSON with object keys sorted, so snapshots compare equal whatever order they were written in. */
export const stable = (v: unknown): string =>
  JSON.stringify(v, (_k, x: unknown) =>
    x !== null && typeof x === "object" && !Array.isArray(x) ? Object.fromEntries(Object.entries(x as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : x,
  );
const ref = (a: AssignmentConfig | null): RevisionRef | null => (a ? { profile: a.profile, revision: a.revision } : null);

/** The key that names one edit of a draft (for discarding it). */
export const editKey = (kind: DraftEdit["kind"], group?: string) => (group === undefined ? kind : `${kind}:${group}`);

/** The edits that turn `base` into `working`, in words a reviewer reads: by group name. */
export function diffConfigs(base: SiteConfig, working: SiteConfig): DraftEdit[] {
  const edits: DraftEdit[] = [];
  const before = new Map(base.groups.map((g) => [g.name, g]));
  const after = new Map(working.groups.map((g) => [g.name, g]));
  for (const g of working.groups) {
    const old = before.get(g.name);
    if (!old) {
      edits.push({ key: editKey("group-added", g.name), kind: "group-added", group: g.name, assignment: ref(g.assignment) });
      continue;
    }
    const fields: string[] = [];
    if (old.description !== g.description) fields.push("description");
    if (old.regulated !== g.regulated) fields.push("regulated record");
    if (stable(old.selector) !== stable(g.selector)) fields.push("selector");
    if (fields.length) edits.push({ key: editKey("group-changed", g.name), kind: "group-changed", group: g.name, fields });
    edits.push(...assignmentEdits(g.name, old.assignment, g.assignment));
  }
  for (const g of base.groups) if (!after.has(g.name)) edits.push({ key: editKey("group-removed", g.name), kind: "group-removed", group: g.name });
  const order = (c: SiteConfig) =>
    [...c.groups].sort((a, b) => a.priority - b.priority || (a.name < b.name ? -1 : a.name > b.name ? 1 : 0)).map((g) => g.name);
  const kept = (names: string[], other: Map<string, GroupConfig>) => names.filter((n) => other.has(n));
  const from = kept(order(base), after);
  const to = kept(order(working), before);
  if (stable(from) !== stable(to)) edits.push({ key: editKey("groups-reordered"), kind: "groups-reordered", from, to });
  return edits;
}

function assignmentEdits(group: string, old: AssignmentConfig | null, now: AssignmentConfig | null): DraftEdit[] {
  if (old === null && now === null) return [];
  if (old === null || now === null || old.revisionId !== now.revisionId) {
    return [{ key: editKey("assignment-set", group), kind: "assignment-set", group, from: ref(old), to: ref(now) }];
  }
  const groupOverrides = stable(old.overrides) !== stable(now.overrides);
  const oldTags = new Map(old.tags.map((t) => [t.tag, stable(t.overrides)]));
  const newTags = new Map(now.tags.map((t) => [t.tag, stable(t.overrides)]));
  const tags = [...new Set([...oldTags.keys(), ...newTags.keys()])].filter((t) => oldTags.get(t) !== newTags.get(t)).sort();
  if (!groupOverrides && tags.length === 0) return [];
  return [{ key: editKey("overrides-changed", group), kind: "overrides-changed", group, groupOverrides, tags }];
}

const show = (r: RevisionRef) => `"${r.profile}" revision ${r.revision}`;

/** One edit in a sentence. */
export function describeEdit(e: DraftEdit): string {
  switch (e.kind) {
    case "group-added":
      return `Group "${e.group}" added${e.assignment ? `, assigned ${show(e.assignment)}` : ""}`;
    case "group-removed":
      return `Group "${e.group}" removed`;
    case "group-changed":
      return `Group "${e.group}": ${e.fields.join(", ")} changed`;
    case "groups-reordered":
      return `Group priority changed: ${e.to.join(" → ")}`;
    case "assignment-set":
      if (e.to === null) return `Group "${e.group}": assignment of ${show(e.from!)} removed`;
      if (e.from === null) return `Group "${e.group}": assigned ${show(e.to)}`;
      return `Group "${e.group}": ${show(e.from)} → ${show(e.to)}`;
    case "overrides-changed": {
      const parts = [];
      if (e.groupOverrides) parts.push("group overrides");
      if (e.tags.length) parts.push(`overrides for ${e.tags.length === 1 ? `tag ${e.tags[0]}` : `${e.tags.length} tags`}`);
      return `Group "${e.group}": ${parts.join(" and ")} changed`;
    }
  }
}
