/**
 * Timing and memory helpers for the benchmark. Each case is warmed up, then timed
 * several times. A run's time is the smaller of its wall-clock time and the process CPU
 * time it used: on a shared machine the CPU time leaves out the time the process waited
 * for a core, and the wall time leaves out work of V8's helper threads (concurrent GC).
 * The fastest run is reported (the least disturbed) with the median beside it. Memory: after a full GC, the growth of V8 heap
 * plus ArrayBuffer memory right after one run (before any further GC) — the peak of what
 * the run allocated, as far as can be seen from outside without sampling inside it.
 */
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";

setFlagsFromString("--expose-gc");
const gc = runInNewContext("gc") as () => void;

export type Timing = { bestMs: number; medianMs: number; heapMb: number; result: unknown };

function used(): number {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}

export function time(run: () => unknown, repeats = 15, warmups = 5): Timing {
  let result: unknown;
  for (let i = 0; i < warmups; i++) result = run();
  result = undefined;
  gc();
  const base = used();
  result = run();
  const heapMb = Math.max(0, used() - base) / 2 ** 20;
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    result = undefined;
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    result = run();
    const wall = performance.now() - t0;
    const cpu = process.cpuUsage(c0);
    times.push(Math.min(wall, (cpu.user + cpu.system) / 1000));
  }
  times.sort((a, b) => a - b);
  return { bestMs: times[0], medianMs: times[repeats >> 1], heapMb, result };
}

export function peakRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}
