// Threshold exceedances (crossing counts with Schmitt-trigger hysteresis), exceedance
// events and time above threshold — common practice (no canonical source); hand-worked
// examples from DESIGN.md and below.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { exceedanceEvents, exceedances, timeAbove } from "@/lib/reduction";
import { randomWalk, series, unitSeries } from "./helpers";

const ALL = 1e15; // one window holding every sample

/** Reference: crossings over the whole series, written from the definition. */
function referenceCrossings(v: number[], threshold: number, direction: "above" | "below", hysteresis: number): number {
  const past = (x: number) => (direction === "above" ? x > threshold : x < threshold);
  const rearmed = (x: number) => (direction === "above" ? x <= threshold - hysteresis : x >= threshold + hysteresis);
  let armed = v.length > 0 && !past(v[0]); // starting past the threshold does not count
  let count = 0;
  for (const x of v) {
    if (armed && past(x)) {
      count++;
      armed = false;
    } else if (!armed && rearmed(x)) {
      armed = true;
    }
  }
  return count;
}

describe("exceedances — hand-worked (DESIGN.md)", () => {
  const s = unitSeries([0, 2, 0.5, 2, -1, 2]);

  it("0, 2, 0.5, 2, −1, 2 with threshold 1 → 3 upward crossings", () => {
    expect(Array.from(exceedances(s, { windowMs: ALL, threshold: 1 }).v)).toEqual([3]);
  });

  it("… and 2 with hysteresis 1 (0.5 does not re-arm; −1 does)", () => {
    expect(Array.from(exceedances(s, { windowMs: ALL, threshold: 1, hysteresis: 1 }).v)).toEqual([2]);
  });

  it("per window of 2 ms: 1, 1, 1 — and 1, 0, 1 with hysteresis 1", () => {
    const plain = exceedances(s, { windowMs: 2, threshold: 1 });
    expect(Array.from(plain.t)).toEqual([0, 2, 4]);
    expect(Array.from(plain.v)).toEqual([1, 1, 1]);
    expect(Array.from(exceedances(s, { windowMs: 2, threshold: 1, hysteresis: 1 }).v)).toEqual([1, 0, 1]);
  });

  it("starting above does not count; equal to the threshold is not above", () => {
    expect(exceedances(unitSeries([2, 0, 2]), { windowMs: ALL, threshold: 1 }).v[0]).toBe(1);
    expect(exceedances(unitSeries([0, 1, 0, 1]), { windowMs: ALL, threshold: 1 }).v[0]).toBe(0);
    expect(exceedances(unitSeries([1, 1, 1.0001]), { windowMs: ALL, threshold: 1 }).v[0]).toBe(1);
  });

  it("below: 2, 0, 1.5, 0, 3, 0 with threshold 1 → 3 downward crossings; 2 with hysteresis 1", () => {
    const d = unitSeries([2, 0, 1.5, 0, 3, 0]);
    expect(exceedances(d, { windowMs: ALL, threshold: 1, direction: "below" }).v[0]).toBe(3);
    // Re-arm needs ≥ 2: 1.5 does not, 3 does.
    expect(exceedances(d, { windowMs: ALL, threshold: 1, direction: "below", hysteresis: 1 }).v[0]).toBe(2);
  });

  it("a window with samples but no crossing gives 0; a window without samples is absent", () => {
    const out = exceedances(series([0, 1, 50, 51], [0, 0, 0, 5]), { windowMs: 10, threshold: 1 });
    expect(Array.from(out.t)).toEqual([0, 50]);
    expect(Array.from(out.v)).toEqual([0, 1]);
  });

  it("rejects bad parameters", () => {
    expect(() => exceedances(s, { windowMs: 10, threshold: 1, hysteresis: -1 })).toThrow(/hysteresis/);
    expect(() => exceedances(s, { windowMs: 10, threshold: 1, direction: "up" as "above" })).toThrow(/direction/);
    expect(() => exceedances(s, { windowMs: 10, threshold: Number.NaN })).toThrow(/threshold/);
  });
});

describe("exceedances — per-window counts sum to the whole-series count (fast-check)", () => {
  it("for any windows, offset, direction and hysteresis; and equal the plain reference", () => {
    const arb = fc.array(fc.tuple(fc.integer({ min: 1, max: 1_000 }), fc.integer({ min: -10, max: 10 })), { maxLength: 300 });
    fc.assert(
      fc.property(
        arb,
        fc.integer({ min: 1, max: 5_000 }),
        fc.integer({ min: -5_000, max: 5_000 }),
        fc.constantFrom("above" as const, "below" as const),
        fc.constantFrom(0, 0.5, 2, 5),
        fc.constantFrom(-2, 0, 0.5, 3),
        (rows, windowMs, offsetMs, direction, hysteresis, threshold) => {
          let now = 0;
          const t = rows.map(([dt]) => (now += dt));
          const v = rows.map(([, x]) => x / 2);
          const s = series(t, v);
          const perWindow = exceedances(s, { windowMs, offsetMs, threshold, direction, hysteresis });
          const whole = exceedances(s, { windowMs: ALL, threshold, direction, hysteresis });
          const total = perWindow.v.reduce((a, b) => a + b, 0);
          expect(total).toBe(whole.v.length ? whole.v[0] : 0);
          expect(total).toBe(referenceCrossings(v, threshold, direction, hysteresis));
        },
      ),
      { seed: 20261206, numRuns: 400 },
    );
  });
});

describe("exceedanceEvents — windows whose count passes the limit", () => {
  it("v is the count; only windows with count > limit", () => {
    // Window [0, 10): 0 3 0 3 0 3 → 3 crossings; [10, 20): 0 3 → 1; [20, 30): 0 0 → 0.
    const s = series([0, 1, 2, 3, 4, 5, 10, 11, 20, 21], [0, 3, 0, 3, 0, 3, 0, 3, 0, 0]);
    const events = exceedanceEvents(s, { windowMs: 10, threshold: 1, limit: 1 });
    expect(Array.from(events.t)).toEqual([0]);
    expect(Array.from(events.v)).toEqual([3]);
    expect(Array.from(exceedanceEvents(s, { windowMs: 10, threshold: 1, limit: 0 }).t)).toEqual([0, 10]);
    expect(exceedanceEvents(s, { windowMs: 10, threshold: 1, limit: 3 }).t.length).toBe(0);
    expect(() => exceedanceEvents(s, { windowMs: 10, threshold: 1, limit: -1 })).toThrow(/limit/);
  });
});

describe("timeAbove — ms above threshold per window, step-hold", () => {
  it("hand-worked: held values cross window edges; the last sample holds to its window end", () => {
    // t = 0 2 5 7 10, v = 0 2 3 0 2, threshold 1, windows of 6 ms.
    // [0, 6): 2 holds 2→5 (3 ms), 3 holds 5→6 (1 ms) → 4. [6, 12): 3 held 6→7 (1 ms), 0 until 10,
    // 2 holds 10→12 (2 ms) → 3. Total 7 = (7 − 2) + (12 − 10).
    const out = timeAbove(series([0, 2, 5, 7, 10], [0, 2, 3, 0, 2]), { windowMs: 6, threshold: 1 });
    expect(Array.from(out.t)).toEqual([0, 6]);
    expect(Array.from(out.v)).toEqual([4, 3]);
  });

  it("a value equal to the threshold is not above", () => {
    expect(Array.from(timeAbove(series([0, 5], [1, 1]), { windowMs: 10, threshold: 1 }).v)).toEqual([0]);
  });

  it("per-window times sum to the time above over the whole span", () => {
    const s = randomWalk(20_000, 31);
    const threshold = s.v[0];
    const perWindow = timeAbove(s, { windowMs: 60_000, offsetMs: 13_000, threshold });
    const whole = timeAbove(s, { windowMs: ALL, threshold });
    // The whole-span window ends later than the last small window: subtract the tail held after it.
    const lastEnd = perWindow.t[perWindow.t.length - 1] + 60_000;
    const tail = s.v[s.v.length - 1] > threshold ? ALL - lastEnd : 0;
    const sum = perWindow.v.reduce((a, b) => a + b, 0);
    expect(sum).toBeCloseTo(whole.v[0] - tail, 3);
    expect(sum).toBeGreaterThan(0);
  });
});
