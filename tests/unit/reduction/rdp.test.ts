// Ramer–Douglas–Peucker — U. Ramer, Computer Graphics and Image Processing 1(3), 1972;
// D. Douglas & T. Peucker, The Canadian Cartographer 10(2), 1973. Oracle for the
// perpendicular distance: simplify-js (V. Agafonkin) `simplify(points, tolerance, true)`,
// pure RDP on the squared distance to the segment.
import simplify from "simplify-js";
import { describe, expect, it } from "vitest";
import { measure, rdp, type Series } from "@/lib/reduction";
import { ints, mulberry32, randomWalk, series, unitSeries } from "./helpers";

function simplifyIndices(s: Series, epsilon: number): number[] {
  const pts = Array.from(s.t, (x, i) => ({ x, y: s.v[i], i }));
  return (simplify(pts, epsilon, true) as typeof pts).map((p) => p.i);
}

/** Plain recursive RDP on the vertical distance, written from the papers' description. */
function referenceVertical(s: Series, epsilon: number): number[] {
  const t = Array.from(s.t);
  const v = Array.from(s.v);
  const n = t.length;
  if (n <= 2) return t.map((_, i) => i);
  const kept = new Set([0, n - 1]);
  const step = (first: number, last: number): void => {
    const slope = (v[last] - v[first]) / (t[last] - t[first]);
    let farthest = -1;
    let worst = epsilon;
    for (let i = first + 1; i < last; i++) {
      const d = Math.abs(v[i] - (v[first] + (t[i] - t[first]) * slope));
      if (d > worst) {
        worst = d;
        farthest = i;
      }
    }
    if (farthest < 0) return;
    kept.add(farthest);
    step(first, farthest);
    step(farthest, last);
  };
  step(0, n - 1);
  return [...kept].sort((a, b) => a - b);
}

describe("rdp — fixtures worked by hand", () => {
  const s = unitSeries([0, 0.5, 0, 3, 0, 0.2, 0]);

  it("vertical, epsilon 1: 0 0.5 0 3 0 0.2 0 → 0, 2, 3, 4, 6", () => {
    // (0,6): flat line, farthest 3 at i=3. (0,3): line v = t, |0 − 2| = 2 at i=2. (3,6): v = 6 − t,
    // |0 − 2| = 2 at i=4. (0,2), (4,6): 0.5 and 0.2 ≤ 1.
    expect(ints(rdp(s, { epsilon: 1 }))).toEqual([0, 2, 3, 4, 6]);
  });

  it("perpendicular, epsilon 1: the same samples (√2 at i=2 and i=4), as simplify-js", () => {
    expect(ints(rdp(s, { epsilon: 1, distance: "perpendicular" }))).toEqual([0, 2, 3, 4, 6]);
    expect(simplifyIndices(s, 1)).toEqual([0, 2, 3, 4, 6]);
  });

  it("a steep segment: vertical error 0.25 but distance to the segment 0.024", () => {
    const steep = unitSeries([0, 10, 20.5]);
    expect(ints(rdp(steep, { epsilon: 0.1 }))).toEqual([0, 1, 2]);
    expect(ints(rdp(steep, { epsilon: 0.1, distance: "perpendicular" }))).toEqual([0, 2]);
  });

  it("beyond the segment's ends the distance is to the nearer end (simplify-js getSqSegDist)", () => {
    // t = 0, 1, 2 with a huge jump: the middle sample projects past the segment's end.
    const s2 = unitSeries([0, 100, 1]);
    expect(ints(rdp(s2, { epsilon: 50, distance: "perpendicular" }))).toEqual(simplifyIndices(s2, 50));
  });

  it("handles empty, one- and two-sample series; rejects bad parameters", () => {
    expect(ints(rdp(unitSeries([]), { epsilon: 1 }))).toEqual([]);
    expect(ints(rdp(unitSeries([1]), { epsilon: 1 }))).toEqual([0]);
    expect(ints(rdp(unitSeries([1, 2]), { epsilon: 1 }))).toEqual([0, 1]);
    expect(() => rdp(s, { epsilon: -1 })).toThrow(/epsilon/);
    expect(() => rdp(s, { epsilon: 1, distance: "diagonal" as "vertical" })).toThrow(/distance/);
  });
});

describe("rdp perpendicular — exactly the points of simplify-js with highQuality", () => {
  it("on random walks with epoch-ms timestamps (block skipping engaged) and several epsilons", () => {
    for (const [seed, n, epsilon] of [
      [1, 50_000, 0.05],
      [2, 50_000, 0.2],
      [3, 200_000, 0.5],
      [4, 20_000, 2],
    ] as const) {
      const s = randomWalk(n, seed);
      const kept = rdp(s, { epsilon, distance: "perpendicular" });
      expect(ints(kept)).toEqual(simplifyIndices(s, epsilon));
      expect(kept.length).toBeLessThan(n);
    }
  });

  it("when time and value scales are alike (1 ms steps, spiky values: the segment is not flat)", () => {
    for (let seed = 0; seed < 8; seed++) {
      const s = randomWalk(5_000, 50 + seed, { stepMs: 1, walk: 3, noise: 2, spikes: 0.05, decimals: seed % 2 ? 0 : undefined });
      for (const epsilon of [0.5, 2, 8]) {
        expect(ints(rdp(s, { epsilon, distance: "perpendicular" }))).toEqual(simplifyIndices(s, epsilon));
      }
    }
  });

  it("with exact ties between distances (the first farthest sample wins, as in simplify-js)", () => {
    // A square wave: many samples at exactly the same distance from a segment.
    for (const [start, step] of [
      [0, 1],
      [1.7e12, 1000],
    ]) {
      const n = 4_000;
      const t = Array.from({ length: n }, (_, i) => start + i * step);
      const v = Array.from({ length: n }, (_, i) => [0, 1, 0, -1][i % 4] * 3 + (i % 400 === 0 ? 7 : 0));
      const s = series(t, v);
      for (const epsilon of [0.5, 2.5, 5]) {
        expect(ints(rdp(s, { epsilon, distance: "perpendicular" }))).toEqual(simplifyIndices(s, epsilon));
        expect(ints(rdp(s, { epsilon }))).toEqual(referenceVertical(s, epsilon));
      }
    }
  });

  it("on large values with tiny noise (rounding near the skipping margin)", () => {
    const rand = mulberry32(77);
    const n = 30_000;
    const t = Array.from({ length: n }, (_, i) => 1.7e12 + i * 1000);
    const v = Array.from({ length: n }, (_, i) => 1e6 + Math.sin(i / 500) * 10 + rand() * 1e-6);
    const s = series(t, v);
    for (const epsilon of [1e-6, 0.01, 1]) {
      expect(ints(rdp(s, { epsilon, distance: "perpendicular" }))).toEqual(simplifyIndices(s, epsilon));
    }
  });
});

describe("rdp vertical — the plain recursive reference, and the error bound", () => {
  it("equals the reference and keeps the linear reconstruction error ≤ epsilon", () => {
    for (const [seed, n, epsilon, decimals] of [
      [11, 30_000, 0.1, undefined],
      [12, 30_000, 0.5, 1],
      [13, 100_000, 1, undefined],
      [14, 5_000, 0, 0],
    ] as const) {
      const s = randomWalk(n, seed, { decimals });
      const kept = rdp(s, { epsilon });
      expect(ints(kept)).toEqual(referenceVertical(s, epsilon));
      const m = measure(s, kept, { reconstruction: "linear" });
      expect(m.maxAbsError).toBeLessThanOrEqual(epsilon);
      expect(kept.length).toBeLessThan(n);
    }
  });
});
