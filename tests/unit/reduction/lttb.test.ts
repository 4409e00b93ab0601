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
