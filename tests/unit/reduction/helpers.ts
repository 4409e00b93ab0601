/** Test helpers: a seeded PRNG and series builders (deterministic for a given seed). */
import type { Series } from "@/lib/reduction";

/** Mulberry32, the seeded PRNG of the demo signals (one copy in the code base). */
export { mulberry32 } from "@/lib/preview/demo-signals";
import { mulberry32 } from "@/lib/preview/demo-signals";

export function series(t: number[], v: number[]): Series {
  return { t: Float64Array.from(t), v: Float64Array.from(v) };
}

/** t = 0, 1, 2, … (seconds as ms would do as well; the methods do not care). */
export function unitSeries(v: number[]): Series {
  return series(
    v.map((_, i) => i),
    v,
  );
}

export type WalkOptions = {
  /** First timestamp (epoch ms); default 2026-01-01T00:00Z. */
  start?: number;
  /** Mean sampling step in ms; jittered ±50 %, rounded to whole ms. */
  stepMs?: number;
  /** Random-walk step scale. */
  walk?: number;
  /** Additive noise scale. */
  noise?: number;
  /** Probability of a spike per sample. */
  spikes?: number;
  /** Round values to this many decimals (creates ties); undefined = no rounding. */
  decimals?: number;
};

/** A noisy random walk with irregular sampling and rare spikes, like a process value. */
export function randomWalk(n: number, seed: number, o: WalkOptions = {}): Series {
  const rand = mulberry32(seed);
  const step = o.stepMs ?? 1000;
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  let now = o.start ?? Date.UTC(2026, 0, 1);
  let level = 0;
  for (let i = 0; i < n; i++) {
    now += Math.max(1, Math.round(step * (0.5 + rand())));
    level += (o.walk ?? 0.1) * (rand() - 0.5);
    let x = level + (o.noise ?? 0.3) * (rand() - 0.5);
    if (rand() < (o.spikes ?? 0.01)) x += (rand() < 0.5 ? -1 : 1) * 5 * rand();
    if (o.decimals !== undefined) x = Math.round(x * 10 ** o.decimals) / 10 ** o.decimals;
    t[i] = now;
    v[i] = x;
  }
  return { t, v };
}

/** Plain arrays of a series, for reference implementations written with ordinary JS. */
export function points(s: Series): { t: number[]; v: number[] } {
  return { t: Array.from(s.t), v: Array.from(s.v) };
}

export function ints(a: Uint32Array): number[] {
  return Array.from(a);
}
