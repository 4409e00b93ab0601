// Deadband — OPC UA Part 4 (Services), DataChangeFilter, DeadbandType Absolute:
// report when |v − last reported| > deadband (strictly); Part 8 (Data Access),
// PercentDeadband: deadband = percent/100 × (EURange.high − EURange.low).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { deadband, measure, percentOfRange } from "@/lib/reduction";
import { ints, points, randomWalk, series, unitSeries } from "./helpers";

/** Reference from the Part 4 rule, plus Sluice's max interval (common practice). */
function referenceDeadband(t: number[], v: number[], band: number, maxInterval = Infinity): number[] {
  const n = t.length;
  if (n <= 2) return t.map((_, i) => i);
  const kept = [0];
  let last = 0;
  for (let i = 1; i < n; i++) {
    if (t[i] - t[last] > maxInterval && i - 1 > last) kept.push((last = i - 1));
    if (Math.abs(v[i] - v[last]) > band) kept.push((last = i));
  }
  if (last !== n - 1) kept.push(n - 1);
  return kept;
}

describe("deadband — OPC UA Part 4 absolute deadband", () => {
  it("deadband 1 over 0, 0.5, 1.0, 1.01, 2.0, 2.5 keeps 0, 1.01, 2.5 (strictly greater)", () => {
    // |1.0 − 0| = 1 is not > 1; |1.01 − 0| > 1 → report; |2.0 − 1.01| = 0.99; 2.5 is last (and > 1).
    const s = unitSeries([0, 0.5, 1.0, 1.01, 2.0, 2.5]);
    const kept = deadband(s, { deadband: 1 });
    expect(ints(kept)).toEqual([0, 3, 5]);
    expect(Array.from(kept, (i) => s.v[i])).toEqual([0, 1.01, 2.5]);
  });

  it("compares with the last reported value, not the previous sample (slow drift is caught)", () => {
    // Each step is 0.4, below the band, but the drift from the last report passes 1.
    expect(ints(deadband(unitSeries([0, 0.4, 0.8, 1.2, 1.6, 2.0, 2.4, 2.4]), { deadband: 1 }))).toEqual([0, 3, 6, 7]);
  });

  it("deadband 0 keeps every change and drops repeats", () => {
    expect(ints(deadband(unitSeries([1, 1, 2, 2, 2, 3, 3]), { deadband: 0 }))).toEqual([0, 2, 5, 6]);
  });

  it("max interval: keeps the sample before one that would stretch the silence past it", () => {
    // Flat signal, t = 0 … 6, max 2 ms: keep 2 (t3 − t0 = 3 > 2), 4, then the last.
    expect(ints(deadband(unitSeries([5, 5, 5, 5, 5, 5, 5]), { deadband: 1, maxIntervalMs: 2 }))).toEqual([0, 2, 4, 6]);
  });

  it("step-hold reconstruction error stays within the band", () => {
    const s = randomWalk(5_000, 11);
    const kept = deadband(s, { deadband: 0.5 });
    const m = measure(s, kept, { reconstruction: "step" });
    expect(m.maxAbsError).toBeLessThanOrEqual(0.5);
    expect(m.samplesOut).toBeLessThan(m.samplesIn);
  });

  it("equals the reference on random series, with and without max interval", () => {
    for (const [seed, band, maxIntervalMs, decimals] of [
      [1, 0.3, undefined, undefined],
      [2, 0.1, 5_000, undefined],
      [3, 0.5, undefined, 1],
      [4, 1, 20_000, 0],
    ] as const) {
      const s = randomWalk(20_000, seed, { decimals });
      const { t, v } = points(s);
      const kept = deadband(s, { deadband: band, maxIntervalMs });
      expect(ints(kept)).toEqual(referenceDeadband(t, v, band, maxIntervalMs));
      expect(kept.length).toBeLessThan(s.t.length);
    }
  });

  it("property (fast-check): every dropped sample is within the band of the last kept value; max interval holds", () => {
    const arb = fc.array(fc.tuple(fc.integer({ min: 1, max: 3_000 }), fc.double({ min: -100, max: 100, noNaN: true })), {
      minLength: 1,
      maxLength: 200,
    });
    fc.assert(
      fc.property(arb, fc.double({ min: 0, max: 20, noNaN: true }), fc.integer({ min: 1, max: 10_000 }), (rows, band, maxIntervalMs) => {
        let now = 0;
        const s = series(
          rows.map(([dt]) => (now += dt)),
          rows.map(([, x]) => x),
        );
        const kept = deadband(s, { deadband: band, maxIntervalMs });
        expect(measure(s, kept, { reconstruction: "step" }).maxAbsError).toBeLessThanOrEqual(band);
        for (let k = 1; k < kept.length; k++) {
          if (kept[k] !== kept[k - 1] + 1) expect(s.t[kept[k]] - s.t[kept[k - 1]]).toBeLessThanOrEqual(maxIntervalMs);
        }
        const { t, v } = points(s);
        expect(ints(kept)).toEqual(referenceDeadband(t, v, band, maxIntervalMs));
      }),
      { seed: 20261204, numRuns: 300 },
    );
  });

  it("handles empty and one-sample series; rejects a negative deadband", () => {
    expect(ints(deadband(unitSeries([]), { deadband: 1 }))).toEqual([]);
    expect(ints(deadband(unitSeries([3]), { deadband: 1 }))).toEqual([0]);
    expect(() => deadband(unitSeries([1, 2]), { deadband: -0.1 })).toThrow(/deadband/);
  });
});

describe("percentOfRange — OPC UA Part 8 PercentDeadband", () => {
  it("is percent/100 × (high − low)", () => {
    expect(percentOfRange(2, 0, 150)).toBe(3); // 2 % of 0–150 °C
    expect(percentOfRange(0.5, -50, 50)).toBe(0.5);
    expect(percentOfRange(0, 0, 10)).toBe(0);
    expect(percentOfRange(100, 4, 20)).toBe(16);
  });

  it("rejects percent outside 0–100 and low ≥ high", () => {
    expect(() => percentOfRange(-1, 0, 10)).toThrow(/percent/);
    expect(() => percentOfRange(100.5, 0, 10)).toThrow(/percent/);
    expect(() => percentOfRange(5, 10, 10)).toThrow(/low/);
    expect(() => percentOfRange(5, 20, 10)).toThrow(/low/);
    expect(() => percentOfRange(Number.NaN, 0, 10)).toThrow(/percent/);
  });
});
