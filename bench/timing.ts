/**
 * Timing and memory helpers for the benchmark. A run's time is the smaller of its
 * wall-clock time and the process CPU time it used: on a shared machine the CPU time
 * leaves out the time the process waited for a core, and the wall time leaves out work
 * of V8's helper threads (concurrent GC). Cases are timed round-robin — every round runs
 * every case once — so that a burst of load from other processes hits all cases alike
 * rather than one case's whole series of runs; the fastest run (the least disturbed) is
 * reported with the median beside it.
 */
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";

setFlagsFromString("--expose-gc");
const gc = runInNewContext("gc") as () => void;

export type Timing = { bestMs: number; medianMs: number };

function used(): number {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}

/** One timed run: min(wall, CPU) in ms. */
export function timeOnce(run: () => unknown): number {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  run();
  const wall = performance.now() - t0;
  const cpu = process.cpuUsage(c0);
  return Math.min(wall, (cpu.user + cpu.system) / 1000);
}

/** Growth of V8 heap plus ArrayBuffer memory right after one run, after a full GC before it (MB). */
export function heapGrowthMb(run: () => unknown): number {
  gc();
  const base = used();
  const result = run();
  const grown = used() - base;
  void result;
  return Math.max(0, grown) / 2 ** 20;
}

/** Runs every case `warmups` times, then `rounds` rounds of one run each; best and median per case. */
export function roundRobin(runs: (() => unknown)[], rounds: number, warmups: number): Timing[] {
  for (const run of runs) for (let i = 0; i < warmups; i++) run();
  const times = runs.map(() => [] as number[]);
  for (let r = 0; r < rounds; r++) runs.forEach((run, k) => times[k].push(timeOnce(run)));
  return times.map((ts) => {
    ts.sort((a, b) => a - b);
    return { bestMs: ts[0], medianMs: ts[ts.length >> 1] };
  });
}

export function peakRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}
