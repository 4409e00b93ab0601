// Largest-Triangle-Three-Buckets and Largest-Triangle-One-Bucket — S. Steinarsson,
// "Downsampling Time Series for Visual Representation", MSc thesis, University of
// Iceland, 2013. Oracle for LTTB: the `downsample-lttb` npm package, a copy of the
// author's reference function (largestTriangleThreeBuckets).
import downsampleLttb from "downsample-lttb";
import { LTTB as downsampleLTTB } from "downsample";
import { describe, expect, it } from "vitest";
import { ltob, lttb, type Series } from "@/lib/reduction";
import { ints, mulberry32, randomWalk, unitSeries } from "./helpers";

/** Indices the author's reference function keeps (its points are the input tuples). */
function referenceIndices(s: Series, threshold: number): number[] {
  const data = Array.from(s.t, (x, i) => [x, s.v[i]]);
  const index = new Map(data.map((p, i) => [p, i]));
  return downsampleLttb.processData(data, threshold).map((p) => index.get(p) as number);
}

/**
 * The areas of bucket i's samples (from its first sample on) against sample a and the
 * next bucket's average: the reference function's bounds, sums and expression.
 */
function bucketAreas(s: Series, every: number, i: number, a: number): { from: number; areas: number[] } {
  const n = s.t.length;
  let avgRangeStart = Math.floor((i + 1) * every) + 1;
  let avgRangeEnd = Math.floor((i + 2) * every) + 1;
  avgRangeEnd = avgRangeEnd < n ? avgRangeEnd : n;
  const avgRangeLength = avgRangeEnd - avgRangeStart;
  let avgX = 0;
  let avgY = 0;
  for (; avgRangeStart < avgRangeEnd; avgRangeStart++) {
    avgX += s.t[avgRangeStart];
    avgY += s.v[avgRangeStart];
  }
  avgX /= avgRangeLength;
  avgY /= avgRangeLength;
  const from = Math.floor(i * every) + 1;
  const to = Math.floor((i + 1) * every) + 1;
  const areas: number[] = [];
  for (let j = from; j < to; j++) {
    areas.push(Math.abs((s.t[a] - avgX) * (s.v[j] - s.v[a]) - (s.t[a] - s.t[j]) * (avgY - s.v[a])) * 0.5);
  }
  return { from, areas };
}

/**
 * The reference function's loop (largestTriangleThreeBuckets) on typed arrays, except that a
 * bucket in which no area compares (all NaN) keeps its first sample instead of the previous
 * bucket's point.
 */
function plainLttb(s: Series, threshold: number): number[] {
  const n = s.t.length;
  const every = (n - 2) / (threshold - 2);
  const kept = [0];
  let a = 0;
  for (let i = 0; i < threshold - 2; i++) {
    const { from, areas } = bucketAreas(s, every, i, a);
    let maxArea = -1;
    let next = from;
    areas.forEach((area, k) => {
      if (area > maxArea) {
        maxArea = area;
        next = from + k;
      }
    });
    kept.push(next);
    a = next;
  }
  kept.push(n - 1);
  return kept;
}

/** How many buckets hold their largest area (given the kept samples) more than once. */
function tiedBuckets(s: Series, threshold: number, kept: number[]): number {
  const every = (s.t.length - 2) / (threshold - 2);
  let tied = 0;
  for (let i = 0; i < threshold - 2; i++) {
    const { areas } = bucketAreas(s, every, i, kept[i]);
    const max = Math.max(...areas);
    if (areas.filter((x) => x === max).length > 1) tied++;
  }
  return tied;
}

/** Pairs (n, threshold) where floor((threshold − 2)·every) + 1 falls short of n − 1. */
function roundingEdges(count: number): [number, number][] {
  const edges: [number, number][] = [];
  for (let n = 10; edges.length < count; n++) {
    for (let threshold = 3; threshold < n; threshold++) {
      const every = (n - 2) / (threshold - 2);
      if (Math.floor((threshold - 2) * every) + 1 !== n - 1) {
        edges.push([n, threshold]);
        break;
      }
    }
  }
  return edges;
}

describe("lttb — identical to the thesis author's reference function (downsample-lttb)", () => {
  it("on random series and targets, epoch-ms timestamps", () => {
    const rand = mulberry32(42);
    for (let k = 0; k < 60; k++) {
      const n = 3 + Math.floor(rand() * 5_000);
      const threshold = 2 + Math.floor(rand() * (n - 1));
      const s = randomWalk(n, 100 + k, { decimals: k % 3 === 0 ? 1 : undefined });
      expect(ints(lttb(s, { points: threshold }))).toEqual(referenceIndices(s, threshold));
    }
  });

  it("on a long series at 5–10 % kept", () => {
    const s = randomWalk(200_000, 7);
    for (const threshold of [10_000, 15_001, 19_999]) {
      expect(ints(lttb(s, { points: threshold }))).toEqual(referenceIndices(s, threshold));
    }
  });

  it("including the float-rounding edge of the last bucket", () => {
    const edges = roundingEdges(25);
    expect(edges[0]).toEqual([17, 13]); // (17 − 2)/11 · 11 rounds below 15
    for (const [n, threshold] of edges) {
      for (let seed = 0; seed < 5; seed++) {
        const s = randomWalk(n, 1_000 * n + seed, { spikes: 0.2 });
        expect(ints(lttb(s, { points: threshold }))).toEqual(referenceIndices(s, threshold));
      }
    }
  });

  it("with ties, and with finite values whose bucket sums overflow (checked per bucket on the sums, so this must not be refused)", () => {
    // Ties: a flat series and a square wave, so that the first sample of equal area must win.
    const flat = unitSeries(Array.from({ length: 101 }, () => 3));
    const square = unitSeries(Array.from({ length: 101 }, (_, i) => (Math.floor(i / 5) % 2 ? 1 : -1)));
    for (const s of [flat, square]) for (const threshold of [3, 7, 12, 40]) expect(ints(lttb(s, { points: threshold }))).toEqual(referenceIndices(s, threshold));
    // Values near the largest double: the averages overflow to ±Infinity, as they do in the
    // reference's arithmetic. Where every area of a bucket is then NaN, the reference keeps its
    // previous point again (indices repeat); ours keeps the bucket's first sample, so the
    // comparison here is with the reference's loop written out with that one difference.
    const rand = mulberry32(9);
    const huge = unitSeries(Array.from({ length: 500 }, () => (rand() < 0.5 ? -1 : 1) * 1.7e308 * (0.6 + 0.4 * rand())));
    const late = { t: Float64Array.from({ length: 200 }, (_, i) => 1.7e308 * (0.5 + i / 400)), v: huge.v.slice(0, 200) };
    for (const [s, threshold] of [[huge, 5], [huge, 23], [huge, 100], [late, 17]] as const) {
      expect(ints(lttb(s, { points: threshold }))).toEqual(plainLttb(s, threshold));
    }
    // …while a real infinity is still refused, wherever it is.
    for (const bad of [0, 1, 250, 498, 499]) {
      const inf = { t: huge.t.slice(), v: huge.v.slice() };
      inf.v[bad] = bad % 2 ? Number.POSITIVE_INFINITY : Number.NEGATIVE_INFINITY;
      expect(() => lttb(inf, { points: 23 })).toThrow(new RegExp(`index ${bad}\\b|\\b${bad}\\b`));
      const endless = { t: huge.t.slice(), v: huge.v.slice() };
      endless.t[499] = Number.POSITIVE_INFINITY;
      expect(() => lttb(endless, { points: 23 })).toThrow(/499/);
    }
  });

  it("with many equal areas in one bucket, wherever they fall in it", () => {
    // Three levels on a regular grid: most buckets hold several samples of the same,
    // largest area, at even and odd places, so the first of them must win every time.
    const rand = mulberry32(2013);
    let ties = 0;
    for (let k = 0; k < 200; k++) {
      const n = 20 + Math.floor(rand() * 400);
      const s = unitSeries(Array.from({ length: n }, () => Math.floor(rand() * 3)));
      const threshold = 3 + Math.floor(rand() * (n / 3));
      const kept = ints(lttb(s, { points: threshold }));
      expect(kept).toEqual(referenceIndices(s, threshold));
      ties += tiedBuckets(s, threshold, kept);
    }
    expect(ties).toBeGreaterThan(200); // buckets whose largest area is shared: exercised, not dodged
  });

  it("where `downsample` (its own bucketing) can differ in the last bucket, the reference decides", () => {
    // The speed peer splits buckets its own way; on the rounding edge its last bucket
    // may pick another sample. Only the reference is the oracle.
    let differences = 0;
    for (const [n, threshold] of roundingEdges(25)) {
      for (let seed = 0; seed < 5; seed++) {
        const s = randomWalk(n, 1_000 * n + seed, { spikes: 0.2 });
        const kept = downsampleLTTB(
          Array.from(s.t, (x, i) => ({ x, y: s.v[i] })),
          threshold,
        ) as unknown as { x: number }[];
        const peer = kept.map((p) => s.t.indexOf(p.x));
        if (peer.join() !== referenceIndices(s, threshold).join()) differences++;
      }
    }
    expect(differences).toBeGreaterThan(0);
  });

  it("hand-worked: 0 1 0 3 0 0.5 0 at t = 0…6 to 4 points → 0, 1, 3, 6", () => {
    // every = 5/2 = 2.5; bucket 1 = {1, 2}, bucket 2 = {3, 4, 5}, then the last sample.
    // Bucket 1: a = (0, 0), next bucket's average = (4, 3.5/3);
    //   area(j) = ½|(0 − 4)(v_j − 0) − (0 − t_j)(3.5/3 − 0)|: j=1 → 1.417, j=2 → 1.167 → keep 1.
    // Bucket 2: a = (1, 1), third corner = the last sample (6, 0);
    //   area(j) = ½|(1 − 6)(v_j − 1) − (1 − t_j)(0 − 1)|: j=3 → 6, j=4 → 1, j=5 → 0.75 → keep 3.
    expect(ints(lttb(unitSeries([0, 1, 0, 3, 0, 0.5, 0]), { points: 4 }))).toEqual([0, 1, 3, 6]);
  });

  it("keeps everything when points ≥ samples; first and last for points = 2; empty and one-sample work", () => {
    const s = unitSeries([3, 1, 4, 1, 5]);
    expect(ints(lttb(s, { points: 5 }))).toEqual([0, 1, 2, 3, 4]);
    expect(ints(lttb(s, { points: 50 }))).toEqual([0, 1, 2, 3, 4]);
    expect(ints(lttb(s, { points: 2 }))).toEqual([0, 4]);
    expect(ints(lttb(unitSeries([]), { points: 10 }))).toEqual([]);
    expect(ints(lttb(unitSeries([1]), { points: 10 }))).toEqual([0]);
    expect(() => lttb(s, { points: 1 })).toThrow(/points/);
    expect(() => lttb(s, { points: 2.5 })).toThrow(/points/);
  });
});

/** LTOB as the thesis describes it, written plainly: effective area, LTTB's buckets. */
function referenceLtob(t: number[], v: number[], threshold: number): number[] {
  const n = t.length;
  if (threshold >= n) return t.map((_, i) => i);
  const area = (j: number) =>
    Math.abs((t[j - 1] - t[j + 1]) * (v[j] - v[j - 1]) - (t[j - 1] - t[j]) * (v[j + 1] - v[j - 1])) / 2;
  const every = (n - 2) / (threshold - 2);
  const kept = [0];
  for (let b = 0; b < threshold - 2; b++) {
    let best = -1;
    for (let j = Math.floor(b * every) + 1; j < Math.floor((b + 1) * every) + 1; j++) {
      if (best < 0 || area(j) > area(best)) best = j;
    }
    kept.push(best);
  }
  kept.push(n - 1);
  return kept;
}

describe("ltob — Steinarsson 2013, Largest-Triangle-One-Bucket", () => {
  it("hand-worked: 0 1 0 3 0 0.5 0 at t = 0…6 to 4 points → 0, 2, 3, 6", () => {
    // Effective areas (triangle with both neighbours): j=1 → 1, j=2 → 2, j=3 → 3, j=4 → 1.75,
    // j=5 → 0.5. Buckets as LTTB: {1, 2} → 2, {3, 4, 5} → 3.
    expect(ints(ltob(unitSeries([0, 1, 0, 3, 0, 0.5, 0]), { points: 4 }))).toEqual([0, 2, 3, 6]);
  });

  it("equals the plain reference on random series", () => {
    const rand = mulberry32(9);
    for (let k = 0; k < 40; k++) {
      const n = 3 + Math.floor(rand() * 3_000);
      const threshold = 2 + Math.floor(rand() * (n - 1));
      const s = randomWalk(n, 500 + k, { decimals: k % 2 === 0 ? 1 : undefined });
      expect(ints(ltob(s, { points: threshold }))).toEqual(referenceLtob(Array.from(s.t), Array.from(s.v), threshold));
    }
  });
});
