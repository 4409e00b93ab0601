// Quality (DESIGN.md "Signals"; OPC UA Part 4 StatusCode severities good / uncertain /
// bad): selection methods keep the samples on both sides of a quality change; the
// quality filter keeps good (and optionally uncertain) samples; aggregates use good
// samples (uncertain by choice) and report the good share and a window quality — OPC UA
// Part 13's PercentDataGood / PercentDataBad rule at 100 % (from memory), by sample count.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  aggregate,
  changeOfState,
  deadband,
  exceedances,
  ltob,
  lttb,
  m4,
  measure,
  passThrough,
  qualityFilter,
  rdp,
  type Series,
  SeriesError,
  swingingDoor,
  timeAbove,
  validateSeries,
} from "@/lib/reduction";
import { ints } from "./helpers";
import { arbitrarySignal, plain, qseries } from "./signal-helpers";

const SELECTIONS: [string, (s: Series) => Uint32Array][] = [
  ["swinging door", (s) => swingingDoor(s, { deviation: 5 })],
  ["deadband", (s) => deadband(s, { deadband: 5, maxIntervalMs: 60_000 })],
  ["lttb", (s) => lttb(s, { points: 4 })],
  ["ltob", (s) => ltob(s, { points: 4 })],
  ["rdp", (s) => rdp(s, { epsilon: 5 })],
  ["rdp perpendicular", (s) => rdp(s, { epsilon: 5, distance: "perpendicular" })],
  ["m4", (s) => m4(s, { windowMs: 3_600_000 })],
  ["change of state", (s) => changeOfState(s)],
  ["pass-through", (s) => passThrough(s)],
];

describe("selection methods keep the samples on both sides of every quality change (fast-check)", () => {
  for (const [name, select] of SELECTIONS) {
    it(name, () => {
      fc.assert(
        fc.property(arbitrarySignal({ quality: true, values: "doubles" }), (s) => {
          const kept = new Set(select(s));
          const q = s.q as Uint8Array;
          for (let i = 1; i < q.length; i++) {
            if (q[i] !== q[i - 1]) {
              expect(kept.has(i - 1)).toBe(true);
              expect(kept.has(i)).toBe(true);
            }
          }
        }),
        { seed: 20261220, numRuns: 60 },
      );
    });
  }

  it("the parameters are wide enough that without quality only the ends are kept (the check is not vacuous)", () => {
    const s = qseries([0, 1, 2, 3, 4, 5], [0, 1, 0, 1, 0, 1], [0, 0, 1, 1, 0, 0]);
    expect(ints(swingingDoor({ t: s.t, v: s.v }, { deviation: 5 }))).toEqual([0, 5]);
    expect(ints(swingingDoor(s, { deviation: 5 }))).toEqual([0, 1, 2, 3, 4, 5]);
    expect(ints(rdp(s, { epsilon: 5 }))).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it("a bad stretch is not read: only its ends are kept, and its values may be NaN", () => {
    const s = qseries([0, 1, 2, 3, 4, 5, 6], [1, 1, Number.NaN, 7, Number.NaN, 1, 1], [0, 0, 2, 2, 2, 0, 0]);
    for (const [, select] of SELECTIONS.slice(0, 8)) expect(ints(select(s))).toEqual([0, 1, 2, 4, 5, 6]);
  });
});

describe("validation with quality", () => {
  it("a bad sample may carry a non-finite value; a good or uncertain one may not", () => {
    expect(() => validateSeries(qseries([0, 1], [Number.NaN, 1], [2, 0]))).not.toThrow();
    expect(() => validateSeries(qseries([0, 1], [Number.NaN, 1], [1, 0]))).toThrow(SeriesError);
    expect(() => validateSeries(qseries([0, 0], [1, 1], [0, 0]))).toThrow(/duplicates/);
  });
});

describe("qualityFilter", () => {
  const s = qseries([0, 1, 2, 3, 4], [5, 6, 7, 8, 9], [0, 1, 2, 0, 1]);
  it("keeps good samples, or good and uncertain ones", () => {
    expect(ints(qualityFilter(s, { keep: "good" }))).toEqual([0, 3]);
    expect(ints(qualityFilter(s, { keep: "good-and-uncertain" }))).toEqual([0, 1, 3, 4]);
    expect(ints(qualityFilter({ t: s.t, v: s.v }, { keep: "good" }))).toEqual([0, 1, 2, 3, 4]);
    expect(() => qualityFilter(s, { keep: "all" as "good" })).toThrow(/keep/);
  });
});

describe("aggregates use usable samples and report good share and window quality (OPC UA Part 13), hand-worked", () => {
  // Windows of 5 ms. [0, 5): 20 21 (23 uncertain) 22 20 → good 20 21 22 20.
  // [5, 10): 25 27 (99 bad) 26 24. [10, 15): 30 31. [15, 20): only bad samples.
  const s = qseries(
    [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 15, 16],
    [20, 21, 23, 22, 20, 25, 27, 99, 26, 24, 30, 31, Number.NaN, 0],
    [0, 0, 1, 0, 0, 0, 0, 2, 0, 0, 0, 0, 2, 2],
  );

  it("mean of the good samples; good share 4/5, 4/5, 1, 0; quality uncertain, uncertain, good, bad", () => {
    expect(plain(aggregate(s, { windowMs: 5, fn: "mean" }))).toEqual({
      t: [0, 5, 10, 15],
      v: [83 / 4, 102 / 4, 30.5, Number.NaN],
      q: [1, 1, 0, 2],
      goodShare: [0.8, 0.8, 1, 0],
    });
  });

  it("with includeUncertain the uncertain 23 counts: max 23; the bad 99 never does", () => {
    expect(Array.from(aggregate(s, { windowMs: 5, fn: "max" }).v)).toEqual([22, 27, 31, Number.NaN]);
    expect(Array.from(aggregate(s, { windowMs: 5, fn: "max", includeUncertain: true }).v)).toEqual([23, 27, 31, Number.NaN]);
    // The share stays the share of good samples; the quality stays uncertain (not all good).
    expect(Array.from(aggregate(s, { windowMs: 5, fn: "max", includeUncertain: true }).goodShare)).toEqual([0.8, 0.8, 1, 0]);
  });

  it("count counts usable samples, 0 (with quality bad) for a window without any", () => {
    expect(Array.from(aggregate(s, { windowMs: 5, fn: "count" }).v)).toEqual([4, 4, 2, 0]);
  });

  it("time-weighted mean: an interval opened by an unusable sample is not covered", () => {
    // Step, window [5, 10): 25 held 5→6, 27 held 6→7, 99 (bad) 7→8 uncovered, 26 8→9, 24 9→10
    // (the next sample, 30 at 10, is usable and close) → (25 + 27 + 26 + 24) / 4 = 25.5.
    const out = aggregate(s, { windowMs: 5, fn: "timeWeightedMean", interpolation: "step" });
    expect(out.v[1]).toBeCloseTo(25.5, 12);
    // Linear: 25→27 over [5, 6] = 26, 27 held over [6, 7] (the next sample is bad) = 27, 26→24 = 25,
    // 24→30 over [9, 10] = 27 → 105 / 4.
    expect(aggregate(s, { windowMs: 5, fn: "timeWeightedMean", interpolation: "linear" }).v[1]).toBeCloseTo(105 / 4, 12);
  });

  it("exceedances and time above skip bad samples", () => {
    // Threshold 26 above: 27 crosses (t=6); 99 is bad and neither crosses nor re-arms; 26 re-arms; 30 crosses.
    expect(Array.from(exceedances(s, { windowMs: 5, threshold: 26 }).v)).toEqual([0, 1, 1, Number.NaN]);
    // Time above 26: 27 holds 6→7 (1 ms); the bad 99 covers nothing.
    expect(timeAbove(s, { windowMs: 5, threshold: 26 }).v[1]).toBe(1);
  });

  it("measure ignores bad samples of the original and the reduced series", () => {
    const kept = swingingDoor(s, { deviation: 0.1 });
    const m = measure(s, kept, { reconstruction: "linear" });
    expect(m.maxAbsError).toBe(0);
    expect(m.samplesOut).toBe(kept.length);
  });
});
