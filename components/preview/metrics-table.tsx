import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import type { ByteModel } from "@/lib/preview/run";
import { bytes, count, num, percent, ratio } from "./format";
import type { OutputSummary } from "./worker-protocol";

type Props = { outputs: readonly OutputSummary[]; unit: string; byteModel: ByteModel };

const RECONSTRUCTION = {
  linear: "straight lines between kept samples",
  step: "each kept value held until the next",
  window: "each window's value held from the window's start",
  none: "not measured (no reconstruction of the raw signal)",
};
const against = (o: OutputSummary) => RECONSTRUCTION[o.reconstruction === "step" && !o.selection ? "window" : (o.reconstruction ?? "none")];

/** Samples, ratio, error and bytes for each output of the previewed profile. */
export function MetricsTable({ outputs, unit, byteModel }: Readonly<Props>) {
  return (
    <section aria-labelledby="metrics-heading" className="flex flex-col gap-2">
      <h2 id="metrics-heading">Metrics</h2>
      <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
        <table className="whitespace-nowrap text-label">
          <caption className="sr-only">Metrics per output of the previewed profile</caption>
          <thead>
            <tr>
              <th scope="col">Output</th>
              <th scope="col" className="text-right">Samples in</th>
              <th scope="col" className="text-right">Samples out</th>
              <th scope="col" className="text-right">Ratio</th>
              <th scope="col" className="text-right">Max abs error ({unit})</th>
              <th scope="col" className="text-right">RMSE ({unit})</th>
              <th scope="col" className="text-right">Extrema kept</th>
              <th scope="col" className="text-right">Bytes plain</th>
              <th scope="col" className="text-right">Bytes compressed</th>
              <th scope="col">Error measured against</th>
            </tr>
          </thead>
          <tbody>
            {outputs.map((o) => (
              <tr key={o.name} data-testid={`metrics-${o.name}`}>
                <th scope="row" className="border-b border-panel-line px-3 py-2 text-label font-medium normal-case text-ink">
                  {o.name}
                </th>
                <td className="text-right tabular-nums">{count(o.metrics.samplesIn)}</td>
                <td className="text-right tabular-nums">{count(o.metrics.samplesOut)}</td>
                <td className="text-right tabular-nums">{ratio(o.metrics.ratio)}</td>
                <td className="text-right tabular-nums">{num(o.metrics.maxAbsError)}</td>
                <td className="text-right tabular-nums">{num(o.metrics.rmse)}</td>
                <td className="text-right tabular-nums">{percent(o.metrics.extremaKeptShare)}</td>
                <td className="text-right tabular-nums">{bytes(o.metrics.bytesPlain)}</td>
                <td className="text-right tabular-nums">{bytes(o.metrics.bytesCompressed)}</td>
                <td className="min-w-40 whitespace-normal text-micro text-ink-faint">{against(o)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-micro text-ink-faint">
        Plain bytes: {byteModel.bytesPerSample} bytes per sample plus {num(byteModel.transportOverhead * 100)} % transport overhead. Compressed bytes: the
        exact size of the reduced series under delta-of-delta timestamps and XOR values (Gorilla, PVLDB 8(12), 2015). Bad-quality samples are not
        measured; nothing is interpolated across a gap.
      </p>
      <div role="note" aria-label="Reduction is lossy" className="rounded-panel border border-caution/40 bg-caution-soft px-3 py-2 text-label text-ink">
        <p>
          <strong className="text-caution">Reduction is lossy.</strong> These figures describe this sample only; the cloud receives fewer samples than
          the plant measured.
        </p>
        <details className="mt-1">
          <summary className="cursor-pointer text-weir-700">{REGULATED_RECORD_CAUTION.title}: when the raw record must be kept</summary>
          <p className="mt-1 text-ink-soft">{REGULATED_RECORD_CAUTION.text}</p>
        </details>
      </div>
    </section>
  );
}
