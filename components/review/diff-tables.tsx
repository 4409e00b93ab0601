import type { BundleDiff, DiffLine, SideCell } from "@/lib/bundles/diff";

const MARK = { added: "+", removed: "−", same: " " } as const;
const SPOKEN = { added: "added: ", removed: "removed: ", same: "" } as const;
const ROW = { added: "bg-ok-soft", removed: "bg-fault-soft", same: "" } as const;
const cell = "border-0 px-2 py-0 align-top";
const num = `${cell} w-10 select-none text-right text-ink-faint`;

/** A stretch of unchanged lines left out of the view. */
function Collapsed({ n, span }: Readonly<{ n: number; span: number }>) {
  return (
    <tr data-kind="collapsed" className="bg-panel-sunk">
      <td colSpan={span} className={`${cell} py-0.5 text-ink-faint`}>
        … {n.toLocaleString("en")} unchanged line{n === 1 ? "" : "s"}
      </td>
    </tr>
  );
}

function Mark({ kind }: Readonly<{ kind: DiffLine["kind"] }>) {
  return (
    <td className={`${cell} w-4 select-none font-bold`} aria-hidden="true">
      {MARK[kind]}
    </td>
  );
}

/** One column of lines: old and new line numbers, +/− and the text. */
export function UnifiedDiff({ diff, label }: Readonly<{ diff: BundleDiff; label: string }>) {
  return (
    <div className="overflow-x-auto">
      <table aria-label={label} className="font-mono text-micro">
        <thead className="sr-only">
          <tr>
            <th>Before line</th>
            <th>After line</th>
            <th>Mark</th>
            <th>Text</th>
          </tr>
        </thead>
        <tbody>
          {diff.hunks.map((h, i) => [
            h.collapsedBefore > 0 ? <Collapsed key={`c${i}`} n={h.collapsedBefore} span={4} /> : null,
            ...h.lines.map((l, j) => (
              <tr key={`${i}.${j}`} data-kind={l.kind} className={ROW[l.kind]}>
                <td className={num}>{l.oldNo ?? ""}</td>
                <td className={num}>{l.newNo ?? ""}</td>
                <Mark kind={l.kind} />
                <td className={`${cell} whitespace-pre`}>
                  <span className="sr-only">{SPOKEN[l.kind]}</span>
                  {l.text}
                </td>
              </tr>
            )),
          ])}
          {diff.collapsedAfter > 0 ? <Collapsed n={diff.collapsedAfter} span={4} /> : null}
        </tbody>
      </table>
    </div>
  );
}

function Side({ c }: Readonly<{ c: SideCell | null }>) {
  if (!c) return <td colSpan={3} className={`${cell} bg-panel-sunk`} />;
  return (
    <>
      <td className={`${num} ${ROW[c.kind]}`}>{c.no}</td>
      <td className={`${cell} w-4 select-none font-bold ${ROW[c.kind]}`} aria-hidden="true">
        {MARK[c.kind]}
      </td>
      <td className={`${cell} whitespace-pre ${ROW[c.kind]}`} data-kind={c.kind}>
        <span className="sr-only">{SPOKEN[c.kind]}</span>
        {c.text}
      </td>
    </>
  );
}

/** Two columns: the earlier bundle on the left, the later on the right, replaced lines side by side. */
export function SideBySideDiff({ diff, label }: Readonly<{ diff: BundleDiff; label: string }>) {
  return (
    <div className="overflow-x-auto">
      <table aria-label={label} className="font-mono text-micro">
        <thead className="sr-only">
          <tr>
            <th colSpan={3}>Before</th>
            <th colSpan={3}>After</th>
          </tr>
        </thead>
        <tbody>
          {diff.sideBySide.map((r, i) =>
            "collapsed" in r ? (
              <Collapsed key={i} n={r.collapsed} span={6} />
            ) : (
              <tr key={i}>
                <Side c={r.left} />
                <Side c={r.right} />
              </tr>
            ),
          )}
        </tbody>
      </table>
    </div>
  );
}
