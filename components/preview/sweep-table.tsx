import type { SweepPoint } from "@/lib/preview/sweep";
import { num, ratio } from "./format";

type Props = { points: readonly SweepPoint[]; parameter: string; unit: string };

/** The sweep's points as text, for reading and for screen readers. */
export function SweepTable({ points, parameter, unit }: Readonly<Props>) {
  const sorted = [...points].sort((a, b) => a.value - b.value);
  return (
    <details className="text-label">
      <summary className="cursor-pointer text-weir-700">Sweep points as a table ({sorted.length})</summary>
      <table className="mt-2">
        <thead>
          <tr>
            <th scope="col">{parameter}</th>
            <th scope="col" className="text-right">Ratio</th>
            <th scope="col" className="text-right">Max abs error ({unit})</th>
            <th scope="col" className="text-right">RMSE ({unit})</th>
          </tr>
        </thead>
        <tbody>
          {sorted.map((p, i) => (
            <tr key={`${p.value}-${i}`}>
              <td className="tabular-nums">{num(p.value)}</td>
              <td className="text-right tabular-nums">{ratio(p.ratio)}</td>
              <td className="text-right tabular-nums">{num(p.maxAbsError)}</td>
              <td className="text-right tabular-nums">{num(p.rmse)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}
