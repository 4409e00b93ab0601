import type { ConfigEstimate } from "@/lib/data/estimates";
import { fmt, fmtBytes, fmtInt, fmtRatio } from "./format";

const SOURCE = { measured: "measured", default: "default", window: "exact (window)" } as const;

/** One configuration's estimate per group, with totals. */
export function EstimateTable({ estimate, label }: Readonly<{ estimate: ConfigEstimate; label: string }>) {
  const t = estimate.totals;
  return (
    <table className="w-full text-label" aria-label={label}>
      <thead className="text-left text-ink-soft">
        <tr className="border-b border-panel-line">
          <th className="py-2 pr-3 font-medium">Group</th>
          <th className="py-2 pr-3 font-medium">Tags</th>
          <th className="py-2 pr-3 font-medium">Outputs: ratio (peak)</th>
          <th className="py-2 pr-3 text-right font-medium">Samples/day in → out</th>
          <th className="py-2 pr-3 text-right font-medium">Bytes/day plain · compressed</th>
          <th className="py-2 text-right font-medium">kbit/s mean · peak</th>
        </tr>
      </thead>
      <tbody>
        {estimate.groups.map((g) => (
          <tr key={g.group} className="border-b border-panel-line align-top" data-testid={`estimate-${g.group}`}>
            <td className="py-2 pr-3">
              <span className="font-medium">{g.group}</span>
              <span className="block text-micro text-ink-faint">{g.profile ?? "site default handling"}</span>
            </td>
            <td className="py-2 pr-3">{fmtInt(g.tagCount)}</td>
            <td className="py-2 pr-3">
              <ul>
                {g.outputs.map((o) => (
                  <li key={o.output}>
                    {o.output}: {fmtRatio(o.ratio)} ({fmtRatio(o.peakRatio)}) <span className="text-micro text-ink-faint">{SOURCE[o.source]}</span>
                  </li>
                ))}
              </ul>
              {g.sampleSet ? <span className="text-micro text-ink-faint">sample set “{g.sampleSet}”</span> : null}
            </td>
            <td className="py-2 pr-3 text-right tabular-nums">
              {fmtInt(g.samplesPerDayIn)} → {fmtInt(g.samplesPerDayOut)}
            </td>
            <td className="py-2 pr-3 text-right tabular-nums">
              {fmtBytes(g.bytesPerDayPlain)} · {fmtBytes(g.bytesPerDayCompressed)}
            </td>
            <td className="py-2 text-right tabular-nums">
              {fmt(g.meanKbps)} · {fmt(g.peakKbps)}
            </td>
          </tr>
        ))}
      </tbody>
      <tfoot>
        <tr className="font-medium" data-testid="estimate-total">
          <td className="py-2 pr-3">Site</td>
          <td className="py-2 pr-3" />
          <td className="py-2 pr-3" />
          <td className="py-2 pr-3 text-right tabular-nums">
            {fmtInt(t.samplesPerDayIn)} → {fmtInt(t.samplesPerDayOut)}
          </td>
          <td className="py-2 pr-3 text-right tabular-nums">
            {fmtBytes(t.bytesPerDayPlain)} · {fmtBytes(t.bytesPerDayCompressed)}
          </td>
          <td className="py-2 text-right tabular-nums">
            {fmt(t.meanKbps)} · {fmt(t.peakKbps)}
          </td>
        </tr>
      </tfoot>
    </table>
  );
}
