import type { RevisionDiff } from "@/lib/data/profiles";

/** The YAML of two revisions line by line: + added, − removed (the sign carries the meaning, colour repeats it). */
export function LineDiff({ lines, from, to }: Readonly<{ lines: RevisionDiff["lines"]; from: number; to: number }>) {
  return (
    <pre className="overflow-x-auto rounded-panel border border-panel-line bg-panel p-2 font-mono text-micro leading-5" aria-label={`YAML of revision ${from} against revision ${to}`}>
      {lines.map((part, i) =>
        part.value
          .replace(/\n$/, "")
          .split("\n")
          .map((line, j) => {
            const change = part.added ? "added" : part.removed ? "removed" : "same";
            const sign = part.added ? "+" : part.removed ? "−" : " ";
            const cls = part.added ? "bg-ok-soft text-ok" : part.removed ? "bg-fault-soft text-fault" : "text-ink-soft";
            return (
              <span key={`${i}-${j}`} className={`block whitespace-pre ${cls}`} data-change={change}>
                <span className="select-none" aria-hidden>
                  {sign}{" "}
                </span>
                {change === "same" ? null : <span className="sr-only">{change === "added" ? "added: " : "removed: "}</span>}
                {line}
              </span>
            );
          }),
      )}
    </pre>
  );
}
