import { type Series, SeriesError, validateSeries } from "./series";

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
 * `reduced` is either the kept indices of a selection method or a new series.
 */
export function measure(original: Series, reduced: Uint32Array | Series, p: MeasureParams): Metrics {
  validateSeries(original);
  if (p.reconstruction !== "linear" && p.reconstruction !== "step") {
    throw new RangeError(`reconstruction must be "linear" or "step", got ${String(p.reconstruction)}`);
  }
  const n = original.t.length;
  const r = reduced instanceof Uint32Array ? pick(original, reduced) : reduced;
  if (!(reduced instanceof Uint32Array)) validateSeries(r);
  const m = r.t.length;
  if (n > 0 && m === 0) throw new RangeError("the reduced series is empty but the original is not");

  const errors = new Float64Array(2);
  if (n > 0) reconstructionErrors(original, r, p.reconstruction === "linear", errors);
  const [maxAbsError, squares] = errors;
  const counts = new Uint32Array(2);
  countExtrema(original, r, counts);
  const [extrema, extremaKept] = counts;
  return {
    samplesIn: n,
    samplesOut: m,
    reductionRatio: m === 0 ? 1 : n / m,
    maxAbsError,
    rmse: n === 0 ? 0 : Math.sqrt(squares / n),
    extrema,
    extremaKept,
    extremaKeptShare: extrema === 0 ? 1 : extremaKept / extrema,
  };
}

/** The series of the kept indices; checks they are ascending and in range. */
function pick(s: Series, indices: Uint32Array): Series {
  const n = s.t.length;
  const t = new Float64Array(indices.length);
  const v = new Float64Array(indices.length);
  for (let k = 0; k < indices.length; k++) {
    const i = indices[k];
    if (i >= n) throw new SeriesError(`kept index ${i} at position ${k} is outside the series (${n} samples)`, k);
    if (k > 0 && i <= indices[k - 1]) throw new SeriesError(`kept indices must ascend: position ${k} holds ${i}`, k);
    t[k] = s.t[i];
    v[k] = s.v[i];
  }
  return { t, v };
}

// The loops below write their results into `out` and end with the loop, so V8's code
// compiled while they run (on-stack replacement) stays valid when they end.

/** out[0] = max |error|, out[1] = sum of squared errors, over the original samples. */
function reconstructionErrors(s: Series, r: Series, linear: boolean, out: Float64Array): void {
  const { t, v } = s;
  const rt = r.t;
  const rv = r.v;
  const n = t.length;
  const m = rt.length;
  let maxAbsError = 0;
  let squares = 0;
  let k = 0; // rt[k] ≤ t[i] < rt[k + 1] once t[i] has reached rt[0]
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

/** out[0] = strict local extrema of the original; out[1] = those in r at the same t and v. */
function countExtrema(s: Series, r: Series, out: Uint32Array): void {
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
