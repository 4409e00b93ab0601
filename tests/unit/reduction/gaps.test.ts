// Gaps (DESIGN.md "Signals"): a step longer than gapFactor (default 3) × the sample
// period. No method interpolates across a gap; selection methods keep the samples on
// both sides; measure ignores gaps. Common practice; hand-built series with two gaps.
import { describe, expect, it } from "vitest";
import {
  aggregate,
  changeOfState,
  deadband,
  gapThreshold,
  ltob,
  lttb,
  m4,
  measure,
  rdp,
  type Series,
  swingingDoor,
  timeAbove,
} from "@/lib/reduction";
import { ints, series } from "./helpers";

// Sample period 1 s, gap threshold 3 s. Gaps between t = 3 s and 10 s, and between 12 s and 20 s.
const S = 1000;
const gapMs = gapThreshold(S); // 3 × 1 s
const twoGaps = series([0, 1, 2, 3, 10, 11, 12, 20, 21, 22, 23].map((x) => x * S), [1, 1, 1, 1, 5, 5, 5, 9, 9, 9, 9]);

describe("selection methods keep both sides of each gap", () => {
  const cases: [string, (s: Series, gapMs?: number) => Uint32Array][] = [
    ["swinging door", (s, gapMs) => swingingDoor(s, { deviation: 100, gapMs })],
    ["deadband", (s, gapMs) => deadband(s, { deadband: 100, gapMs })],
    ["rdp", (s, gapMs) => rdp(s, { epsilon: 100, gapMs })],
    ["lttb", (s, gapMs) => lttb(s, { points: 2, gapMs })],
    ["ltob", (s, gapMs) => ltob(s, { points: 2, gapMs })],
    ["m4", (s, gapMs) => m4(s, { windowMs: 3_600_000, gapMs })],
  ];
  for (const [name, select] of cases) {
    it(`${name}: the ends of each stretch, where without gaps only the series' ends`, () => {
      expect(ints(select(twoGaps))).toEqual(name === "m4" ? [0, 7, 10] : [0, 10]); // M4: first, min = first, max (first 9), last
      expect(ints(select(twoGaps, gapMs))).toEqual([0, 3, 4, 6, 7, 10]);
    });
  }

  it("change of state: every change and the ends of each stretch", () => {
    expect(ints(changeOfState(twoGaps))).toEqual([0, 4, 7, 10]);
    expect(ints(changeOfState(twoGaps, { gapMs }))).toEqual([0, 3, 4, 6, 7, 10]);
  });

  it("LTTB shares the rest of its points among the stretches by their inner samples", () => {
    // Ends: 6; points 8 → 2 more, shared 2 : 1 : 2 inner samples → 0.8, 0.4, 0.8 → 1, 0, 1 (largest remainder, earlier first).
    const v = [1, 3, 0, 1, 5, 7, 5, 9, 2, 8, 9];
    const s = series(Array.from(twoGaps.t), v);
    const kept = ints(lttb(s, { points: 8, gapMs }));
    expect(kept.length).toBe(8);
    expect(kept.filter((i) => i > 0 && i < 3).length).toBe(1);
    expect(kept.filter((i) => i > 7 && i < 10).length).toBe(1);
  });
});

describe("aggregations do not carry a value across a gap", () => {
  it("time-weighted mean over [0, 20 s): 3 s of 1 and 2 s of 5 → 2.6; 3 without the gaps", () => {
    for (const interpolation of ["step", "linear"] as const) {
      const withGaps = aggregate(twoGaps, { windowMs: 20 * S, fn: "timeWeightedMean", interpolation, gapMs });
      expect(Array.from(withGaps.t)).toEqual([0, 20 * S]);
      expect(withGaps.v[0]).toBeCloseTo(13 / 5, 12);
      expect(withGaps.v[1]).toBe(9); // the series' last value holds to its window's end
    }
    // Without gaps, step: 1 holds 0→10 s, 5 holds 10→20 s → 3.
    expect(aggregate(twoGaps, { windowMs: 20 * S, fn: "timeWeightedMean", interpolation: "step" }).v[0]).toBe(3);
  });

  it("time above 4 within [0, 20 s): 2 s (5 from 10 to 12 s), 10 s without the gaps", () => {
    expect(timeAbove(twoGaps, { windowMs: 20 * S, threshold: 4, gapMs }).v[0]).toBe(2 * S);
    expect(timeAbove(twoGaps, { windowMs: 20 * S, threshold: 4 }).v[0]).toBe(10 * S);
  });

  it("a window whose samples are all followed by gaps has no usable time: NaN, quality bad", () => {
    const lonely = series([0, 10 * S, 20 * S], [1, 2, 3]);
    const out = aggregate(lonely, { windowMs: 5 * S, fn: "timeWeightedMean", interpolation: "step", gapMs });
    expect(Array.from(out.v)).toEqual([Number.NaN, Number.NaN, 3]);
    expect(Array.from(out.q)).toEqual([2, 2, 0]);
  });
});

describe("measure ignores gaps", () => {
  it("no interpolation between reduced samples on either side of a gap of the original", () => {
    // Reduced: one value per stretch. Across the gaps the line from 1 to 5 would miss 1 at 3 s by 1.2.
    const reduced = series([0, 10 * S, 20 * S], [1, 5, 9]);
    const plain = measure(twoGaps, reduced, { reconstruction: "linear" });
    expect(plain.maxAbsError).toBeCloseTo(1.2, 12);
    const gapAware = measure(twoGaps, reduced, { reconstruction: "linear", gapMs });
    expect(gapAware.maxAbsError).toBe(0);
    expect(gapAware.rmse).toBe(0);
  });

  it("local extrema next to a gap are not counted", () => {
    const s = series([0, 1, 2, 10, 11, 12].map((x) => x * S), [0, 5, 0, 9, 1, 9]);
    expect(measure(s, Uint32Array.from([0, 5]), { reconstruction: "linear" }).extrema).toBe(4);
    expect(measure(s, Uint32Array.from([0, 5]), { reconstruction: "linear", gapMs }).extrema).toBe(2);
  });
});
