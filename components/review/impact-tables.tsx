import Link from "next/link";
import { fmt, fmtRatio } from "@/components/estimates/format";
import type { Impact } from "@/lib/data/change-review";

type Accuracy = Impact["accuracy"][number]["before"];
type Figures = Impact["bandwidth"]["after"];

const arrow = (before: string, after: string) => (before === after ? after : `${before} → ${after}`);
const side = (a: Accuracy, pick: (a: NonNullable<Accuracy>) => string) => (a ? pick(a) : "—");

function Pair({ before, after, pick }: Readonly<{ before: Accuracy; after: Accuracy; pick: (a: NonNullable<Accuracy>) => string }>) {
  return <td className="whitespace-nowrap tabular-nums">{arrow(side(before, pick), side(after, pick))}</td>;
}

/** Max error and RMSE before → after on each changed group's saved sample set. */
export function AccuracyImpact({ rows }: Readonly<{ rows: Impact["accuracy"] }>) {
  if (rows.length === 0) {
    return <p className="text-label text-ink-soft">No group changed by this change has a saved sample set, so there are no accuracy figures. Save a sample set against a group to see them here.</p>;
  }
  return (
    <div className="overflow-x-auto">
      <table aria-label="Accuracy impact" className="text-label">
        <thead>
          <tr>
            <th>Group</th>
            <th>Output</th>
            <th>Sample set</th>
            <th>Reduction ratio</th>
            <th>Max error</th>
            <th>RMSE</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={`${r.group}/${r.output}`}>
              <td className="font-mono">{r.group}</td>
              <td className="font-mono">{r.output}</td>
              <td>{r.sampleSet}</td>
              <Pair before={r.before} after={r.after} pick={(a) => fmtRatio(a.ratio)} />
              <Pair before={r.before} after={r.after} pick={(a) => fmt(a.maxAbsError)} />
              <Pair before={r.before} after={r.after} pick={(a) => fmt(a.rmse)} />
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-1 text-micro text-ink-faint">Errors are in the engineering unit of the sample set&apos;s tag; “—” means the output does not exist on that side.</p>
    </div>
  );
}

const LINES: { label: string; pick: (f: Figures) => number }[] = [
  { label: "Mean uplink (kbit/s)", pick: (f) => f.meanKbps },
  { label: "Peak uplink (kbit/s)", pick: (f) => f.peakKbps },
  { label: "Cloud storage (GB per month)", pick: (f) => f.gbPerMonth },
  { label: "Storage cost per month at retention", pick: (f) => f.storageCostPerMonthAtRetention },
];

/** Uplink and storage before → after, against the site's budget. */
export function BandwidthImpact({ site, bandwidth }: Readonly<{ site: string; bandwidth: Impact["bandwidth"] }>) {
  const { before, after, budgetKbps, usableKbps } = bandwidth;
  const over = after.peakKbps > usableKbps ? "peak" : after.meanKbps > usableKbps ? "mean" : null;
  return (
    <div className="flex flex-col gap-2">
      <table aria-label="Bandwidth and storage impact" className="max-w-2xl text-label">
        <thead>
          <tr>
            <th>Estimate</th>
            <th>Current release</th>
            <th>With this change</th>
          </tr>
        </thead>
        <tbody>
          {LINES.map((l) => (
            <tr key={l.label}>
              <td>{l.label}</td>
              <td className="tabular-nums">{before ? fmt(l.pick(before)) : "— (no release yet)"}</td>
              <td className="tabular-nums">{fmt(l.pick(after))}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className={`text-label ${over ? "font-medium text-fault" : "text-ink-soft"}`} data-testid="uplink-verdict">
        Uplink budget {fmt(budgetKbps)} kbit/s, usable {fmt(usableKbps)} kbit/s:{" "}
        {over ? `over the usable uplink at the ${over}` : "within the usable uplink at mean and peak"}.
      </p>
      <p className="text-micro text-ink-faint">
        Estimates, not measurements: worked out when the change was submitted from the groups&apos; profiles, sample sets and the site&apos;s byte model.{" "}
        <Link href={`/sites/${site}/estimates`} className="text-weir-700 underline">
          See the assumptions
        </Link>
        .
      </p>
    </div>
  );
}
