import { IndexBuffer } from "./index-buffer";
import { optionalGap, optionalInterval, requireNonNegative } from "./params";
import { allIndices, checkShape, failValidation, type Series } from "./series";
import { hasStretches, type SignalParams } from "./signal";
import { selectByStretch } from "./stretches";

export type SwingingDoorParams = Pick<SignalParams, "gapMs"> & {
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
 * With quality or `gapMs`, each stretch between gaps and quality changes is reduced on
 * its own (see stretches.ts), so the samples on both sides of each are kept. The
 * streaming form is {@link createSwingingDoorStream}.
 *
 * @returns kept indices, ascending.
 */
export function swingingDoor(s: Series, p: SwingingDoorParams): Uint32Array {
  const deviation = requireNonNegative("deviation", p.deviation);
  const maxInterval = optionalInterval("maxIntervalMs", p.maxIntervalMs);
  const gapMs = optionalGap(p.gapMs);
  if (hasStretches(s.q, gapMs)) return selectByStretch(s, gapMs, (part) => swingingDoor(part, { deviation, maxIntervalMs: p.maxIntervalMs }));
  checkShape(s);
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
 * The corridor is narrowed without branches (a data-dependent branch here mispredicts
 * about every other sample): the bound and the new slope are stored side by side in a
 * two-slot array, and the comparison's 0 or 1 picks the one read back — exactly what
 * Math.min/max would return, ±∞ included. Narrowing is the one chain from sample to
 * sample, and a store plus an indexed load is a shorter chain than the arithmetic select
 * used before (up·f + upper·(1 − f)): the scan is about a fifth faster. The open
 * corridor is the finite `OPEN` rather than ±∞, which differs from the plain scan only
 * for an infinite slope. So the rare path returns −1 exactly when the slope to the new
 * sample is not finite: a NaN or ±∞ value, or an overflow (a NaN slope fails the
 * corridor test, which is written so that it does). A non-finite timestamp cannot ascend
 * further, and the last sample is checked by checkShape. Nothing follows the loop, so
 * V8's code compiled while it runs (on-stack replacement) stays valid.
 */
function swingFast(t: Float64Array, v: Float64Array, deviation: number, maxInterval: number, kept: IndexBuffer): number {
  const n = t.length;
  kept.push(0);
  let anchor = 0;
  let ta = t[0];
  let va = v[0];
  let tPrev = ta;
  let upper = OPEN;
  let lower = -OPEN;
  const pickUpper = new Float64Array(2);
  const pickLower = new Float64Array(2);
  for (let i = 1; i < n; i++) {
    const ti = t[i];
    const vi = v[i];
    if (!(ti > tPrev)) return -1;
    tPrev = ti;
    // The candidate is sample i − 1 whenever it is not the anchor itself. Right after a
    // new anchor the corridor is OPEN and holds every finite slope, so the test needs no
    // guard for that case; only the max interval does.
    const slope = (vi - va) / (ti - ta);
    if ((ti - ta > maxInterval && i - 1 > anchor) || !(slope <= upper && slope >= lower)) {
      if (slope - slope !== 0) return -1;
      anchor = i - 1;
      kept.push(anchor);
      ta = t[anchor];
      va = v[anchor];
      upper = OPEN;
      lower = -OPEN;
    }
    const dt = ti - ta;
    const dv = vi - va;
    const up = (dv + deviation) / dt;
    const lo = (dv - deviation) / dt;
    pickUpper[0] = upper;
    pickUpper[1] = up;
    pickLower[0] = lower;
    pickLower[1] = lo;
    upper = pickUpper[+(up < upper)];
    lower = pickLower[+(lo > lower)];
  }
  return anchor;
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
