import type { BundleDiff } from "@/lib/bundles/diff";

const STAMP = /^(release|issued):\s/;

/**
 * True when two bundles differ only in the release number and issue time, the lines a
 * re-render of the same content always changes (DESIGN.md "Bundle", "Rollback").
 */
export function differsOnlyInStamp(diff: BundleDiff | null): boolean {
  if (!diff || diff.unified.includes("\n--- /dev/null\n")) return false;
  return diff.hunks.every((h) => h.lines.every((l) => l.kind === "same" || STAMP.test(l.text)));
}
