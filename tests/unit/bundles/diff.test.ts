import { createTwoFilesPatch } from "diff";
import { describe, expect, it } from "vitest";
import { diffBundles } from "@/lib/bundles/diff";

const lines = (n: number, change?: Record<number, string>) =>
  Array.from({ length: n }, (_, i) => change?.[i + 1] ?? `line ${i + 1}`).join("\n") + "\n";

describe("diffBundles", () => {
  it("numbers lines and collapses unchanged stretches beyond the context", () => {
    const before = lines(12);
    const after = lines(12, { 6: "line six" });
    const d = diffBundles(before, after, { context: 2 });
    expect(d.added).toBe(1);
    expect(d.removed).toBe(1);
    expect(d.hunks).toEqual([
      {
        collapsedBefore: 3,
        lines: [
          { kind: "same", oldNo: 4, newNo: 4, text: "line 4" },
          { kind: "same", oldNo: 5, newNo: 5, text: "line 5" },
          { kind: "removed", oldNo: 6, newNo: null, text: "line 6" },
          { kind: "added", oldNo: null, newNo: 6, text: "line six" },
          { kind: "same", oldNo: 7, newNo: 7, text: "line 7" },
          { kind: "same", oldNo: 8, newNo: 8, text: "line 8" },
        ],
      },
    ]);
    expect(d.collapsedAfter).toBe(4);
    expect(d.sideBySide).toEqual([
      { collapsed: 3 },
      { left: { no: 4, text: "line 4", kind: "same" }, right: { no: 4, text: "line 4", kind: "same" } },
      { left: { no: 5, text: "line 5", kind: "same" }, right: { no: 5, text: "line 5", kind: "same" } },
      { left: { no: 6, text: "line 6", kind: "removed" }, right: { no: 6, text: "line six", kind: "added" } },
      { left: { no: 7, text: "line 7", kind: "same" }, right: { no: 7, text: "line 7", kind: "same" } },
      { left: { no: 8, text: "line 8", kind: "same" }, right: { no: 8, text: "line 8", kind: "same" } },
      { collapsed: 4 },
    ]);
  });

  it("writes the unified patch createTwoFilesPatch writes, with headers", () => {
    const before = lines(12);
    const after = lines(12, { 2: "two", 11: "eleven" });
    const d = diffBundles(before, after, { beforeName: "release-14/fw-gw-01.yaml", afterName: "release-15/fw-gw-01.yaml" });
    expect(d.unified).toBe(createTwoFilesPatch("release-14/fw-gw-01.yaml", "release-15/fw-gw-01.yaml", before, after, undefined, undefined, { context: 3 }));
    expect(d.unified.split("\n").slice(1, 4)).toEqual(["--- release-14/fw-gw-01.yaml", "+++ release-15/fw-gw-01.yaml", "@@ -1,5 +1,5 @@"]);
    // Changes at lines 2 and 11 are 8 lines apart: more than twice the context, so two hunks.
    expect(d.hunks.map((h) => h.collapsedBefore)).toEqual([0, 2]);
    expect(d.hunks[1].lines[0]).toEqual({ kind: "same", oldNo: 8, newNo: 8, text: "line 8" });
    expect(d.collapsedAfter).toBe(0);
  });

  it("pairs a run of removed lines with the added lines that follow, leaving the rest alone", () => {
    const d = diffBundles("a\nb\nc\nd\n", "a\nx\nd\ne\n");
    const rows = d.sideBySide.filter((r) => !("collapsed" in r));
    expect(rows).toEqual([
      { left: { no: 1, text: "a", kind: "same" }, right: { no: 1, text: "a", kind: "same" } },
      { left: { no: 2, text: "b", kind: "removed" }, right: { no: 2, text: "x", kind: "added" } },
      { left: { no: 3, text: "c", kind: "removed" }, right: null },
      { left: { no: 4, text: "d", kind: "same" }, right: { no: 3, text: "d", kind: "same" } },
      { left: null, right: { no: 4, text: "e", kind: "added" } },
    ]);
  });

  it("shows a first bundle as every line added, against /dev/null", () => {
    const d = diffBundles(null, "sluice: bundle/1\nsite: x\n");
    expect(d.added).toBe(2);
    expect(d.removed).toBe(0);
    expect(d.unified).toContain("--- /dev/null");
    expect(d.hunks).toEqual([
      {
        collapsedBefore: 0,
        lines: [
          { kind: "added", oldNo: null, newNo: 1, text: "sluice: bundle/1" },
          { kind: "added", oldNo: null, newNo: 2, text: "site: x" },
        ],
      },
    ]);
  });

  it("numbers a pure insertion and a pure removal with no context", () => {
    const ins = diffBundles("a\nb\nc\n", "a\nb\nX\nc\n", { context: 0 });
    expect(ins.hunks).toEqual([{ collapsedBefore: 2, lines: [{ kind: "added", oldNo: null, newNo: 3, text: "X" }] }]);
    expect(ins.collapsedAfter).toBe(1);
    const del = diffBundles("a\nb\nc\n", "a\nc\n", { context: 0 });
    expect(del.hunks).toEqual([{ collapsedBefore: 1, lines: [{ kind: "removed", oldNo: 2, newNo: null, text: "b" }] }]);
    expect(del.collapsedAfter).toBe(1);
  });

  it("collapses everything when nothing changed", () => {
    const d = diffBundles(lines(5), lines(5));
    expect(d).toMatchObject({ hunks: [], sideBySide: [{ collapsed: 5 }], collapsedAfter: 5, added: 0, removed: 0 });
  });
});
