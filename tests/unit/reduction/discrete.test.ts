// Discrete signals (DESIGN.md "Signals"): change of state (exact changes, step-hold),
// transitions per window and time in state — common practice; hand-worked examples.
import { describe, expect, it } from "vitest";
import { changeOfState, measure, timeInState, transitionCount } from "@/lib/reduction";
import { ints, randomWalk, series, unitSeries } from "./helpers";
import { plain, qseries } from "./signal-helpers";

describe("changeOfState", () => {
  it("keeps the first sample, every change and the last: 0 0 1 1 1 0 2 2 → 0, 2, 5, 6, 7", () => {
    expect(ints(changeOfState(unitSeries([0, 0, 1, 1, 1, 0, 2, 2])))).toEqual([0, 2, 5, 6, 7]);
  });

  it("exact: no tolerance (1 and 1.0000001 differ)", () => {
    expect(ints(changeOfState(unitSeries([1, 1, 1.0000001, 1.0000001])))).toEqual([0, 2, 3]);
  });

  it("step-hold reconstruction equals the input at every sample", () => {
    const s = randomWalk(5_000, 41, { decimals: 0, walk: 0.5 });
    const m = measure(s, changeOfState(s), { reconstruction: "step" });
    expect(m.maxAbsError).toBe(0);
    expect(m.reductionRatio).toBeGreaterThan(1.5);
  });

  it("keeps quality changes like every selection method", () => {
    const s = qseries([0, 1, 2, 3, 4], [1, 1, 1, 1, 1], [0, 0, 1, 1, 0]);
    expect(ints(changeOfState(s))).toEqual([0, 1, 2, 3, 4]);
  });
});

describe("transitionCount", () => {
  // Windows of 4 ms: [0, 4): 0 0 1 1 → 1; [4, 8): 1 0 2 2 → 2 (1→0, 0→2); [8, 12): 2 → 0.
  const s = series([0, 1, 2, 3, 4, 5, 6, 7, 8], [0, 0, 1, 1, 1, 0, 2, 2, 2]);

  it("counts changes in the window of the later sample", () => {
    expect(plain(transitionCount(s, { windowMs: 4 }))).toEqual({ t: [0, 4, 8], v: [1, 2, 0], q: [0, 0, 0], goodShare: [1, 1, 1] });
  });

  it("a change across a window edge belongs to the later window", () => {
    // [0, 4): 0 0 0 0; [4, 8): 1 … → the change 0→1 at t = 4 counts in [4, 8).
    expect(Array.from(transitionCount(series([0, 1, 2, 3, 4], [0, 0, 0, 0, 1]), { windowMs: 4 }).v)).toEqual([0, 1]);
  });

  it("bad samples are skipped: 0 (bad 1) 0 is no transition", () => {
    expect(Array.from(transitionCount(qseries([0, 1, 2], [0, 1, 0], [0, 2, 0]), { windowMs: 10 }).v)).toEqual([0]);
  });
});

describe("timeInState", () => {
  it("step-hold time (ms) in the state per window; the value before a window holds into it", () => {
    // t = 0 2 5 7 10, states 0 1 1 0 1, windows of 6 ms, state 1:
    // [0, 6): 1 from 2 to 6 → 4; [6, 12): 1 held 6→7, 0 until 10, 1 from 10 to 12 → 3.
    const s = series([0, 2, 5, 7, 10], [0, 1, 1, 0, 1]);
    expect(Array.from(timeInState(s, { windowMs: 6, state: 1 }).v)).toEqual([4, 3]);
    expect(Array.from(timeInState(s, { windowMs: 6, state: 0 }).v)).toEqual([2, 3]);
  });

  it("times in all states add up to the covered time", () => {
    const s = randomWalk(3_000, 43, { decimals: 0, walk: 0.5 });
    const states = [...new Set(s.v)];
    const per = states.map((state) => timeInState(s, { windowMs: 60_000, state }));
    per[0].t.forEach((start, k) => {
      const sum = per.reduce((total, w) => total + w.v[k], 0);
      const covered = k === 0 ? start + 60_000 - s.t[0] : 60_000; // the first window counts from the first sample
      expect(sum).toBe(covered);
    });
  });
});
