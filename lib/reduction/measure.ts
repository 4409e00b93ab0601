import { optionalGap } from "./params";
import { QUALITY_BAD, type Series, SeriesError, validateSeries } from "./series";

// Module-local copy: hot loops read it without going through an import binding.
const BAD = QUALITY_BAD;

export type Metrics = {
  samplesIn: number;
  samplesOut: number;
  /** samplesIn / samplesOut (e.g. 20 for 20:1); 1 for an empty series. */
  reductionRatio: number;
  /** Largest |original − reconstruction| over the original samples. */
  maxAbsError: number;
  /** Root mean square of the same errors. */
  rmse: number;
  /** Strict local extrema of the original (v above both neighbours or below both). */
  extrema: number;
  /** Of those, how many the reduced series keeps (same time and value). */
  extremaKept: number;
  /** extremaKept / extrema; 1 when the original has none. */
  extremaKeptShare: number;
};

export type MeasureParams = {
  /** `linear` for shape methods (swinging door, RDP, LTTB, M4); `step` for deadband. */
  reconstruction: "linear" | "step";
  /** A step of the original longer than this (ms) is a gap (default: none). */
  gapMs?: number;
};

/**
 * Accuracy and savings of a reduction — common practice (DESIGN.md, Metrics): the
 * original is compared, sample by sample, with the reconstruction from the reduced
 * series — straight lines between reduced samples (`linear`) or each reduced value held
 * until the next (`step`). Before the first reduced sample the first reduced value is
 * used, after the last the last (selection methods keep both ends, so this only matters
 * for aggregated series). Linear reconstruction computes v₁ + (t − t₁)·((v₂ − v₁)/(t₂ − t₁)),
 * the same expression RDP's vertical distance uses, so its bound holds exactly.
 *
 * Signals (DESIGN.md): bad samples are not measured (original) nor reconstructed from
 * (reduced), and RMSE averages over the usable original samples. With `gapMs`, nothing is
 * interpolated across a gap of the original: each stretch between gaps is reconstructed
 * from the reduced samples inside it, its first reduced value held before them and its
 * last after (a stretch without reduced samples holds the last value before it); a local
 * extremum counts only with both neighbours usable and no gap beside it.
 *
 * `reduced` is either the kept indices of a selection method or a new series.
 */
export function measure(original: Series, reduced: Uint32Array | Series, p: MeasureParams): Metrics {
  validateSeries(original);
  if (p.reconstruction !== "linear" && p.reconstruction !== "step") {
    throw new RangeError(`reconstruction must be "linear" or "step", got ${String(p.reconstruction)}`);
  }
  const gapMs = optionalGap(p.gapMs);
  const n = original.t.length;
  const r = reduced instanceof Uint32Array ? pick(original, reduced) : reduced;
  if (!(reduced instanceof Uint32Array)) validateSeries(r);
  const samplesOut = r.t.length;
  const usable = usableReduced(r, original, gapMs);
  const measured = original.q === undefined ? n : countUsable(original.q);
  if (measured > 0 && usable.t.length === 0) throw new RangeError("the reduced series has no usable sample but the original has");

  const plainSignal = original.q === undefined && gapMs === Infinity;
  const errors = new Float64Array(2);
  if (measured > 0 && plainSignal) plainReconstructionErrors(original, usable, p.reconstruction === "linear", errors);
  else if (measured > 0) reconstructionErrors(original, usable, p.reconstruction === "linear", gapMs, errors);
  const [maxAbsError, squares] = errors;
  const counts = new Uint32Array(2);
  if (plainSignal) plainCountExtrema(original, usable, counts);
  else countExtrema(original, usable, gapMs, counts);
  const [extrema, extremaKept] = counts;
  return {
    samplesIn: n,
    samplesOut,
    reductionRatio: samplesOut === 0 ? 1 : n / samplesOut,
    maxAbsError,
    rmse: measured === 0 ? 0 : Math.sqrt(squares / measured),
    extrema,
    extremaKept,
    extremaKeptShare: extrema === 0 ? 1 : extremaKept / extrema,
  };
}

/** The reduced series without its bad samples, with the original stretch of each sample. */
type Reduced = { t: Float64Array; v: Float64Array; stretch: Float64Array };

function usableReduced(r: Series, original: Series, gapMs: number): Reduced {
  const m = r.q === undefined ? r.t.length : countUsable(r.q);
  const out: Reduced = { t: new Float64Array(m), v: new Float64Array(m), stretch: new Float64Array(m) };
  const ot = original.t;
  let gaps = 0;
  let i = gapMs === Infinity ? ot.length : 1; // no gaps: every stretch number stays 0
  for (let k = 0, j = 0; k < r.t.length; k++) {
    if (r.q !== undefined && r.q[k] === BAD) continue;
    // Stretch of r.t[k]: the gaps of the original that start at or before it.
    while (i < ot.length && ot[i] <= r.t[k]) {
      if (ot[i] - ot[i - 1] > gapMs) gaps++;
      i++;
    }
    out.t[j] = r.t[k];
    out.v[j] = r.v[k];
    out.stretch[j++] = gaps;
  }
  return out;
}

function countUsable(q: Uint8Array): number {
  let count = 0;
  for (let i = 0; i < q.length; i++) if (q[i] !== BAD) count++;
  return count;
}

/** The series of the kept indices; checks they are ascending and in range. */
function pick(s: Series, indices: Uint32Array): Series {
  const n = s.t.length;
  const t = new Float64Array(indices.length);
  const v = new Float64Array(indices.length);
  const q = s.q === undefined ? undefined : new Uint8Array(indices.length);
  for (let k = 0; k < indices.length; k++) {
    const i = indices[k];
    if (i >= n) throw new SeriesError(`kept index ${i} at position ${k} is outside the series (${n} samples)`, k);
    if (k > 0 && i <= indices[k - 1]) throw new SeriesError(`kept indices must ascend: position ${k} holds ${i}`, k);
    t[k] = s.t[i];
    v[k] = s.v[i];
    if (q !== undefined) q[k] = (s.q as Uint8Array)[i];
  }
  return { t, v, q };
}

// The loops below write their results into `out` and end with the loop, so V8's code
// compiled while they run (on-stack replacement) stays valid when they end.

/** out[0] = max |error|, out[1] = sum of squared errors, over the usable original samples. */
function reconstructionErrors(s: Series, r: Reduced, linear: boolean, gapMs: number, out: Float64Array): void {
  const { t, v, q } = s;
  const rt = r.t;
  const rv = r.v;
  const rs = r.stretch;
  const n = t.length;
  const m = rt.length;
  let maxAbsError = 0;
  let squares = 0;
  let stretch = 0;
  let k = 0; // rt[k] ≤ t[i] < rt[k + 1] once t[i] has reached rt[0]
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    if (i > 0 && ti - t[i - 1] > gapMs) stretch++;
    if (q !== undefined && q[i] === BAD) continue;
    while (k + 1 < m && rt[k + 1] <= ti) k++;
    let x: number;
    if (ti <= rt[k] || k + 1 === m) x = rv[k];
    else if (rs[k] !== rs[k + 1]) x = rs[k + 1] === stretch ? rv[k + 1] : rv[k];
    else x = linear ? rv[k] + (ti - rt[k]) * ((rv[k + 1] - rv[k]) / (rt[k + 1] - rt[k])) : rv[k];
    const e = Math.abs(v[i] - x);
    if (e > maxAbsError) maxAbsError = e;
    squares += e * e;
    out[0] = maxAbsError;
    out[1] = squares;
  }
}

/**
 * out[0] = strict local extrema of the original (both neighbours usable, no gap beside);
 * out[1] = those in r at the same t and v.
 */
function countExtrema(s: Series, r: Reduced, gapMs: number, out: Uint32Array): void {
  const { t, v, q } = s;
  const rt = r.t;
  const rv = r.v;
  let k = 0;
  for (let i = 1; i + 1 < t.length; i++) {
    if (q !== undefined && (q[i - 1] === BAD || q[i] === BAD || q[i + 1] === BAD)) continue;
    if (t[i] - t[i - 1] > gapMs || t[i + 1] - t[i] > gapMs) continue;
    const x = v[i];
    if ((x > v[i - 1] && x > v[i + 1]) || (x < v[i - 1] && x < v[i + 1])) {
      out[0]++;
      while (k < rt.length && rt[k] < t[i]) k++;
      if (k < rt.length && rt[k] === t[i] && rv[k] === x) out[1]++;
    }
  }
}

// Without quality and gaps every sample is measured and no stretch ends: the same
// arithmetic with fewer tests per sample (the loops of the first version of measure).

function plainReconstructionErrors(s: Series, r: Reduced, linear: boolean, out: Float64Array): void {
  const { t, v } = s;
  const rt = r.t;
  const rv = r.v;
  const n = t.length;
  const m = rt.length;
  let maxAbsError = 0;
  let squares = 0;
  let k = 0;
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    while (k + 1 < m && rt[k + 1] <= ti) k++;
    const x =
      !linear || ti <= rt[k] || k + 1 === m ? rv[k] : rv[k] + (ti - rt[k]) * ((rv[k + 1] - rv[k]) / (rt[k + 1] - rt[k]));
    const e = Math.abs(v[i] - x);
    if (e > maxAbsError) maxAbsError = e;
    squares += e * e;
    out[0] = maxAbsError;
    out[1] = squares;
  }
}

function plainCountExtrema(s: Series, r: Reduced, out: Uint32Array): void {
  const { t, v } = s;
  const rt = r.t;
  const rv = r.v;
  let k = 0;
  for (let i = 1; i + 1 < t.length; i++) {
    const x = v[i];
    if ((x > v[i - 1] && x > v[i + 1]) || (x < v[i - 1] && x < v[i + 1])) {
      out[0]++;
      while (k < rt.length && rt[k] < t[i]) k++;
      if (k < rt.length && rt[k] === t[i] && rv[k] === x) out[1]++;
    }
  }
}
