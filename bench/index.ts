/**
 * `npm run bench`: speed of lib/reduction on a 1M-sample series, against a plain scan
 * loop and the reference libraries measured in the same run. Targets (issue): LTTB ≥ 50×
 * `downsample`, RDP perpendicular ≥ 2× `simplify-js` (highQuality), swinging door,
 * deadband and windowed mean ≥ 100 Msamples/s.
 */
import { LTTB as downsampleLttb } from "downsample";
import simplify from "simplify-js";
import {
  aggregate,
  deadband,
  exceedances,
  ltob,
  lttb,
  m4,
  measure,
  rdp,
  type Series,
  swingingDoor,
  timeAbove,
} from "@/lib/reduction";
import { benchSeries } from "./series";
import { peakRssMb, time } from "./timing";

const N = 1_000_000;
const s = benchSeries(N);
const { t, v } = s;

type Case = {
  name: string;
  params: string;
  run: () => unknown;
  /** Reference library for the same job, measured in the same run. */
  ref?: { name: string; run: () => unknown };
  /** Target: minimum Msamples/s or minimum speed-up over the reference. */
  target?: { msps?: number; speedup?: number };
};

// Plain scan: one pass reading both arrays (what validation alone costs).
function scan(): number {
  let sum = 0;
  let prev = -Infinity;
  let bad = 0;
  for (let i = 0; i < N; i++) {
    const ti = t[i];
    if (!(ti > prev)) bad++;
    prev = ti;
    sum += v[i];
  }
  return sum + bad;
}

const tuples: [number, number][] = Array.from(t, (x, i) => [x, v[i]]);
const points = Array.from(t, (x, i) => ({ x, y: v[i] }));
const LTTB_POINTS = 75_000;
const RDP_EPSILON = 0.65;

const cases: Case[] = [
  { name: "swinging door", params: "deviation 0.6", run: () => swingingDoor(s, { deviation: 0.6 }), target: { msps: 100 } },
  { name: "deadband", params: "deadband 0.55", run: () => deadband(s, { deadband: 0.55 }), target: { msps: 100 } },
  {
    name: "LTTB",
    params: `points ${LTTB_POINTS}`,
    run: () => lttb(s, { points: LTTB_POINTS }),
    ref: { name: "downsample LTTB", run: () => downsampleLttb(tuples, LTTB_POINTS) },
    target: { speedup: 50 },
  },
  { name: "LTOB", params: `points ${LTTB_POINTS}`, run: () => ltob(s, { points: LTTB_POINTS }) },
  {
    name: "RDP perpendicular",
    params: `epsilon ${RDP_EPSILON}`,
    run: () => rdp(s, { epsilon: RDP_EPSILON, distance: "perpendicular" }),
    ref: { name: "simplify-js HQ", run: () => simplify(points, RDP_EPSILON, true) },
    target: { speedup: 2 },
  },
  { name: "RDP vertical", params: `epsilon ${RDP_EPSILON}`, run: () => rdp(s, { epsilon: RDP_EPSILON }) },
  { name: "M4", params: "window 60 s", run: () => m4(s, { windowMs: 60_000 }) },
  { name: "mean", params: "window 60 s", run: () => aggregate(s, { windowMs: 60_000, fn: "mean" }), target: { msps: 100 } },
  {
    name: "time-weighted mean",
    params: "window 60 s, linear",
    run: () => aggregate(s, { windowMs: 60_000, fn: "timeWeightedMean" }),
  },
  { name: "stdev (sample)", params: "window 60 s", run: () => aggregate(s, { windowMs: 60_000, fn: "stdevSample" }) },
  { name: "percentile 95", params: "window 60 s", run: () => aggregate(s, { windowMs: 60_000, fn: "percentile", percentile: 95 }) },
  { name: "exceedances", params: "window 60 s, > 55, hyst. 0.5", run: () => exceedances(s, { windowMs: 60_000, threshold: 55, hysteresis: 0.5 }) },
  { name: "time above", params: "window 60 s, > 55", run: () => timeAbove(s, { windowMs: 60_000, threshold: 55 }) },
];

const scanTiming = time(scan, 25);
const scanMs = scanTiming.bestMs;
const fmt = (x: number, d = 1) => x.toFixed(d);
const rows: string[][] = [];
const verdicts: string[] = [];
rows.push(["plain scan loop", "read t and v once", "", ms(scanTiming), fmt(N / scanMs / 1000), "1.0", "", fmt(scanTiming.heapMb)]);

for (const c of cases) {
  const mine = time(c.run);
  const msps = N / mine.bestMs / 1000;
  const kept = mine.result instanceof Uint32Array ? `${fmt((100 * mine.result.length) / N, 2)} %` : "";
  let refCell = "";
  let speedup = NaN;
  if (c.ref) {
    const ref = time(c.ref.run, 7, 2);
    speedup = ref.bestMs / mine.bestMs;
    refCell = `${c.ref.name} ${fmt(ref.bestMs)} ms, ${fmt(ref.heapMb)} MB → ${fmt(speedup)}×`;
    if (c.name.startsWith("RDP")) refCell += sameAsSimplify(mine.result as Uint32Array, ref.result) ? ", same points" : ", DIFFERENT points";
  }
  rows.push([c.name, c.params, kept, ms(mine), fmt(msps), fmt(mine.bestMs / scanMs), refCell, fmt(mine.heapMb)]);
  if (c.target?.msps) verdicts.push(verdict(`${c.name} ≥ ${c.target.msps} Msamples/s`, msps >= c.target.msps, `${fmt(msps)}`));
  if (c.target?.speedup) {
    verdicts.push(verdict(`${c.name} ≥ ${c.target.speedup}× ${c.ref?.name}`, speedup >= c.target.speedup, `${fmt(speedup)}×`));
  }
}

const reduced = rdp(s, { epsilon: RDP_EPSILON });
const m = time(() => measure(s, reduced, { reconstruction: "linear" }));
rows.push(["measure", "linear, RDP vertical output", "", ms(m), fmt(N / m.bestMs / 1000), fmt(m.bestMs / scanMs), "", fmt(m.heapMb)]);

const header = ["method", "parameters", "kept", "ms best (median)", "Msamples/s", "× scan", "reference, same run", "heap MB"];
printTable(header, rows);
console.log(`\n${N.toLocaleString("en")} samples, noisy random walk + 6 h oscillation + rare spikes, ~1 s irregular sampling.`);
console.log(`Node ${process.version}; best and median of 15 runs after 5 warm-ups (references: 7 after 2); speeds and ratios use the best.`);
console.log("heap MB = V8 heap + ArrayBuffers grown by one run, measured after it (before any further GC).");
console.log(`Process peak RSS: ${fmt(peakRssMb(), 0)} MB (includes the reference libraries' point objects).\n`);
for (const line of verdicts) console.log(line);

function ms(x: { bestMs: number; medianMs: number }): string {
  return `${fmt(x.bestMs, 2)} (${fmt(x.medianMs, 2)})`;
}

function verdict(what: string, ok: boolean, value: string): string {
  return `${ok ? "met    " : "NOT met"}  ${what}: ${value}`;
}

function sameAsSimplify(mine: Uint32Array, ref: unknown): boolean {
  const kept = ref as { x: number }[];
  if (kept.length !== mine.length) return false;
  return kept.every((p, k) => p.x === t[mine[k]]);
}

function printTable(head: string[], body: string[][]): void {
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((r) => r[i].length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(widths[i])).join(" | ")} |`;
  console.log(line(head));
  console.log(`| ${widths.map((w) => "-".repeat(w)).join(" | ")} |`);
  for (const r of body) console.log(line(r));
}

export type { Series };
