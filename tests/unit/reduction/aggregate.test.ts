// Windowed aggregates — OPC UA Part 13 (Aggregates) definitions; percentiles by
// Hyndman & Fan type 7 (The American Statistician 50(4), 1996); reference values from
// simple-statistics ≥ 7.8.9 (its quantile is type 7 since that release).
import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import { AGGREGATE_FNS, type AggregateFn, aggregate, type Series } from "@/lib/reduction";
import { randomWalk, series } from "./helpers";

const W = 60_000;

/** The values of each output window, grouped independently by ⌊t / w⌋ (offset 0). */
function windowValues(s: Series, starts: Float64Array, windowMs: number): number[][] {
  const groups = new Map<number, number[]>();
  s.t.forEach((x, i) => {
    const start = Math.floor(x / windowMs) * windowMs;
    groups.set(start, [...(groups.get(start) ?? []), s.v[i]]);
  });
  expect([...groups.keys()]).toEqual(Array.from(starts));
  return Array.from(starts, (start) => groups.get(start) ?? []);
}

/** Relative closeness for results of different (but correct) summation orders. */
function expectClose(actual: number, expected: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(expected)));
}

describe("aggregate — equals simple-statistics on random windows", () => {
  const s = randomWalk(30_000, 21, { decimals: 2 }); // rounded: ties for mode and median
  const check = (fn: AggregateFn, reference: (x: number[]) => number, exact: boolean, extra = {}) => {
    const out = aggregate(s, { windowMs: W, fn, ...extra });
    const groups = windowValues(s, out.t, W);
    expect(out.t.length).toBeGreaterThan(100);
    groups.forEach((x, k) => {
      expect(x.length).toBeGreaterThan(0); // windows without samples are absent
      if (exact) expect(out.v[k]).toBe(reference(x));
      else expectClose(out.v[k], reference(x));
    });
  };

  it("mean (ss.mean)", () => check("mean", ss.mean, false));
  it("sum (ss.sum)", () => check("sum", ss.sum, false));
  it("min, max, range (ss.min, ss.max)", () => {
    check("min", ss.min, true);
    check("max", ss.max, true);
    check("range", (x) => ss.max(x) - ss.min(x), true);
  });
  it("count, first, last", () => {
    check("count", (x) => x.length, true);
    check("first", (x) => x[0], true);
    check("last", (x) => x[x.length - 1], true);
  });
  it("median (ss.median) and mode (ss.mode: the smallest of the most frequent)", () => {
    check("median", ss.median, true);
    check("mode", ss.mode, true);
  });
  it("population and sample standard deviation (ss.standardDeviation, ss.sampleStandardDeviation)", () => {
    check("stdevPopulation", ss.standardDeviation, false);
    check("stdevSample", (x) => (x.length < 2 ? Number.NaN : ss.sampleStandardDeviation(x)), false);
  });
  for (const percentile of [0, 1, 10, 25, 50, 90, 95, 99.9, 100]) {
    it(`percentile ${percentile} (ss.quantile, Hyndman & Fan type 7)`, () => {
      check("percentile", (x) => ss.quantile(x, percentile / 100), true, { percentile });
    });
  }
});

describe("aggregate — Hyndman & Fan type 7 and OPC UA Part 13 by hand", () => {
  const s = series([0, 1, 2, 3], [10, 40, 20, 30]);

  it("type 7: h = (n − 1)p; 10 20 30 40 at p = 0.25 → 17.5, p = 0.9 → 37", () => {
    // h = 0.75 → 10 + 0.75·10; h = 2.7 → 30 + 0.7·10.
    expect(aggregate(s, { windowMs: 10, fn: "percentile", percentile: 25 }).v[0]).toBe(17.5);
    expect(aggregate(s, { windowMs: 10, fn: "percentile", percentile: 90 }).v[0]).toBeCloseTo(37, 12);
    expect(aggregate(s, { windowMs: 10, fn: "median" }).v[0]).toBe(25);
  });

  it("standard deviations of 10 40 20 30: population √125, sample √(500/3)", () => {
    expect(aggregate(s, { windowMs: 10, fn: "stdevPopulation" }).v[0]).toBeCloseTo(Math.sqrt(125), 12);
    expect(aggregate(s, { windowMs: 10, fn: "stdevSample" }).v[0]).toBeCloseTo(Math.sqrt(500 / 3), 12);
    expect(aggregate(series([5], [1]), { windowMs: 10, fn: "stdevSample" }).v[0]).toBeNaN();
  });
});

describe("aggregate — time-weighted mean (OPC UA Part 13 TimeAverage), hand-worked", () => {
  // Window [0, 10): samples (0, 1), (4, 3), (8, 2); window [10, 20): (12, 0), (15, 4), the last.
  const s = series([0, 4, 8, 12, 15], [1, 3, 2, 0, 4]);

  it("step: each value weighted by how long it holds; held across the window edges", () => {
    const out = aggregate(s, { windowMs: 10, fn: "timeWeightedMean", interpolation: "step" });
    expect(Array.from(out.t)).toEqual([0, 10]);
    // [0, 10): 1·4 + 3·4 + 2·2 = 20 → 2. [10, 20): 2 held 10→12, 0·3, then 4 held to the end: 4 + 0 + 20 = 24 → 2.4.
    expect(out.v[0]).toBeCloseTo(2, 12);
    expect(out.v[1]).toBeCloseTo(2.4, 12);
  });

  it("linear: trapezoids, with the edge values interpolated from the neighbouring samples", () => {
    const out = aggregate(s, { windowMs: 10, fn: "timeWeightedMean", interpolation: "linear" });
    // [0, 10): (1+3)/2·4 + (3+2)/2·4 + value at 10 between (8, 2) and (12, 0) = 1 → (2+1)/2·2 → 8 + 10 + 3 = 21 → 2.1.
    // [10, 20): value at 10 = 1 → (1+0)/2·2 = 1; (0+4)/2·3 = 6; after the last sample 4 is held: 4·5 = 20 → 27 → 2.7.
    expect(out.v[0]).toBeCloseTo(2.1, 12);
    expect(out.v[1]).toBeCloseTo(2.7, 12);
  });

  it("with no earlier sample the window counts from its first sample", () => {
    const late = series([5, 7, 12], [2, 4, 0]);
    // step: (2·2 + 4·3)/5 = 3.2; linear: value at 10 = 4 − 4·3/5 = 1.6 → ((2+4)/2·2 + (4+1.6)/2·3)/5 = 2.88.
    expect(aggregate(late, { windowMs: 10, fn: "timeWeightedMean", interpolation: "step" }).v[0]).toBeCloseTo(3.2, 12);
    expect(aggregate(late, { windowMs: 10, fn: "timeWeightedMean", interpolation: "linear" }).v[0]).toBeCloseTo(2.88, 12);
  });

  it("a constant signal averages to itself in both modes, whatever the sampling", () => {
    const flat = randomWalk(5_000, 3, { walk: 0, noise: 0, spikes: 0 });
    for (const interpolation of ["step", "linear"] as const) {
      const out = aggregate(flat, { windowMs: 45_000, offsetMs: 1_234, fn: "timeWeightedMean", interpolation });
      for (const x of out.v) expect(x).toBeCloseTo(flat.v[0], 9);
    }
  });
});

describe("aggregate — windows", () => {
  it("align to the epoch plus the offset, are stamped with their start, and are absent without samples", () => {
    const s = series([1_000, 59_999, 60_000, 200_000], [1, 2, 3, 4]);
    expect(Array.from(aggregate(s, { windowMs: 60_000, fn: "count" }).t)).toEqual([0, 60_000, 180_000]);
    const shifted = aggregate(s, { windowMs: 60_000, offsetMs: 30_000, fn: "count" });
    expect(Array.from(shifted.t)).toEqual([-30_000, 30_000, 150_000]);
    expect(Array.from(shifted.v)).toEqual([1, 2, 1]);
  });

  it("every function handles empty and one-sample series", () => {
    for (const fn of AGGREGATE_FNS) {
      const extra = fn === "percentile" ? { percentile: 50 } : {};
      expect(aggregate(series([], []), { windowMs: 10, fn, ...extra }).t.length).toBe(0);
      const one = aggregate(series([3], [7]), { windowMs: 10, fn, ...extra });
      expect(Array.from(one.t)).toEqual([0]);
      if (fn === "stdevSample") expect(one.v[0]).toBeNaN();
      else expect(one.v[0]).toBe(fn === "count" ? 1 : fn === "range" || fn === "stdevPopulation" ? 0 : 7);
    }
  });

  it("rejects unknown functions and bad parameters", () => {
    const s = series([0, 1], [1, 2]);
    expect(() => aggregate(s, { windowMs: 10, fn: "average" as AggregateFn })).toThrow(/fn/);
    expect(() => aggregate(s, { windowMs: 10, fn: "percentile" })).toThrow(/percentile/);
    expect(() => aggregate(s, { windowMs: 10, fn: "percentile", percentile: 101 })).toThrow(/percentile/);
    expect(() => aggregate(s, { windowMs: -5, fn: "mean" })).toThrow(/windowMs/);
    expect(() => aggregate(s, { windowMs: 10, fn: "timeWeightedMean", interpolation: "cubic" as "linear" })).toThrow(/interpolation/);
  });
});
