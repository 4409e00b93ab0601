// Grids, bestPoint and "find a setting" (issue #8) — common practice (grid search with
// local refinement). Oracle: a brute-force scan of the points, on random points
// (fast-check, seeded) and on a constructed non-monotone error curve.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { type SettingGoal, type SweepPoint, bestPoint, findSetting, gridValues } from "@/lib/preview";

const SEED = 20260801;

/** Brute force: filter by the goal, sort by its keys, take the first. */
function bruteBest(points: SweepPoint[], goal: SettingGoal): SweepPoint | null {
  const byError = "maxError" in goal;
  const ok = points.filter((p) => !Number.isNaN(p.maxAbsError) && (byError ? p.maxAbsError <= goal.maxError : p.ratio >= goal.minRatio));
  const key = (p: SweepPoint) => (byError ? [-p.ratio, p.maxAbsError, p.value] : [p.maxAbsError, -p.ratio, p.value]);
  ok.sort((a, b) => {
    const [ka, kb] = [key(a), key(b)];
    for (let i = 0; i < 3; i++) if (ka[i] !== kb[i]) return ka[i] - kb[i];
    return 0;
  });
  return ok[0] ?? null;
}

const small = (xs: number[]) => fc.constantFrom(...xs);
const pointArb = fc.record({
  value: small([0.1, 0.2, 0.5, 1, 2, 5]),
  ratio: small([1, 2, 2, 3, 5, 8, Infinity]),
  maxAbsError: small([0, 0.1, 0.3, 0.3, 1, 2, Number.NaN]),
  rmse: small([0, 0.1]),
});
const goalArb: fc.Arbitrary<SettingGoal> = fc.oneof(
  small([0, 0.1, 0.3, 1, 5]).map((maxError) => ({ maxError })),
  small([1, 2, 3, 6, 100]).map((minRatio) => ({ minRatio })),
);

describe("gridValues", () => {
  it("linear and log grids, ends exact", () => {
    expect(gridValues(0, 1, 5)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    const log = gridValues(0.01, 100, 5, "log");
    [0.01, 0.1, 1, 10, 100].forEach((x, i) => expect(log[i]).toBeCloseTo(x, 12));
    expect(log[0]).toBe(0.01);
    expect(log[4]).toBe(100);
    expect(gridValues(3, 7, 1)).toEqual([3]);
  });

  it("refuses what is not a grid", () => {
    expect(() => gridValues(0, 1, 0)).toThrow(RangeError);
    expect(() => gridValues(0, 1, 3, "log")).toThrow(RangeError);
    expect(() => gridValues(0, Number.NaN, 3)).toThrow(RangeError);
  });
});

describe("bestPoint", () => {
  it("equals a brute-force scan for both goals (random points with ties and NaN errors)", () => {
    fc.assert(
      fc.property(fc.array(pointArb, { maxLength: 25 }), goalArb, (points, goal) => {
        expect(bestPoint(points, goal)).toEqual(bruteBest(points, goal));
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it("hand-worked ties", () => {
    const pts = [
      { value: 2, ratio: 10, maxAbsError: 0.5, rmse: 0 },
      { value: 1, ratio: 10, maxAbsError: 0.5, rmse: 0 },
      { value: 3, ratio: 10, maxAbsError: 0.4, rmse: 0 },
      { value: 4, ratio: 12, maxAbsError: 0.9, rmse: 0 },
    ];
    expect(bestPoint(pts, { maxError: 0.5 })?.value).toBe(3); // ratio 10 ties: lower error
    expect(bestPoint(pts.slice(0, 2), { maxError: 0.5 })?.value).toBe(1); // full tie: smaller value
    expect(bestPoint(pts, { minRatio: 11 })?.value).toBe(4);
    expect(bestPoint(pts, { minRatio: 13 })).toBeNull();
    expect(bestPoint(pts, { maxError: 0.1 })).toBeNull();
  });
});

/**
 * A non-monotone error curve on [0, 10] with the ratio rising with x: the error falls to
 * 1 at x = 3, rises to 4 at x = 6, falls to 0.2 at x = 8 and rises to 2 at x = 10.
 */
function curve(x: number): SweepPoint {
  const pieces: [number, number][] = [
    [0, 5],
    [3, 1],
    [6, 4],
    [8, 0.2],
    [10, 2],
  ];
  let k = 0;
  while (k + 2 < pieces.length && x > pieces[k + 1][0]) k++;
  const [[x0, e0], [x1, e1]] = [pieces[k], pieces[k + 1]];
  return { value: x, ratio: 1 + x, maxAbsError: e0 + ((e1 - e0) * (x - x0)) / (x1 - x0), rmse: 0 };
}

describe("findSetting", () => {
  const grid = gridValues(0, 10, 11);

  it.each<[string, SettingGoal]>([
    ["max error 0.5", { maxError: 0.5 }],
    ["max error 1.2", { maxError: 1.2 }],
    ["min ratio 2", { minRatio: 2 }],
    ["min ratio 5", { minRatio: 5 }],
  ])("non-monotone curve, %s: the best of everything evaluated, never worse than the grid's best, refined between its neighbours", (_, goal) => {
    const calls: number[] = [];
    const { best, evaluated } = findSetting((x) => (calls.push(x), curve(x)), grid, goal, { rounds: 3, points: 4 });
    const gridBest = bruteBest(grid.map(curve), goal) as SweepPoint;
    expect(best).toEqual(bruteBest(evaluated, goal));
    expect(bruteBest([gridBest, best as SweepPoint], goal)).toEqual(best);
    expect(calls.slice(0, grid.length)).toEqual(grid);
    expect(evaluated.map((p) => p.value)).toEqual(calls);
    const i = grid.indexOf(gridBest.value);
    const [lo, hi] = [grid[Math.max(0, i - 1)], grid[Math.min(grid.length - 1, i + 1)]];
    for (const x of calls.slice(grid.length)) {
      expect(x).toBeGreaterThan(lo);
      expect(x).toBeLessThan(hi);
    }
    expect(calls.length).toBeGreaterThan(grid.length);
    expect(calls.length).toBeLessThanOrEqual(grid.length + 3 * 4);
  });

  it("the far valley wins although the near one comes first: max error 0.5 → x between 8 and 9, not near 3", () => {
    const { best } = findSetting(curve, grid, { maxError: 0.5 });
    // Right of x = 8 the error 0.2 + 0.9 (x − 8) reaches 0.5 at x = 8.333…
    expect(best?.value).toBeGreaterThan(8);
    expect(best?.value).toBeLessThanOrEqual(8 + 0.3 / 0.9);
    expect(best?.maxAbsError).toBeLessThanOrEqual(0.5);
  });

  it("never worse than the grid's best on random evaluations", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 1, max: 50, noNaN: true }), fc.double({ min: 0, max: 3, noNaN: true })), { minLength: 64, maxLength: 64 }), goalArb, (table, goal) => {
        const evaluate = (x: number): SweepPoint => {
          const [ratio, maxAbsError] = table[Math.floor(x * 6.3) % 64];
          return { value: x, ratio, maxAbsError, rmse: 0 };
        };
        const g = gridValues(0, 10, 9);
        const gridBest = bruteBest(g.map(evaluate), goal);
        const { best, evaluated } = findSetting(evaluate, g, goal);
        if (gridBest === null) expect(best).toBeNull();
        else expect(bruteBest([gridBest, best as SweepPoint], goal)).toEqual(best);
        expect(best).toEqual(bruteBest(evaluated, goal));
      }),
      { seed: SEED, numRuns: 200 },
    );
  });

  it("nothing meets the goal: null, no refinement", () => {
    const { best, evaluated } = findSetting(curve, grid, { maxError: 0.01 });
    expect(best).toBeNull();
    expect(evaluated).toHaveLength(grid.length);
  });
});
