import { diffJson } from "diff";

type Snapshot = Record<string, unknown> | null;

/** Before → after of one audit entry as line-by-line JSON, removed lines red, added green. */
export function AuditDiff({ before, after }: Readonly<{ before: Snapshot; after: Snapshot }>) {
  // A creation has no "before" and a deletion no "after": show every line as added or removed.
  const parts =
    before === null
      ? [{ added: true, removed: false, value: JSON.stringify(after ?? {}, null, 2) }]
      : after === null
        ? [{ added: false, removed: true, value: JSON.stringify(before, null, 2) }]
        : diffJson(before, after);
  return (
    <pre className="overflow-x-auto rounded-panel bg-panel-sunk p-2 font-mono text-micro leading-5" aria-label="Before and after">
      {parts.map((part, i) => {
        const sign = part.added ? "+" : part.removed ? "-" : " ";
        const cls = part.added ? "bg-ok-soft text-ok" : part.removed ? "bg-fault-soft text-fault" : "text-ink-soft";
        const lines = part.value.replace(/\n$/, "").split("\n");
        return lines.map((line, j) => (
          <span key={`${i}-${j}`} className={`block ${cls}`} data-change={part.added ? "added" : part.removed ? "removed" : "same"}>
            {sign} {line}
          </span>
        ));
      })}
    </pre>
  );
}
