/**
 * The benchmark's input: a noisy random walk riding a slow oscillation, with rare
 * spikes and irregular sampling (about 1 s, jittered ±50 %), like a process value from a
 * loop that is not perfectly periodic. Deterministic: the same seed gives the same data.
 */
import type { Series } from "@/lib/reduction";

/** Mulberry32, the seeded PRNG of the demo signals (one copy in the code base). */
export { mulberry32 } from "@/lib/preview/demo-signals";
import { mulberry32 } from "@/lib/preview/demo-signals";

export function benchSeries(n: number, seed = 20260101): Series {
  const rand = mulberry32(seed);
  const gauss = () => {
    // Box–Muller; 1 − rand() keeps the logarithm finite.
    const r = Math.sqrt(-2 * Math.log(1 - rand()));
    return r * Math.cos(2 * Math.PI * rand());
  };
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  let now = Date.UTC(2026, 0, 1);
  let walk = 0;
  const period = 6 * 3600_000;
  for (let i = 0; i < n; i++) {
    now += Math.round(500 + rand() * 1000);
    walk += 0.05 * gauss();
    let x = 50 + 10 * Math.sin((2 * Math.PI * now) / period) + walk + 0.2 * gauss();
    if (rand() < 1e-4) x += (rand() < 0.5 ? -1 : 1) * (5 + 10 * rand());
    t[i] = now;
    v[i] = x;
  }
  return { t, v };
}
