import { formatPatch, structuredPatch } from "diff";

export type DiffLine = { kind: "same" | "added" | "removed"; oldNo: number | null; newNo: number | null; text: string };
export type DiffHunk = { collapsedBefore: number; lines: DiffLine[] };
export type SideCell = { no: number; text: string; kind: DiffLine["kind"] };
export type SideRow = { left: SideCell | null; right: SideCell | null } | { collapsed: number };
export type BundleDiff = {
  /** A unified diff with `---`/`+++` headers, as `createTwoFilesPatch` of the diff package writes it. */
  unified: string;
  hunks: DiffHunk[];
  /** Rows for two columns: removed lines paired with the added lines that replace them; `{ collapsed }` for unchanged stretches left out. */
  sideBySide: SideRow[];
  /** Unchanged lines after the last hunk (left out). */
  collapsedAfter: number;
  added: number;
  removed: number;
};
export type DiffOptions = {
  /** Unchanged lines shown around each change (default 3). */
  context?: number;
  /** File names in the headers (default `before/bundle.yaml`, `after/bundle.yaml`; `/dev/null` for no bundle before). */
  beforeName?: string;
  afterName?: string;
};

const countLines = (s: string) => (s === "" ? 0 : s.split("\n").length - (s.endsWith("\n") ? 1 : 0));

/**
 * The line diff of two bundles for review (DESIGN.md "Review and release"): the diff
 * package's Myers diff (E. W. Myers, "An O(ND) Difference Algorithm and Its Variations",
 * Algorithmica 1, 1986) computed once, as a unified patch (`formatPatch` of the
 * `structuredPatch`, which is what `createTwoFilesPatch` returns) and as hunks with old
 * and new line numbers (1-based), unchanged stretches beyond `context` lines collapsed to
 * their length. `before` null (a gateway's first bundle) shows every line added.
 */
export function diffBundles(before: string | null, after: string, opts: DiffOptions = {}): BundleDiff {
  const context = opts.context ?? 3;
  const oldName = before === null ? "/dev/null" : (opts.beforeName ?? "before/bundle.yaml");
  const newName = opts.afterName ?? "after/bundle.yaml";
  const patch = structuredPatch(oldName, newName, before ?? "", after, undefined, undefined, { context });
  const unified = formatPatch(patch);

  const hunks: DiffHunk[] = [];
  const sideBySide: SideRow[] = [];
  let added = 0;
  let removed = 0;
  let oldSeen = 0; // old lines accounted for so far
  for (const h of patch.hunks) {
    // A structured hunk's starts are the numbers of its first lines (the next line when a
    // side is empty; only the printed "-0,0" header differs).
    const collapsedBefore = h.oldStart - 1 - oldSeen;
    let o = h.oldStart;
    let n = h.newStart;
    const lines: DiffLine[] = [];
    for (const raw of h.lines) {
      const mark = raw[0];
      const text = raw.slice(1);
      if (mark === "\\") continue; // "\ No newline at end of file"
      if (mark === "+") {
        lines.push({ kind: "added", oldNo: null, newNo: n++, text });
        added++;
      } else if (mark === "-") {
        lines.push({ kind: "removed", oldNo: o++, newNo: null, text });
        removed++;
      } else lines.push({ kind: "same", oldNo: o++, newNo: n++, text });
    }
    oldSeen = o - 1;
    hunks.push({ collapsedBefore, lines });
    if (collapsedBefore > 0) sideBySide.push({ collapsed: collapsedBefore });
    sideBySide.push(...pairRows(lines));
  }
  const collapsedAfter = before === null ? 0 : countLines(before) - oldSeen;
  if (collapsedAfter > 0) sideBySide.push({ collapsed: collapsedAfter });
  return { unified, hunks, sideBySide, collapsedAfter, added, removed };
}

/** Same lines side by side; each run of removed lines beside the run of added lines that follows it. */
function pairRows(lines: DiffLine[]): SideRow[] {
  const rows: SideRow[] = [];
  let i = 0;
  while (i < lines.length) {
    const l = lines[i];
    if (l.kind === "same") {
      rows.push({ left: { no: l.oldNo!, text: l.text, kind: "same" }, right: { no: l.newNo!, text: l.text, kind: "same" } });
      i++;
      continue;
    }
    const gone: DiffLine[] = [];
    const come: DiffLine[] = [];
    while (i < lines.length && lines[i].kind === "removed") gone.push(lines[i++]);
    while (i < lines.length && lines[i].kind === "added") come.push(lines[i++]);
    for (let k = 0; k < Math.max(gone.length, come.length); k++) {
      const g = gone[k];
      const c = come[k];
      rows.push({ left: g ? { no: g.oldNo!, text: g.text, kind: "removed" } : null, right: c ? { no: c.newNo!, text: c.text, kind: "added" } : null });
    }
  }
  return rows;
}
