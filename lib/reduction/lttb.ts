import { optionalGap, requireInteger } from "./params";
import { allIndices, checkShape, failValidation, firstBadSampleIn, type Series, validateSeries } from "./series";
import { hasStretches, type SignalParams } from "./signal";
import { selectByStretchBudget } from "./stretches";

export type BucketParams = Pick<SignalParams, "gapMs"> & {
  /** Number of samples to keep, first and last included (integer ≥ 2). */
  points: number;
};

/**
 * Largest-Triangle-Three-Buckets — S. Steinarsson, "Downsampling Time Series for Visual
 * Representation", MSc thesis, University of Iceland, 2013. Keeps the first and last
 * samples and one per bucket in between: the one forming the largest triangle with the
 * previously kept sample and the average of the next bucket.
 *
 * Bucket bounds, averages and the area expression follow the author's reference
 * function operation for operation (the `downsample-lttb` npm package is a copy), so
 * the kept indices are identical to it — including the last bucket, whose bounds come
 * from floor((threshold − 2) × every) and can fall one sample short through float
 * rounding. Timestamps are used as given (epoch ms), as the reference does.
 *
 * With quality or `gapMs`, the ends of every stretch between gaps and quality changes are
 * kept and the remaining points are shared among the stretches (see stretches.ts).
 *
 * Batch-only by nature: a bucket's choice depends on the average of the next bucket and
 * the buckets on the whole series' length, so no sample can be decided before the end.
 *
 * @returns kept indices, ascending; all indices when `points` ≥ the sample count.
 */
export function lttb(s: Series, p: BucketParams): Uint32Array {
  const threshold = requireInteger("points", p.points, 2);
  const gapMs = optionalGap(p.gapMs);
  if (hasStretches(s.q, gapMs)) return selectByStretchBudget(s, gapMs, threshold, (part, points) => lttb(part, { points }));
  checkShape(s);
  const { t, v } = s;
  const n = t.length;
  if (threshold >= n) {
    failValidation(s);
    return allIndices(n);
  }
  const out = new Uint32Array(threshold);
  out[threshold - 1] = n - 1;
  const every = (n - 2) / (threshold - 2);
  // The scan checks the samples it averages, i.e. all from the second bucket on.
  const firstAveraged = threshold > 2 ? Math.floor(every) + 1 : n;
  if (firstBadSampleIn(t, v, 1, firstAveraged) >= 0 || (threshold > 2 && !fillLttb(t, v, out, every))) {
    failValidation(s);
    throw new Error("lttb: the scan stopped on a valid series");
  }
  return out;
}

/**
 * Fills out[1 … threshold − 2]; checks order and finiteness of the samples it averages
 * and returns false at the first bad one. Nothing follows the loop, so V8's code
 * compiled while it runs (on-stack replacement) stays valid.
 *
 * Both inner loops are unrolled by four: V8 checks a typed array's map, bounds and data
 * pointer on every access after anything it treats as a side effect (the loop's own
 * interrupt check among them), so four accesses per check are cheaper than one. The
 * arithmetic and its order are the reference's: the sums add one sample at a time, and
 * every area is the reference's expression. The maximum area is found without branches
 * (a data-dependent branch there mispredicts a few times per bucket, and each miss throws
 * away the work begun on the next bucket): about a third faster, and ties still go to the
 * first sample (see the loop). Finiteness is checked once per bucket on the sums (a NaN
 * or an infinity makes the sum non-finite); only a non-finite sum, which finite values
 * can also produce by overflowing, checks its samples one by one.
 */
function fillLttb(t: Float64Array, v: Float64Array, out: Uint32Array, every: number): boolean {
  const n = t.length;
  const buckets = out.length - 2;
  let a = 0;
  let tPrev = t[Math.floor(every)];
  // Bucket i spans [from, to) with from = floor(i·every) + 1 and to = floor((i + 1)·every) + 1,
  // the reference's expressions; each bound is computed once and handed on to the next bucket.
  let from = 1;
  let to = Math.floor(every) + 1;
  const pick0 = new Float64Array(2);
  const pick1 = new Float64Array(2);
  for (let i = 0; i < buckets; i++) {
    // Average of the next bucket (the third corner of the triangle).
    const next = Math.floor((i + 2) * every) + 1;
    const avgEnd = next < n ? next : n;
    const avgLength = avgEnd - to;
    let avgX = 0;
    let avgY = 0;
    let k = to;
    for (; k + 3 < avgEnd; k += 4) {
      const x0 = t[k];
      const x1 = t[k + 1];
      const x2 = t[k + 2];
      const x3 = t[k + 3];
      const y0 = v[k];
      const y1 = v[k + 1];
      const y2 = v[k + 2];
      const y3 = v[k + 3];
      if (!(x0 > tPrev) || !(x1 > x0) || !(x2 > x1) || !(x3 > x2)) return false;
      tPrev = x3;
      avgX += x0;
      avgY += y0;
      avgX += x1;
      avgY += y1;
      avgX += x2;
      avgY += y2;
      avgX += x3;
      avgY += y3;
    }
    for (; k < avgEnd; k++) {
      const x = t[k];
      if (!(x > tPrev)) return false;
      tPrev = x;
      avgX += x;
      avgY += v[k];
    }
    // x − x is 0 for finite x and NaN for NaN and ±Infinity.
    if (avgX - avgX !== 0 || avgY - avgY !== 0) {
      for (let q = to; q < avgEnd; q++) if (t[q] - t[q] !== 0 || v[q] - v[q] !== 0) return false;
    }
    avgX /= avgLength;
    avgY /= avgLength;

    const ax = t[a];
    const ay = v[a];
    const bx = ax - avgX;
    const by = avgY - ay;
    // The running maximum in two lanes (even and odd offsets from `from`), each without a
    // branch: the comparison's 0 or 1 picks the larger area from a two-slot array and
    // selects the index with a mask. A lane keeps its first sample on a tie (strictly
    // greater replaces), and lane 1 wins the merge only with a greater area or an equal
    // one at a smaller index, so the first sample of the bucket's maximum area is kept,
    // as in the reference. A NaN area (an overflow) never compares greater, as there.
    let max0 = -1;
    let max1 = -1;
    let best0 = from;
    let best1 = from;
    let j = from;
    // The reference's expression, operation for operation.
    for (; j + 3 < to; j += 4) {
      const area0 = Math.abs(bx * (v[j] - ay) - (ax - t[j]) * by) * 0.5;
      const area1 = Math.abs(bx * (v[j + 1] - ay) - (ax - t[j + 1]) * by) * 0.5;
      const area2 = Math.abs(bx * (v[j + 2] - ay) - (ax - t[j + 2]) * by) * 0.5;
      const area3 = Math.abs(bx * (v[j + 3] - ay) - (ax - t[j + 3]) * by) * 0.5;
      const up0 = +(area0 > max0);
      const up1 = +(area1 > max1);
      pick0[0] = max0;
      pick0[1] = area0;
      pick1[0] = max1;
      pick1[1] = area1;
      max0 = pick0[up0];
      max1 = pick1[up1];
      best0 ^= (best0 ^ j) & -up0;
      best1 ^= (best1 ^ (j + 1)) & -up1;
      const up2 = +(area2 > max0);
      const up3 = +(area3 > max1);
      pick0[0] = max0;
      pick0[1] = area2;
      pick1[0] = max1;
      pick1[1] = area3;
      max0 = pick0[up2];
      max1 = pick1[up3];
      best0 ^= (best0 ^ (j + 2)) & -up2;
      best1 ^= (best1 ^ (j + 3)) & -up3;
    }
    for (; j < to; j++) {
      const area = Math.abs(bx * (v[j] - ay) - (ax - t[j]) * by) * 0.5;
      const up = +(area > max0);
      pick0[0] = max0;
      pick0[1] = area;
      max0 = pick0[up];
      best0 ^= (best0 ^ j) & -up;
    }
    const second = +(max1 > max0) | (+(max1 === max0) & +(best1 < best0));
    const best = best0 ^ ((best0 ^ best1) & -second);
    out[i + 1] = best;
    a = best;
    from = to;
    to = next;
  }
  return true;
}

/**
 * Largest-Triangle-One-Bucket — Steinarsson 2013 (thesis, section on LTOB; described
 * here from memory): rank every sample by its effective area, the triangle it forms with
 * its two neighbours (Visvalingam–Whyatt's measure), split the samples into the same
 * buckets as LTTB (first and last samples alone in their own buckets) and keep the
 * highest-ranked sample of each bucket (the first one on a tie). The `downsample` npm
 * package's LTOB splits its buckets differently and is not used as a reference.
 * Stretches as for {@link lttb}. Batch-only by nature: the buckets depend on the whole
 * series' length.
 *
 * @returns kept indices, ascending; all indices when `points` ≥ the sample count.
 */
export function ltob(s: Series, p: BucketParams): Uint32Array {
  const threshold = requireInteger("points", p.points, 2);
  const gapMs = optionalGap(p.gapMs);
  if (hasStretches(s.q, gapMs)) return selectByStretchBudget(s, gapMs, threshold, (part, points) => ltob(part, { points }));
  validateSeries(s);
  const { t, v } = s;
  const n = t.length;
  if (threshold >= n) return allIndices(n);

  const out = new Uint32Array(threshold);
  out[threshold - 1] = n - 1;
  fillLtob(t, v, out, (n - 2) / (threshold - 2));
  return out;
}

/** Fills out[1 … threshold − 2]; nothing follows the loop (see fillLttb). */
function fillLtob(t: Float64Array, v: Float64Array, out: Uint32Array, every: number): void {
  const buckets = out.length - 2;
  for (let i = 0; i < buckets; i++) {
    const from = Math.floor(i * every) + 1;
    const to = Math.floor((i + 1) * every) + 1;
    let maxArea = -1;
    let best = from;
    for (let j = from; j < to; j++) {
      const area = Math.abs((t[j - 1] - t[j + 1]) * (v[j] - v[j - 1]) - (t[j - 1] - t[j]) * (v[j + 1] - v[j - 1]));
      if (area > maxArea) {
        maxArea = area;
        best = j;
      }
    }
    out[i + 1] = best;
  }
}
