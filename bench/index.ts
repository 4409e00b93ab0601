/**
 * `npx tsx bench/index.ts`: speed of lib/reduction on a 1M-sample series, against a plain
 * scan loop and the reference libraries measured in the same run. Targets (issue): LTTB
 * ≥ 50× `downsample`, RDP perpendicular ≥ 2× `simplify-js` (highQuality), swinging door,
 * deadband and windowed mean ≥ 100 Msamples/s. Then every streaming processor in
 * 4,096-sample chunks against its batch form, and `encodedBits` (bench/reduction-streaming.ts).
 */
import { LTTB as downsampleLttb } from "downsample";
import simplify from "simplify-js";
import { aggregate, deadband, exceedances, ltob, lttb, m4, measure, rdp, swingingDoor, timeAbove } from "@/lib/reduction";
import { CHUNK, encodedBitsRows, streamingRows } from "./reduction-streaming";
import { benchSeries } from "./series";
import { heapGrowthMb, peakRssMb, roundRobin, timeOnce } from "./timing";

const N = 1_000_000;
const ROUNDS = 15;
const WARMUPS = 4;
const s = benchSeries(N);
const { t, v } = s;
const LTTB_POINTS = 75_000;
const RDP_EPSILON = 0.65;

type Case = {
  name: string;
  params: string;
  run: () => unknown;
  /** Target: minimum Msamples/s, or minimum speed-up over the reference. */
  target?: { msps?: number; speedup?: number };
  /** The reference library for the same job, timed in the same rounds. */
  ref?: Reference;
};

type Reference = { name: string; run: () => unknown; release: () => void; buildMs: () => number };

/**
 * A reference library run on its own input format, built from the typed arrays once
 * (not timed) and released after the timing, so that no case runs with another case's
 * million objects alive on the heap.
 */
function reference<I>(name: string, build: () => I, run: (input: I) => unknown): Reference {
  let input: I | undefined;
  return {
    name,
    run: () => run((input ??= build())),
    release: () => {
      input = undefined;
    },
    buildMs: () => Math.min(...[0, 1, 2].map(() => timeOnce(build))),
  };
}

// Plain scan: one pass reading both arrays (what validation alone costs). It returns a
// local straight after the loop: an operation there would lack V8 type feedback and
// throw away the loop's compiled code on every call.
function scan(): number {
  let sum = 0;
  let prev = -Infinity;
  for (let i = 0; i < N; i++) {
    const ti = t[i];
    if (!(ti > prev)) sum = Number.NaN;
    prev = ti;
    sum += v[i];
  }
  return sum;
}

const W = 60_000;
const cases: Case[] = [
  { name: "plain scan loop", params: "read t and v once", run: scan },
  { name: "swinging door", params: "deviation 0.62", run: () => swingingDoor(s, { deviation: 0.62 }), target: { msps: 100 } },
  { name: "deadband", params: "deadband 0.55", run: () => deadband(s, { deadband: 0.55 }), target: { msps: 100 } },
  { name: "mean", params: "window 60 s", run: () => aggregate(s, { windowMs: W, fn: "mean" }), target: { msps: 100 } },
  {
    name: "LTTB",
    params: `points ${LTTB_POINTS}`,
    run: () => lttb(s, { points: LTTB_POINTS }),
    target: { speedup: 50 },
    ref: reference(
      "downsample LTTB",
      () => Array.from(t, (x, i): [number, number] => [x, v[i]]),
      (data) => downsampleLttb(data, LTTB_POINTS),
    ),
  },
  { name: "LTOB", params: `points ${LTTB_POINTS}`, run: () => ltob(s, { points: LTTB_POINTS }) },
  {
    name: "RDP perpendicular",
    params: `epsilon ${RDP_EPSILON}`,
    run: () => rdp(s, { epsilon: RDP_EPSILON, distance: "perpendicular" }),
    target: { speedup: 2 },
    ref: reference(
      "simplify-js HQ",
      () => Array.from(t, (x, i) => ({ x, y: v[i] })),
      (data) => simplify(data, RDP_EPSILON, true),
    ),
  },
  { name: "RDP vertical", params: `epsilon ${RDP_EPSILON}`, run: () => rdp(s, { epsilon: RDP_EPSILON }) },
  { name: "M4", params: "window 60 s", run: () => m4(s, { windowMs: W }) },
  { name: "time-weighted mean", params: "window 60 s, linear", run: () => aggregate(s, { windowMs: W, fn: "timeWeightedMean" }) },
  { name: "stdev (sample)", params: "window 60 s", run: () => aggregate(s, { windowMs: W, fn: "stdevSample" }) },
  { name: "percentile 95", params: "window 60 s", run: () => aggregate(s, { windowMs: W, fn: "percentile", percentile: 95 }) },
  {
    name: "exceedances",
    params: "window 60 s, > 55, hyst. 0.5",
    run: () => exceedances(s, { windowMs: W, threshold: 55, hysteresis: 0.5 }),
  },
  { name: "time above", params: "window 60 s, > 55", run: () => timeAbove(s, { windowMs: W, threshold: 55 }) },
];
const reduced = rdp(s, { epsilon: RDP_EPSILON });
cases.push({ name: "measure", params: "linear, of RDP vertical", run: () => measure(s, reduced, { reconstruction: "linear" }) });

// Our cases, round-robin; then each reference with its own case, round-robin in pairs.
const ours = roundRobin(
  cases.map((c) => c.run),
  ROUNDS,
  WARMUPS,
);
const refs = new Map<Case, { mine: number; ref: number; refMedian: number; refHeap: number; same: string; build: number }>();
for (const c of cases) {
  if (!c.ref) continue;
  const [mine, ref] = roundRobin([c.run, c.ref.run], 7, 2);
  const refHeap = heapGrowthMb(c.ref.run);
  const same = c.name.startsWith("RDP") ? (samePoints(c.run() as Uint32Array, c.ref.run()) ? ", same points" : ", DIFFERENT points") : "";
  c.ref.release();
  refs.set(c, { mine: mine.bestMs, ref: ref.bestMs, refMedian: ref.medianMs, refHeap, same, build: c.ref.buildMs() });
}

const fmt = (x: number, d = 1) => x.toFixed(d);
const scanMs = ours[0].bestMs;
const verdicts: string[] = [];
const rows = cases.map((c, k) => {
  const timing = ours[k];
  const result = c.run();
  const kept = result instanceof Uint32Array ? `${fmt((100 * result.length) / N, 2)} %` : "";
  const msps = N / timing.bestMs / 1000;
  let refCell = "";
  const r = refs.get(c);
  if (r) {
    const speedup = r.ref / r.mine;
    refCell = `${c.ref?.name} ${fmt(r.ref)} ms (${fmt(r.refMedian)}), ${fmt(r.refHeap)} MB; ours ${fmt(r.mine, 2)} ms in those rounds → ${fmt(speedup)}×${r.same}`;
    const withInput = `${fmt((r.ref + r.build) / r.mine)}× if building its input from the typed arrays (${fmt(r.build)} ms) is counted`;
    if (c.target?.speedup) {
      verdicts.push(verdict(`${c.name} ≥ ${c.target.speedup}× ${c.ref?.name}`, speedup >= c.target.speedup, `${fmt(speedup)}× (${withInput})`));
    }
  }
  if (c.target?.msps) verdicts.push(verdict(`${c.name} ≥ ${c.target.msps} Msamples/s`, msps >= c.target.msps, fmt(msps)));
  const heap = heapGrowthMb(c.run);
  return [c.name, c.params, kept, `${fmt(timing.bestMs, 2)} (${fmt(timing.medianMs, 2)})`, fmt(msps), fmt(timing.bestMs / scanMs), refCell, fmt(heap)];
});

printTable(["method", "parameters", "kept", "ms best (median)", "Msamples/s", "× scan", "reference, same run: best (median)", "heap MB"], rows);
console.log(`\n${N.toLocaleString("en")} samples: noisy random walk + 6 h oscillation + rare spikes, ~1 s irregular sampling.`);
console.log(`Node ${process.version}. Time of a run = min(wall, process CPU). ${ROUNDS} round-robin rounds after ${WARMUPS} warm-ups;`);
console.log("references: 7 rounds alternating with our method after 2 warm-ups (each run follows the other's, garbage and cache state included).");
console.log("Speeds and ratios use the best run.");
console.log("heap MB = V8 heap + ArrayBuffers grown by one run, measured right after it (after a full GC before it).");
console.log(`Process peak RSS: ${fmt(peakRssMb(), 0)} MB (includes the reference libraries' point objects).\n`);
for (const line of verdicts) console.log(line);

// Streaming processors against their batch forms, and the Gorilla byte model.
const STREAM_ROUNDS = 5;
const STREAM_WARMUPS = 2;
console.log(`\nStreaming: ${CHUNK.toLocaleString("en")}-sample chunks pushed, then finish; batch form in the same rounds (pairs, round-robin).\n`);
printTable(
  ["processor", "parameters", "stream ms best (median)", "stream Msamples/s", "batch ms best (median)", "stream / batch"],
  streamingRows(s, STREAM_ROUNDS, STREAM_WARMUPS),
);
console.log("\nencodedBits (Gorilla, Pelkonen et al. 2015): delta-of-delta timestamps and XOR values in 2-hour blocks.\n");
printTable(["series", "samples", "ms best (median)", "Msamples/s", "bits per sample"], encodedBitsRows(s, ROUNDS, WARMUPS));

function verdict(what: string, ok: boolean, value: string): string {
  return `${ok ? "met    " : "NOT met"}  ${what}: ${value}`;
}

function samePoints(mine: Uint32Array, ref: unknown): boolean {
  const kept = ref as { x: number }[];
  return kept.length === mine.length && kept.every((p, k) => p.x === t[mine[k]]);
}

function printTable(head: string[], body: string[][]): void {
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((r) => r[i].length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(widths[i])).join(" | ")} |`;
  console.log(line(head));
  console.log(`| ${widths.map((w) => "-".repeat(w)).join(" | ")} |`);
  for (const r of body) console.log(line(r));
}
