// Counters / totalisers (DESIGN.md "Signals"): per-window delta and rate with rollover at
// a set maximum and reset detection — common practice; hand-worked examples.
import { describe, expect, it } from "vitest";
import { counterDelta, counterIncrement, counterRate } from "@/lib/reduction";
import { series } from "./helpers";
import { qseries } from "./signal-helpers";

describe("counterIncrement", () => {
  it("a rise is the difference", () => {
    expect(counterIncrement(10, 25, 1000, 0.5)).toBe(15);
    expect(counterIncrement(10, 10, 1000, 0.5)).toBe(0);
  });

  it("a fall near the rollover is a wrap: 995 → 5 at rollover 1000 counted 10", () => {
    expect(counterIncrement(995, 5, 1000, 0.5)).toBe(10);
  });

  it("a fall the rollover cannot explain is a reset, counted from 0: 400 → 10 counted 10", () => {
    // Through a wrap it would be 610 > 0.5 × 1000.
    expect(counterIncrement(400, 10, 1000, 0.5)).toBe(10);
    // With reset-share 0.7 a wrap of 610 is plausible.
    expect(counterIncrement(400, 10, 1000, 0.7)).toBe(610);
    // With reset-share 0.005 even 995 → 5 (a wrap of 10 > 5) is a reset.
    expect(counterIncrement(995, 5, 1000, 0.005)).toBe(5);
  });
});

describe("counterDelta and counterRate, hand-worked", () => {
  // 1 s samples: 990 995 | 5 20 400 | 10 30, rollover 1000, windows of 3 s:
  // [0, 3 s): 990→995 +5, 995→5 wrap +10 → 15; [3, 6 s): 5→20 +15, 20→400 +380, 400→10 reset +10 → 405;
  // [6, 9 s): 10→30 +20.
  const s = series([0, 1, 2, 3, 4, 5, 6].map((x) => x * 1000), [990, 995, 5, 20, 400, 10, 30]);
  const p = { windowMs: 3000, rollover: 1000 };

  it("delta per window", () => {
    const out = counterDelta(s, p);
    expect(Array.from(out.t)).toEqual([0, 3000, 6000]);
    expect(Array.from(out.v)).toEqual([15, 405, 20]);
  });

  it("rate per second of the window", () => {
    expect(Array.from(counterRate(s, p).v)).toEqual([5, 135, 20 / 3]);
  });

  it("deltas add up to the total over any windows", () => {
    const whole = counterDelta(s, { ...p, windowMs: 1e9 }).v[0];
    expect(whole).toBe(440);
    for (const windowMs of [1000, 2000, 5000]) expect(counterDelta(s, { ...p, windowMs }).v.reduce((a, b) => a + b, 0)).toBe(440);
  });

  it("bad samples are skipped: the increment runs from the last usable value", () => {
    const q = qseries([0, 1000, 2000], [10, 999, 30], [0, 2, 0]);
    expect(Array.from(counterDelta(q, { windowMs: 5000, rollover: 1000 }).v)).toEqual([20]);
  });

  it("rejects a non-positive rollover and a reset share outside (0, 1]", () => {
    expect(() => counterDelta(s, { windowMs: 1000, rollover: 0 })).toThrow(/rollover/);
    expect(() => counterDelta(s, { windowMs: 1000, rollover: 10, resetShare: 1.5 })).toThrow(/resetShare/);
  });
});
