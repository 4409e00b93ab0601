// M4 — U. Jugel, Z. Jerzak, G. Hackenbroich, V. Markl, "M4: A Visualization-Oriented
// Time Series Data Aggregation", PVLDB 7(10), 2014: per window, the first, last,
// minimum and maximum samples.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { m4 } from "@/lib/reduction";
import { ints, randomWalk, series } from "./helpers";

/** Reference from the paper's definition; windows by ⌊(t − offset)/w⌋; ties: the first. */
function referenceM4(t: number[], v: number[], windowMs: number, offsetMs = 0): number[] {
  const byWindow = new Map<number, number[]>();
  t.forEach((x, i) => {
    const k = Math.floor((x - offsetMs) / windowMs);
    byWindow.set(k, [...(byWindow.get(k) ?? []), i]);
  });
  const kept = new Set<number>();
  for (const idx of byWindow.values()) {
    let lo = idx[0];
    let hi = idx[0];
    for (const i of idx) {
      if (v[i] < v[lo]) lo = i;
      if (v[i] > v[hi]) hi = i;
    }
    for (const i of [idx[0], lo, hi, idx[idx.length - 1]]) kept.add(i);
  }
  return [...kept].sort((a, b) => a - b);
}

describe("m4 — fixtures worked by hand", () => {
  const t = [0, 10, 20, 30, 40, 50, 60, 70, 80, 90];
  const v = [5, 1, 9, 3, 3, 7, 2, 2, 8, 4];

  it("windows of 50 ms: [0, 50) keeps 0 (first), 1 (min), 2 (max), 4 (last); [50, 100) keeps 5, 6, 8, 9", () => {
    // In the second window the minimum 2 occurs at 6 and 7: the first (6) is kept.
    expect(ints(m4(series(t, v), { windowMs: 50 }))).toEqual([0, 1, 2, 4, 5, 6, 8, 9]);
  });

  it("offset 25 ms: windows [−25, 25), [25, 75), [75, 125)", () => {
    // {0,1,2}: first 0, min 1, max 2, last 2; {3…7}: first 3, max 5, min 6, last 7; {8,9}.
    expect(ints(m4(series(t, v), { windowMs: 50, offsetMs: 25 }))).toEqual([0, 1, 2, 3, 5, 6, 7, 8, 9]);
  });

  it("windows without samples are absent; a one-sample window keeps its sample", () => {
    expect(ints(m4(series([0, 10, 200, 210, 400], [1, 2, 3, 4, 5]), { windowMs: 50 }))).toEqual([0, 1, 2, 3, 4]);
  });

  it("keeps at most four per window and the series' ends", () => {
    const s = randomWalk(100_000, 5);
    const kept = m4(s, { windowMs: 60_000 });
    expect(kept[0]).toBe(0);
    expect(kept[kept.length - 1]).toBe(s.t.length - 1);
    expect(kept.length).toBeLessThan(s.t.length / 10);
  });

  it("handles empty and one-sample series; rejects a non-positive window", () => {
    expect(ints(m4(series([], []), { windowMs: 10 }))).toEqual([]);
    expect(ints(m4(series([5], [1]), { windowMs: 10 }))).toEqual([0]);
    expect(() => m4(series([1, 2], [1, 2]), { windowMs: 0 })).toThrow(/windowMs/);
  });
});

describe("m4 — property: per window the first, last, min and max samples are kept, and nothing else", () => {
  it("equals the definition on random series (fast-check), any offset", () => {
    const arb = fc.array(fc.tuple(fc.integer({ min: 1, max: 2_000 }), fc.integer({ min: -20, max: 20 })), {
      minLength: 1,
      maxLength: 300,
    });
    fc.assert(
      fc.property(arb, fc.integer({ min: 1, max: 10_000 }), fc.integer({ min: -50_000, max: 50_000 }), (rows, windowMs, offsetMs) => {
        let now = 1_700_000_000_000;
        const t = rows.map(([dt]) => (now += dt));
        const v = rows.map(([, x]) => x / 4); // small integers/4: many ties
        expect(ints(m4(series(t, v), { windowMs, offsetMs }))).toEqual(referenceM4(t, v, windowMs, offsetMs));
      }),
      { seed: 20261205, numRuns: 300 },
    );
  });

  it("equals the definition on a long random walk", () => {
    const s = randomWalk(50_000, 6, { decimals: 1 });
    const t = Array.from(s.t);
    const v = Array.from(s.v);
    expect(ints(m4(s, { windowMs: 30_000, offsetMs: 7_000 }))).toEqual(referenceM4(t, v, 30_000, 7_000));
  });
});
