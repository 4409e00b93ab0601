// Sweeps split across helper workers: each helper holds a copy of the series (sent by the
// preview worker over its own MessagePort, never through the page) and evaluates every
// n-th value, so a sweep uses every core the browser offers.
import { sweepParameter, type SweepPoint, type SweepTarget } from "@/lib/preview/sweep";
import type { Series } from "@/lib/reduction/series";
import { convertUnit } from "@/lib/units";
import type { RunSpec } from "./worker-protocol";

type ToHelper = { type: "series"; t: Float64Array; v: Float64Array; q?: Uint8Array } | { type: "sweep"; id: number; run: RunSpec; target: SweepTarget; values: number[] };
type FromHelper = { type: "swept"; id: number; points: SweepPoint[] } | { type: "failed"; id: number; error: string };

export const runContext = (run: RunSpec) => ({ timeZone: run.timeZone, convert: convertUnit });

/** In a helper: answer sweeps on the port with the last series received. */
export function serveHelper(port: MessagePort): void {
  let series: Series | null = null;
  port.onmessage = (e: MessageEvent<ToHelper>) => {
    const m = e.data;
    if (m.type === "series") {
      series = { t: m.t, v: m.v, q: m.q };
      return;
    }
    try {
      if (!series) throw new Error("the helper has no series");
      const points = sweepParameter(series, m.run.profile, m.run.tag, m.target, m.values, runContext(m.run));
      port.postMessage({ type: "swept", id: m.id, points } satisfies FromHelper);
    } catch (err) {
      port.postMessage({ type: "failed", id: m.id, error: err instanceof Error ? err.message : String(err) } satisfies FromHelper);
    }
  };
}

/** In the preview worker: the helpers it may hand sweep values to. */
export class HelperPool {
  private readonly ports: MessagePort[] = [];
  private readonly pending = new Map<number, { resolve: (p: SweepPoint[]) => void; reject: (e: Error) => void }>();
  private next = 1;

  attach(port: MessagePort, series: Series | null): void {
    port.onmessage = (e: MessageEvent<FromHelper>) => {
      const p = this.pending.get(e.data.id);
      if (!p) return;
      this.pending.delete(e.data.id);
      if (e.data.type === "swept") p.resolve(e.data.points);
      else p.reject(new Error(e.data.error));
    };
    this.ports.push(port);
    if (series) this.share(series, [port]);
  }

  /** Sends each helper its own copy of the series (transferred, so copied once). */
  share(s: Series, ports = this.ports): void {
    for (const port of ports) {
      const t = s.t.slice();
      const v = s.v.slice();
      const q = s.q?.slice();
      port.postMessage({ type: "series", t, v, q } satisfies ToHelper, q ? [t.buffer, v.buffer, q.buffer] : [t.buffer, v.buffer]);
    }
  }

  /** sweepParameter over the values, every (helpers + 1)-th value here, the rest in the helpers; points in the values' order. */
  async sweep(series: Series, run: RunSpec, target: SweepTarget, values: number[]): Promise<SweepPoint[]> {
    const parts = this.ports.length + 1;
    const chunks: number[][] = Array.from({ length: parts }, () => []);
    values.forEach((v, i) => chunks[i % parts].push(v));
    const remote = this.ports.map((port, k) =>
      chunks[k + 1].length === 0
        ? Promise.resolve([])
        : new Promise<SweepPoint[]>((resolve, reject) => {
            const id = this.next++;
            this.pending.set(id, { resolve, reject });
            port.postMessage({ type: "sweep", id, run, target, values: chunks[k + 1] } satisfies ToHelper);
          }),
    );
    const local = chunks[0].length ? sweepParameter(series, run.profile, run.tag, target, chunks[0], runContext(run)) : [];
    const all = [...local, ...(await Promise.all(remote)).flat()];
    const byValue = new Map(all.map((p) => [p.value, p]));
    return values.map((v) => byValue.get(v)!);
  }
}
