// Swinging door trending — E. H. Bristol, "Swinging door trending: adaptive trend
// recording?", ISA National Conference, 1990, in the formulation of DESIGN.md
// ("Swinging door, the formulation Sluice uses").
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { measure, swingingDoor } from "@/lib/reduction";
import { ints, points, randomWalk, series, unitSeries } from "./helpers";

/** Reference written from DESIGN.md's text, sentence by sentence, on plain arrays. */
function referenceSwingingDoor(t: number[], v: number[], deviation: number, maxInterval = Infinity): number[] {
  const n = t.length;
  if (n <= 2) return t.map((_, i) => i);
  const kept = [0]; // keep the first sample and make it the anchor
  let anchor = 0;
  let upper = Infinity; // with an open corridor of slopes
  let lower = -Infinity;
  let candidate: number | null = null;
  for (let i = 1; i < n; i++) {
    const slope = (v[i] - v[anchor]) / (t[i] - t[anchor]);
    if (candidate !== null) {
      const stretches = t[i] - t[anchor] > maxInterval; // keep the candidate before a sample that would stretch past it
      if (stretches || slope > upper || slope < lower) {
        kept.push(candidate); // keep the candidate, make it the anchor, open the corridor again
        anchor = candidate;
        upper = Infinity;
        lower = -Infinity;
      }
    }
    const dt = t[i] - t[anchor];
    upper = Math.min(upper, (v[i] - v[anchor] + deviation) / dt);
    lower = Math.max(lower, (v[i] - v[anchor] - deviation) / dt);
    candidate = i; // the new sample becomes the candidate
  }
  if (kept[kept.length - 1] !== n - 1) kept.push(n - 1); // always keep the last sample
  return kept;
}

/** |v − line between the kept neighbours| for every dropped sample (linear reconstruction). */
function droppedErrors(t: Float64Array, v: Float64Array, kept: Uint32Array): number {
  return measure({ t, v }, kept, { reconstruction: "linear" }).maxAbsError;
}

describe("swingingDoor — fixtures worked by hand (DESIGN.md formulation)", () => {
  it("keeps the corners of a triangle: 0 1 2 3 2 1 0, deviation 0.5 → indices 0, 3, 6", () => {
    // i=2: slope 1 in [0.5, 1.5]; i=3: slope 1 in [0.75, 1.25]; i=4: slope 0.5 < 0.833 → keep 3.
    expect(ints(swingingDoor(unitSeries([0, 1, 2, 3, 2, 1, 0]), { deviation: 0.5 }))).toEqual([0, 3, 6]);
  });

  it("drops wiggles inside the corridor: 0 0.4 0 0.4 0, deviation 0.5 → 0, 4", () => {
    // Corridor after i=3: [−0.033, 0.25]; the slope to i=4 is 0.
    expect(ints(swingingDoor(unitSeries([0, 0.4, 0, 0.4, 0]), { deviation: 0.5 }))).toEqual([0, 4]);
  });

  it("keeps the candidate before a sample that would stretch past maxIntervalMs: → 0, 2, 4", () => {
    // t3 − t0 = 3 > 2 → keep 2; t4 − t2 = 2 is not past 2.
    const s = unitSeries([0, 0.4, 0, 0.4, 0]);
    expect(ints(swingingDoor(s, { deviation: 0.5, maxIntervalMs: 2 }))).toEqual([0, 2, 4]);
  });

  it("keeps a step: 0 0 0 5 5 5 with deviation 1 → 0, 2, 3, 5", () => {
    // At i=3 the slope 5/3 leaves [−0.5, 0.5] → keep 2; at i=4 the slope 5/2 from anchor 2
    // leaves the corridor [4, 6] set by sample 3 → keep 3.
    expect(ints(swingingDoor(unitSeries([0, 0, 0, 5, 5, 5]), { deviation: 1 }))).toEqual([0, 2, 3, 5]);
  });

  it("deviation 0 keeps every sample off the straight line", () => {
    expect(ints(swingingDoor(unitSeries([0, 1, 2, 3, 3, 3, 1]), { deviation: 0 }))).toEqual([0, 3, 5, 6]);
  });

  it("handles empty, one- and two-sample series", () => {
    expect(ints(swingingDoor(unitSeries([]), { deviation: 1 }))).toEqual([]);
    expect(ints(swingingDoor(unitSeries([7]), { deviation: 1 }))).toEqual([0]);
    expect(ints(swingingDoor(unitSeries([7, 9]), { deviation: 1 }))).toEqual([0, 1]);
  });

  it("rejects a negative deviation and a non-positive max interval", () => {
    const s = unitSeries([0, 1, 2]);
    expect(() => swingingDoor(s, { deviation: -1 })).toThrow(/deviation/);
    expect(() => swingingDoor(s, { deviation: 1, maxIntervalMs: 0 })).toThrow(/maxIntervalMs/);
  });
});

describe("swingingDoor — equals the straightforward reference (DESIGN.md) on random series", () => {
  const cases = [
    { seed: 1, deviation: 0.05 },
    { seed: 2, deviation: 0.2 },
    { seed: 3, deviation: 1 },
    { seed: 4, deviation: 0.2, maxIntervalMs: 10_000 },
    { seed: 5, deviation: 0.1, decimals: 1 }, // rounded values: many exact ties
    { seed: 6, deviation: 1, decimals: 0 },
    { seed: 7, deviation: 0, decimals: 0 },
  ];
  for (const c of cases) {
    it(`seed ${c.seed}, deviation ${c.deviation}${c.maxIntervalMs ? `, max ${c.maxIntervalMs} ms` : ""}${c.decimals !== undefined ? `, ${c.decimals} decimals` : ""}`, () => {
      const s = randomWalk(20_000, c.seed, { decimals: c.decimals });
      const { t, v } = points(s);
      const kept = swingingDoor(s, c);
      expect(ints(kept)).toEqual(referenceSwingingDoor(t, v, c.deviation, c.maxIntervalMs));
      expect(kept.length).toBeLessThan(s.t.length); // the comparison is not vacuous
    });
  }

  it("takes the plain path, with the same result, when a slope overflows", () => {
    // Values near the float limit 1e-300 ms apart: (v − vₐ)/Δt overflows to ±Infinity.
    const s = series([0, 1e-300, 2e-300, 3e-300, 4e-300], [0, 1e300, -1e300, 1e300, 0]);
    const { t, v } = points(s);
    expect(ints(swingingDoor(s, { deviation: 1 }))).toEqual(referenceSwingingDoor(t, v, 1));
  });

  it("gives the reference's result when a corridor bound overflows but the slope does not", () => {
    // v − vₐ + deviation overflows to +Infinity (Math.min leaves the bound alone), then
    // v − vₐ − deviation to −Infinity; the slopes themselves stay finite.
    const cases: [number[], number[], number][] = [
      [[0, 1, 2, 3, 4, 5], [0, 1.5e308, 1.2e308, -1.5e308, 0, 1e308], 1e308],
      [[0, 10, 20, 30, 40], [-1e308, 1e308, 1e308, -1e308, 1e308], 1.7e308],
      [[0, 0.5, 1, 1.5, 2, 2.5, 3], [0, 1e308, 0, -1e308, 0, 1e308, 0], 1e308],
    ];
    for (const [times, values, deviation] of cases) {
      const s = series(times, values);
      const { t, v } = points(s);
      expect(ints(swingingDoor(s, { deviation }))).toEqual(referenceSwingingDoor(t, v, deviation));
    }
  });

  it("equals the reference for any finite values and deviations, up to the float limit (fast-check)", () => {
    const wide = seriesOf(Number.MAX_VALUE, 3, 60);
    fc.assert(
      fc.property(wide, fc.double({ min: 0, max: Number.MAX_VALUE, noNaN: true }), (s, deviation) => {
        const { t, v } = points(s);
        expect(ints(swingingDoor(s, { deviation }))).toEqual(referenceSwingingDoor(t, v, deviation));
      }),
      { seed: 20261204, numRuns: 2_000 },
    );
  });
});

// fast-check: arbitrary series as positive time steps (1–5,000 ms) and values within ±limit.
function seriesOf(limit: number, minLength: number, maxLength: number) {
  return fc.array(fc.tuple(fc.integer({ min: 1, max: 5_000 }), fc.double({ min: -limit, max: limit, noNaN: true })), { minLength, maxLength }).map((rows) => {
    let now = 1_700_000_000_000;
    return series(
      rows.map(([dt]) => (now += dt)),
      rows.map(([, x]) => x),
    );
  });
}
const arbitrarySeries = seriesOf(1e3, 1, 300);

describe("swingingDoor — properties (fast-check)", () => {
  it("keeps first and last, ascending, and every dropped sample within ±deviation of the kept line", () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.double({ min: 0, max: 50, noNaN: true }), (s, deviation) => {
        const kept = swingingDoor(s, { deviation });
        const n = s.t.length;
        expect(kept[0]).toBe(0);
        expect(kept[kept.length - 1]).toBe(n - 1);
        for (let k = 1; k < kept.length; k++) expect(kept[k]).toBeGreaterThan(kept[k - 1]);
        // Rounding slack: the corridor is tested on slopes, the error on values.
        expect(droppedErrors(s.t, s.v, kept)).toBeLessThanOrEqual(deviation + 1e-9 * (1 + 1e3));
        const { t, v } = points(s);
        expect(ints(kept)).toEqual(referenceSwingingDoor(t, v, deviation));
      }),
      { seed: 20261201, numRuns: 300 },
    );
  });

  it("honours the max interval: kept neighbours are at most maxIntervalMs apart unless adjacent", () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.double({ min: 0, max: 50, noNaN: true }), fc.integer({ min: 1, max: 20_000 }), (s, deviation, maxIntervalMs) => {
        const kept = swingingDoor(s, { deviation, maxIntervalMs });
        for (let k = 1; k < kept.length; k++) {
          const adjacent = kept[k] === kept[k - 1] + 1;
          if (!adjacent) expect(s.t[kept[k]] - s.t[kept[k - 1]]).toBeLessThanOrEqual(maxIntervalMs);
        }
        expect(droppedErrors(s.t, s.v, kept)).toBeLessThanOrEqual(deviation + 1e-9 * (1 + 1e3));
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it("a huge deviation and no max interval keeps exactly the first and last sample", () => {
    fc.assert(
      fc.property(arbitrarySeries.filter((s) => s.t.length >= 2), (s) => {
        expect(ints(swingingDoor(s, { deviation: 1e12 }))).toEqual([0, s.t.length - 1]);
      }),
      { seed: 20261203, numRuns: 200 },
    );
  });
});
