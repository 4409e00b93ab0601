// Metrics of a reduction — common practice (DESIGN.md, "Metrics for every reduction"):
// samples in/out, reduction ratio, max absolute error and RMSE of the reconstruction
// (linear for shape methods, step-hold for deadband), share of local extrema kept.
import { describe, expect, it } from "vitest";
import { measure, swingingDoor } from "@/lib/reduction";
import { randomWalk, series, unitSeries } from "./helpers";

describe("measure — hand-worked", () => {
  const zigzag = unitSeries([0, 2, 0, 2, 0]); // extrema at 1 (max), 2 (min), 3 (max)

  it("keeping only the ends: error 2 at the peaks, RMSE √(8/5), no extrema kept", () => {
    const m = measure(zigzag, Uint32Array.from([0, 4]), { reconstruction: "linear" });
    expect(m).toEqual({
      samplesIn: 5,
      samplesOut: 2,
      reductionRatio: 2.5,
      maxAbsError: 2,
      rmse: Math.sqrt(8 / 5),
      extrema: 3,
      extremaKept: 0,
      extremaKeptShare: 0,
    });
  });

  it("linear through (1, 2) and (4, 0): errors 4/3 at t = 2 and 3", () => {
    const m = measure(zigzag, Uint32Array.from([0, 1, 4]), { reconstruction: "linear" });
    expect(m.maxAbsError).toBeCloseTo(4 / 3, 12);
    expect(m.rmse).toBeCloseTo(Math.sqrt((2 * 16) / 9 / 5), 12);
    expect(m.extremaKept).toBe(1);
    expect(m.extremaKeptShare).toBeCloseTo(1 / 3, 12);
  });

  it("step-hold of the same samples: 2 held over t = 2 and 3 → errors 2 and 0", () => {
    const m = measure(zigzag, Uint32Array.from([0, 1, 4]), { reconstruction: "step" });
    expect(m.maxAbsError).toBe(2);
    expect(m.rmse).toBeCloseTo(Math.sqrt(4 / 5), 12);
  });

  it("a reduced series (not indices): held from its samples, the first value before them", () => {
    const m = measure(zigzag, series([0, 2], [1, 1]), { reconstruction: "step" });
    expect(m.maxAbsError).toBe(1);
    expect(m.rmse).toBe(1);
    expect(m.extremaKept).toBe(0);
  });

  it("keeping everything: no error, every extremum kept, ratio 1", () => {
    const s = randomWalk(2_000, 8);
    const all = Uint32Array.from(s.t, (_, i) => i);
    const m = measure(s, all, { reconstruction: "linear" });
    expect(m.maxAbsError).toBe(0);
    expect(m.rmse).toBe(0);
    expect(m.reductionRatio).toBe(1);
    expect(m.extremaKeptShare).toBe(1);
    expect(m.extrema).toBeGreaterThan(100);
  });

  it("agrees with the swinging door bound on a real reduction", () => {
    const s = randomWalk(20_000, 9);
    const m = measure(s, swingingDoor(s, { deviation: 0.25 }), { reconstruction: "linear" });
    expect(m.maxAbsError).toBeLessThanOrEqual(0.25 + 1e-9);
    expect(m.reductionRatio).toBeGreaterThan(2);
    expect(m.extremaKeptShare).toBeGreaterThan(0);
    expect(m.extremaKeptShare).toBeLessThan(1);
  });

  it("empty series; rejects unsorted or out-of-range indices and a bad reconstruction", () => {
    expect(measure(unitSeries([]), new Uint32Array(0), { reconstruction: "linear" })).toMatchObject({
      samplesIn: 0,
      samplesOut: 0,
      reductionRatio: 1,
      maxAbsError: 0,
      rmse: 0,
      extremaKeptShare: 1,
    });
    expect(() => measure(zigzag, Uint32Array.from([0, 9]), { reconstruction: "linear" })).toThrow(/outside/);
    expect(() => measure(zigzag, Uint32Array.from([3, 1]), { reconstruction: "linear" })).toThrow(/ascend/);
    expect(() => measure(zigzag, Uint32Array.from([0, 4]), { reconstruction: "cubic" as "linear" })).toThrow(/reconstruction/);
  });
});
