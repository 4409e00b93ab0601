import type { Selector } from "@/schemas/tag";

/** The part of a site's configuration that changes go through review for. */
export type GroupConfig = { name: string; description: string; priority: number; regulated: boolean; selector: Selector };
export type SiteConfig = { groups: GroupConfig[] };

export type DraftEdit =
  | { kind: "group-added"; group: string }
  | { kind: "group-removed"; group: string }
  | { kind: "group-changed"; group: string; fields: string[] }
  | { kind: "groups-reordered"; from: string[]; to: string[] };

const stable = (v: unknown) => JSON.stringify(v);

/** The edits that turn `base` into `working`, in words a reviewer reads: by group name. */
export function diffConfigs(base: SiteConfig, working: SiteConfig): DraftEdit[] {
  const edits: DraftEdit[] = [];
  const before = new Map(base.groups.map((g) => [g.name, g]));
  const after = new Map(working.groups.map((g) => [g.name, g]));
  for (const g of working.groups) {
    const old = before.get(g.name);
    if (!old) {
      edits.push({ kind: "group-added", group: g.name });
      continue;
    }
    const fields: string[] = [];
    if (old.description !== g.description) fields.push("description");
    if (old.regulated !== g.regulated) fields.push("regulated record");
    if (stable(old.selector) !== stable(g.selector)) fields.push("selector");
    if (fields.length) edits.push({ kind: "group-changed", group: g.name, fields });
  }
  for (const g of base.groups) if (!after.has(g.name)) edits.push({ kind: "group-removed", group: g.name });
  const order = (c: SiteConfig) =>
    [...c.groups].sort((a, b) => a.priority - b.priority || a.name.localeCompare(b.name)).map((g) => g.name);
  const kept = (names: string[], other: Map<string, GroupConfig>) => names.filter((n) => other.has(n));
  const from = kept(order(base), after);
  const to = kept(order(working), before);
  if (stable(from) !== stable(to)) edits.push({ kind: "groups-reordered", from, to });
  return edits;
}

export function describeEdit(e: DraftEdit): string {
  switch (e.kind) {
    case "group-added":
      return `Group "${e.group}" added`;
    case "group-removed":
      return `Group "${e.group}" removed`;
    case "group-changed":
      return `Group "${e.group}": ${e.fields.join(", ")} changed`;
    case "groups-reordered":
      return `Group priority changed: ${e.to.join(" → ")}`;
  }
}
