import { QUALITY_BAD, type Series, validateSeries } from "@/lib/reduction";

// Module-local copy: hot loops read it without going through an import binding.
const BAD = QUALITY_BAD;

/**
 * The reconstruction errors of lib/reduction/measure.ts without the extrema count, for a
 * sweep that measures one original against many reduced series: the same loops and the
 * same arithmetic in the same order (so the same max error and RMSE, to the bit), with
 * the original validated and its usable samples counted once, and the reduced samples
 * copied into buffers kept from one call to the next. Keep in step with measure.ts.
 *
 * Call {@link SweepMeasure.errors} only where measureOutput in ./run.ts would call measure
 * with a reconstruction: a reduced series with a usable sample.
 */
export class SweepMeasure {
  private readonly measured: number;
  private readonly gapMs: number;
  /** The time of each sample of the original that follows a gap, ascending. */
  private readonly gapTimes: Float64Array;
  private t = new Float64Array(0);
  private v = new Float64Array(0);
  private stretch = new Float64Array(0);
  private readonly out = new Float64Array(2);

  /** `original` must already be valid (runProfile validated it); gapMs as from measureGapMs. */
  constructor(
    private readonly original: Series,
    gapMs: number | undefined,
  ) {
    this.gapMs = gapMs === undefined ? Infinity : gapMs;
    this.measured = original.q === undefined ? original.t.length : countUsable(original.q);
    this.gapTimes = gapTimes(original.t, this.gapMs);
  }

  /**
   * [maxAbsError, rmse] of a reduced series (as measure takes it) against the original:
   * `reduced` itself, or with `indices` the samples of `reduced` at those indices (the
   * series pick() would give, without the copy; it must then be valid already).
   */
  errors(reduced: Series, indices: Uint32Array | null, linear: boolean): [number, number] {
    if (indices === null) validateSeries(reduced);
    const { original, gapMs, measured } = this;
    const m = this.usableReduced(reduced, indices);
    if (measured > 0 && m === 0) throw new RangeError("the reduced series has no usable sample but the original has");
    const out = this.out;
    out[0] = 0;
    out[1] = 0;
    const rt = this.t.subarray(0, m);
    const rv = this.v.subarray(0, m);
    if (measured > 0 && original.q === undefined && gapMs === Infinity) plainReconstructionErrors(original, rt, rv, linear, out);
    else if (measured > 0) reconstructionErrors(original, rt, rv, this.stretch.subarray(0, m), linear, gapMs, out);
    return [out[0], measured === 0 ? 0 : Math.sqrt(out[1] / measured)];
  }

  /**
   * measure.ts's usableReduced into the kept buffers; returns the number of usable
   * samples. The stretch of a sample — the gaps of the original starting at or before
   * it — is counted on the gap times found once rather than on every original sample.
   */
  private usableReduced(r: Series, indices: Uint32Array | null): number {
    const count = indices === null ? r.t.length : indices.length;
    if (this.t.length < count) {
      this.t = new Float64Array(count);
      this.v = new Float64Array(count);
      this.stretch = new Float64Array(count);
    }
    if (indices === null) return fillUsable(r.t, r.v, r.q, this.gapTimes, this.t, this.v, this.stretch);
    return fillUsableAt(r.t, r.v, r.q, indices, this.gapTimes, this.t, this.v, this.stretch);
  }
}

function gapTimes(t: Float64Array, gapMs: number): Float64Array {
  const times: number[] = [];
  if (gapMs !== Infinity) for (let i = 1; i < t.length; i++) if (t[i] - t[i - 1] > gapMs) times.push(t[i]);
  return Float64Array.from(times);
}

function fillUsable(t: Float64Array, v: Float64Array, q: Uint8Array | undefined, gaps: Float64Array, outT: Float64Array, outV: Float64Array, outStretch: Float64Array): number {
  let g = 0;
  let j = 0;
  for (let k = 0; k < t.length; k++) {
    if (q !== undefined && q[k] === BAD) continue;
    const tk = t[k];
    while (g < gaps.length && gaps[g] <= tk) g++;
    outT[j] = tk;
    outV[j] = v[k];
    outStretch[j++] = g;
  }
  return j;
}

function fillUsableAt(
  t: Float64Array,
  v: Float64Array,
  q: Uint8Array | undefined,
  indices: Uint32Array,
  gaps: Float64Array,
  outT: Float64Array,
  outV: Float64Array,
  outStretch: Float64Array,
): number {
  let g = 0;
  let j = 0;
  for (let k = 0; k < indices.length; k++) {
    const i = indices[k];
    if (q !== undefined && q[i] === BAD) continue;
    const ti = t[i];
    while (g < gaps.length && gaps[g] <= ti) g++;
    outT[j] = ti;
    outV[j] = v[i];
    outStretch[j++] = g;
  }
  return j;
}

function countUsable(q: Uint8Array): number {
  let count = 0;
  for (let i = 0; i < q.length; i++) if (q[i] !== BAD) count++;
  return count;
}

// The two loops of measure.ts, word for word; they end with the loop (see there).

function reconstructionErrors(s: Series, rt: Float64Array, rv: Float64Array, rs: Float64Array, linear: boolean, gapMs: number, out: Float64Array): void {
  const { t, v, q } = s;
  const n = t.length;
  const m = rt.length;
  let maxAbsError = 0;
  let squares = 0;
  let stretch = 0;
  let k = 0;
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

function plainReconstructionErrors(s: Series, rt: Float64Array, rv: Float64Array, linear: boolean, out: Float64Array): void {
  const { t, v } = s;
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
