import { IndexBuffer } from "./index-buffer";
import { optionalInterval, requireNonNegative } from "./params";
import { allIndices, checkShape, failValidation, type Series } from "./series";

export type SwingingDoorParams = {
  /** Half-width of the corridor, in the tag's engineering unit (see percentOfRange). */
  deviation: number;
  /** Keep a sample at least this often (ms), unless two neighbours are further apart. */
  maxIntervalMs?: number;
};

/**
 * Swinging door trending — E. H. Bristol, "Swinging door trending: adaptive trend
 * recording?", ISA National Conference, 1990 — in the formulation of DESIGN.md: keep
 * the first sample as the anchor with an open corridor of slopes; for each new sample,
 * if the slope from the anchor to it leaves the corridor narrowed by the samples since
 * the anchor, keep the previous sample (the candidate) and make it the anchor; then
 * narrow the corridor with the new sample:
 * upper = min(upper, (v − vₐ + deviation)/Δt), lower = max(lower, (v − vₐ − deviation)/Δt).
 * With `maxIntervalMs`, the candidate is also kept before a sample that would stretch
 * the time from the anchor past the interval. First and last samples are always kept.
 *
 * Invariant: every dropped sample lies within ±deviation of the straight line between
 * the kept samples around it, so `deviation` bounds the linear reconstruction error.
 *
 * @returns kept indices, ascending.
 */
export function swingingDoor(s: Series, p: SwingingDoorParams): Uint32Array {
  checkShape(s);
  const deviation = requireNonNegative("deviation", p.deviation);
  const maxInterval = optionalInterval("maxIntervalMs", p.maxIntervalMs);
  const { t, v } = s;
  const n = t.length;
  if (n <= 2) {
    failValidation(s);
    return allIndices(n);
  }
  let kept = new IndexBuffer(n >>> 5);
  let anchor = swingFast(t, v, deviation, maxInterval, kept);
  if (anchor < 0) {
    failValidation(s); // throws for an invalid series; a valid one overflowed a slope
    kept = new IndexBuffer(n >>> 5);
    anchor = swingPlain(t, v, deviation, maxInterval, kept);
  }
  if (anchor !== n - 1) kept.push(n - 1);
  return kept.toArray();
}

const OPEN = Number.MAX_VALUE;

/**
 * The scan, checking order and finiteness as it goes; returns the last anchor, or −1
 * when a timestamp does not ascend, a value is not finite or a slope overflows.
 *
 * Same decisions as {@link swingPlain}, arranged for speed:
 * - The corridor is narrowed without data-dependent branches (one here mispredicts
 *   about every other sample): with f ∈ {0, 1}, a·f + b·(1 − f) is exactly a or b when
 *   both are finite, so it equals min/max — hence the finite `OPEN` bound.
 * - Samples go in pairs, so the corridor carried from pair to pair takes one such
 *   select per pair: min(upper, min(up₁, up₂)) — min is associative — while the
 *   corridor the second sample is tested against, min(upper, up₁), is off that chain.
 * - A non-finite value or overflowing slope makes the corridor NaN or infinite, which
 *   fails the next corridor test (written so that NaN fails it); the check on that rare
 *   path reports it, and the caller falls back to the plain scan or throws.
 * Nothing follows the loop, so V8's code compiled while it runs (on-stack replacement)
 * stays valid; the odd sample, if any, is handled before it.
 */
function swingFast(t: Float64Array, v: Float64Array, deviation: number, maxInterval: number, kept: IndexBuffer): number {
  const n = t.length;
  kept.push(0);
  let anchor = 0;
  let ta = t[0];
  let va = v[0];
  let tPrev = ta;
  // The corridor before sample i. Sample 1 narrows the open corridor (no test: its
  // candidate would be the anchor itself) when the samples after the first are odd.
  let upper = OPEN;
  let lower = -OPEN;
  let i = 1;
  if ((n - 1) % 2 === 1) {
    if (!(t[1] > ta)) return -1;
    tPrev = t[1];
    upper = select((v[1] - va + deviation) / (t[1] - ta), OPEN);
    lower = -select(-((v[1] - va - deviation) / (t[1] - ta)), OPEN);
    i = 2;
  }
  for (; i + 1 < n; i += 2) {
    const t1 = t[i];
    const v1 = v[i];
    if (!(t1 > tPrev)) return -1;
    const s1 = (v1 - va) / (t1 - ta);
    if ((t1 - ta > maxInterval && i - 1 > anchor) || !(s1 <= upper && s1 >= lower)) {
      if (s1 - s1 + (upper - upper) + (lower - lower) !== 0) return -1;
      anchor = i - 1;
      kept.push(anchor);
      ta = tPrev;
      va = v[anchor];
      upper = OPEN;
      lower = -OPEN;
    }
    const dt1 = t1 - ta;
    const dv1 = v1 - va;
    const up1 = (dv1 + deviation) / dt1;
    const lo1 = (dv1 - deviation) / dt1;
    let f = +(up1 < upper);
    const u1 = up1 * f + upper * (1 - f);
    f = +(lo1 > lower);
    const l1 = lo1 * f + lower * (1 - f);

    // Sample i + 1, tested against the corridor [l1, u1].
    const t2 = t[i + 1];
    const v2 = v[i + 1];
    if (!(t2 > t1)) return -1;
    tPrev = t2;
    const s2 = (v2 - va) / (t2 - ta);
    if ((t2 - ta > maxInterval && i > anchor) || !(s2 <= u1 && s2 >= l1)) {
      if (s2 - s2 + (u1 - u1) + (l1 - l1) !== 0) return -1;
      anchor = i;
      kept.push(anchor);
      ta = t1;
      va = v1;
      const dt = t2 - ta;
      const dv = v2 - va;
      upper = select((dv + deviation) / dt, OPEN);
      lower = -select(-((dv - deviation) / dt), OPEN);
      continue;
    }
    const dt2 = t2 - ta;
    const dv2 = v2 - va;
    const up2 = (dv2 + deviation) / dt2;
    const lo2 = (dv2 - deviation) / dt2;
    f = +(up2 < up1);
    const pu = up2 * f + up1 * (1 - f);
    f = +(lo2 > lo1);
    const pl = lo2 * f + lo1 * (1 - f);
    f = +(pu < upper);
    upper = pu * f + upper * (1 - f);
    f = +(pl > lower);
    lower = pl * f + lower * (1 - f);
  }
  return anchor;
}

/** min(a, b) as the exact select a·f + b·(1 − f); NaN when a is not finite. */
function select(a: number, b: number): number {
  const f = +(a < b);
  return a * f + b * (1 - f);
}

/** The same scan, word for word as DESIGN.md states it (Infinity, min, max). */
function swingPlain(t: Float64Array, v: Float64Array, deviation: number, maxInterval: number, kept: IndexBuffer): number {
  const n = t.length;
  kept.push(0);
  let anchor = 0;
  let upper = Infinity;
  let lower = -Infinity;
  for (let i = 1; i < n; i++) {
    if (i - 1 > anchor) {
      const slope = (v[i] - v[anchor]) / (t[i] - t[anchor]);
      if (t[i] - t[anchor] > maxInterval || slope > upper || slope < lower) {
        anchor = i - 1;
        kept.push(anchor);
        upper = Infinity;
        lower = -Infinity;
      }
    }
    const dt = t[i] - t[anchor];
    upper = Math.min(upper, (v[i] - v[anchor] + deviation) / dt);
    lower = Math.max(lower, (v[i] - v[anchor] - deviation) / dt);
  }
  return anchor;
}
