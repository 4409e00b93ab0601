// The workbench's worker: parses sample data, runs previews, sweeps and searches, and
// decimates every series for the chart. The page never holds the full series.
import { parseSampleCsv } from "@/lib/preview/csv";
import { demoSignal } from "@/lib/preview/demo-signals";
import { previewProfile, type OutputPreview } from "@/lib/preview/run";
import { decodeSeriesWire, encodeSeriesWire } from "@/lib/samples/wire";
import { createSweep, findSetting, type SweepPoint } from "@/lib/preview/sweep";
import { QUALITY_BAD, type Series } from "@/lib/reduction/series";
import { align, decimate, gapStarts, markers, type Drawn } from "./decimate";
import { HelperPool, runContext, serveHelper } from "./sweep-helpers";
import type { Calls, CallKind, Reply, Request, SampleSummary, Setup, ViewData } from "./worker-protocol";

// The worker's global scope, typed without the webworker library (which clashes with "dom").
const scope = self as unknown as {
  onmessage: ((e: MessageEvent<Request | Setup>) => void) | null;
  postMessage(message: Reply, transfer: Transferable[]): void;
};

let series: Series | null = null;
let bad = new Uint32Array(0);
let outputs: OutputPreview[] = [];
let gapCache: { gapMs: number; gaps: Float64Array } | null = null;
const pool = new HelperPool();

function hold(s: Series, source: string, format: SampleSummary["format"], columns: string | null): SampleSummary {
  series = s;
  outputs = [];
  gapCache = null;
  const idx: number[] = [];
  if (s.q) for (let i = 0; i < s.q.length; i++) if (s.q[i] === QUALITY_BAD) idx.push(i);
  bad = Uint32Array.from(idx);
  pool.share(s);
  const n = s.t.length;
  return { source, rows: n, from: n ? s.t[0] : 0, to: n ? s.t[n - 1] : 0, bad: bad.length, format, columns };
}

function loaded(): Series {
  if (!series) throw new Error("Load sample data first.");
  return series;
}

function gapsFor(gapMs: number): Float64Array {
  if (!gapCache || gapCache.gapMs !== gapMs) gapCache = { gapMs, gaps: gapStarts(loaded().t, gapMs) };
  return gapCache.gaps;
}

function view(from: number, to: number, width: number, gapMs: number): ViewData {
  const s = loaded();
  const columns = Math.max(50, Math.round(width));
  const gaps = gapsFor(gapMs);
  const drawn: Drawn[] = [decimate(s.t, s.v, from, to, columns, gaps)];
  for (const o of outputs) drawn.push(decimate(o.reduced.t, o.reduced.v, from, to, columns, gaps));
  drawn.push(markers(s.t, s.v, bad, from, to, columns));
  const { x, ys } = align(drawn);
  return { from, to, x, ys, inView: drawn.map((d) => d.inView) };
}

const handlers: { [K in CallKind]: (p: Calls[K]["req"]) => Promise<Calls[K]["res"]> | Calls[K]["res"] } = {
  async "load-csv"({ file, timeZone }) {
    const parsed = parseSampleCsv(await file.text(), { timeZone });
    if (!parsed.ok) return { problems: parsed.problems };
    const c = parsed.columns;
    return { summary: hold(parsed.series, file.name, parsed.format, [c.time, c.value, c.quality].filter(Boolean).join(", ")) };
  },
  "load-wire"({ buffer, source }) {
    const decoded = decodeSeriesWire(buffer);
    if (!decoded.ok) return { problems: [{ line: 0, message: decoded.message }] };
    return { summary: hold(decoded.series, source, "saved", null) };
  },
  "export-wire"() {
    return { buffer: encodeSeriesWire(loaded()) };
  },
  "load-demo"({ signal, samples, periodMs, euLow, euHigh }) {
    const s = demoSignal(signal, { samples, periodMs, euLow, euHigh, start: Date.UTC(2026, 0, 5, 6), seed: 7 });
    return { summary: hold(s, `demo ${signal} signal`, "generated", null) };
  },
  preview({ run, width, gapMs, range }) {
    const t0 = performance.now();
    const s = loaded();
    outputs = [];
    outputs = previewProfile(s, run.profile, run.tag, { ...runContext(run), byteModel: run.byteModel });
    const summaries = outputs.map((o) => ({ name: o.name, metrics: o.metrics, reconstruction: o.reconstruction, selection: o.kept !== null }));
    const ms = performance.now() - t0;
    return { outputs: summaries, view: view(range?.from ?? s.t[0], range?.to ?? s.t[s.t.length - 1], width, gapMs), ms };
  },
  view({ from, to, width, gapMs }) {
    return view(from, to, width, gapMs);
  },
  async sweep({ run, target, values }) {
    const t0 = performance.now();
    const points = await pool.sweep(loaded(), run, target, values);
    return { points, ms: performance.now() - t0 };
  },
  // The grid runs spread over the helpers first; findSetting then reads it back and refines here.
  async find({ run, target, grid, goal }) {
    const t0 = performance.now();
    const s = loaded();
    const known = new Map<number, SweepPoint>((await pool.sweep(s, run, target, [...new Set(grid)])).map((p) => [p.value, p]));
    // One sweep for every refinement point: the steps before the swept one run once.
    const sweep = createSweep(s, run.profile, run.tag, target, runContext(run));
    const evaluate = (value: number) => known.get(value) ?? sweep([value])[0];
    const { best, evaluated } = findSetting(evaluate, grid, goal, { rounds: 2, points: 4 });
    return { best, evaluated, ms: performance.now() - t0 };
  },
};

function transferables(result: unknown): Transferable[] {
  const v = (result as { view?: ViewData }).view ?? (result as ViewData);
  if (!v || !(v.x instanceof Float64Array)) return [];
  return [v.x.buffer, ...v.ys.map((y) => y.buffer)];
}

scope.onmessage = async (e: MessageEvent<Request | Setup>) => {
  if ("setup" in e.data) {
    if (e.data.setup === "helper") serveHelper(e.data.port);
    else pool.attach(e.data.port, series);
    return;
  }
  const { id, kind, payload } = e.data;
  let reply: Reply;
  try {
    const handler = handlers[kind] as (p: unknown) => unknown;
    reply = { id, ok: true, result: await handler(payload) };
  } catch (err) {
    reply = { id, ok: false, error: err instanceof Error ? err.message : String(err) };
  }
  scope.postMessage(reply, reply.ok ? transferables(reply.result) : []);
};
