/**
 * A time series on typed arrays: the unit every reduction method works on.
 * `t` is UTC epoch milliseconds, strictly ascending; `v` the values; `q` the optional
 * quality per sample (0 good, 1 uncertain, 2 bad — the severity order of OPC UA status
 * codes; absent means all good). No object per sample, so 10M samples cost 160 MB (t and
 * v) and no more. A value must be finite unless its sample is bad: a bad sample may
 * carry NaN (aggregates give NaN for windows without usable samples).
 */
export type Series = { t: Float64Array; v: Float64Array; q?: Uint8Array };

/** A series whose quality is always given: what aggregations and streams return. */
export type QualifiedSeries = { t: Float64Array; v: Float64Array; q: Uint8Array };

/** Quality severities (OPC UA Part 4 status code severity: Good, Uncertain, Bad). */
export const QUALITY_GOOD = 0;
export const QUALITY_UNCERTAIN = 1;
export const QUALITY_BAD = 2;

/** An input series that breaks the rules above; `index` is the first offending sample. */
export class SeriesError extends Error {
  readonly index: number;
  constructor(message: string, index: number) {
    super(message);
    this.name = "SeriesError";
    this.index = index;
  }
}

/**
 * Checks a series in one pass (common practice; no published source) and throws a
 * {@link SeriesError} naming the first bad index: lengths must agree, timestamps must
 * be finite and strictly ascending (an unsorted or duplicate timestamp is reported at
 * the later sample), values finite unless the sample is bad, qualities 0–2. Empty and
 * one-sample series are valid.
 */
export function validateSeries(s: Series): void {
  checkShape(s);
  const { t, v, q } = s;
  const bad = q === undefined ? firstBadSample(t, v) : firstBadQualified(t, v, q);
  if (bad >= 0) throw sampleError(t, v, bad);
}

/**
 * The O(1) part of {@link validateSeries} plus the quality check: array types, lengths,
 * a finite first and last sample. Methods whose scan checks order and finiteness as it
 * goes call this first and {@link failValidation} when their scan stops, instead of
 * reading the arrays one extra time.
 */
export function checkShape(s: Series): void {
  const { t, v, q } = s;
  if (!(t instanceof Float64Array) || !(v instanceof Float64Array)) {
    throw new TypeError("series.t and series.v must be Float64Array");
  }
  const n = t.length;
  if (v.length !== n) {
    throw new SeriesError(`series.v has ${v.length} samples but series.t has ${n}`, Math.min(n, v.length));
  }
  if (q !== undefined) {
    // Methods take their plain path for a series with quality: validateSeries checks it.
    validateQuality(q, n);
    return;
  }
  if (n === 0) return;
  if (!Number.isFinite(t[0]) || !Number.isFinite(v[0])) throw sampleError(t, v, 0);
  if (!Number.isFinite(t[n - 1]) || !Number.isFinite(v[n - 1])) {
    throw validateAndReturnError(s) ?? sampleError(t, v, n - 1);
  }
}

/** The error validateSeries would throw (the first bad index), or undefined. */
function validateAndReturnError(s: Series): SeriesError | undefined {
  const bad = firstBadSample(s.t, s.v);
  return bad >= 0 ? sampleError(s.t, s.v, bad) : undefined;
}

/**
 * Throws the SeriesError for a series a fused scan stopped on. Returns normally when the
 * series is in fact valid (the scan stopped for another reason, e.g. a float overflow),
 * so the caller can fall back to its plain path.
 */
export function failValidation(s: Series): void {
  validateSeries(s);
}

/**
 * The first sample in [from, to) (from ≥ 1) with a non-finite value or timestamp, or a
 * timestamp not after the previous one; −1 when there is none. Only the loop and
 * returns, so V8's mid-loop compiled code stays valid (nothing after the loop lacks
 * type feedback).
 */
export function firstBadSampleIn(t: Float64Array, v: Float64Array, from: number, to: number): number {
  let prev = t[from - 1];
  for (let i = from; i < to; i++) {
    const ti = t[i];
    // x − x is 0 for finite x and NaN for NaN and ±Infinity.
    if (!(ti > prev) || ti === Infinity || v[i] - v[i] !== 0) return i;
    prev = ti;
  }
  return -1;
}

function firstBadSample(t: Float64Array, v: Float64Array): number {
  const n = t.length;
  if (n === 0) return -1;
  if (t[0] - t[0] !== 0 || v[0] - v[0] !== 0) return 0;
  return firstBadSampleIn(t, v, 1, n);
}

/** As firstBadSample, but a bad sample's value may be anything (NaN included). */
function firstBadQualified(t: Float64Array, v: Float64Array, q: Uint8Array): number {
  let prev = -Infinity;
  for (let i = 0; i < t.length; i++) {
    const ti = t[i];
    if (!(ti > prev) || ti === Infinity || (q[i] !== QUALITY_BAD && v[i] - v[i] !== 0)) return i;
    prev = ti;
  }
  return -1;
}

function sampleError(t: Float64Array, v: Float64Array, i: number): SeriesError {
  const ti = t[i];
  if (!Number.isFinite(ti)) return new SeriesError(`t[${i}] = ${ti} is not a finite timestamp`, i);
  if (i > 0 && !(ti > t[i - 1])) {
    const why = ti === t[i - 1] ? `duplicates t[${i - 1}]` : `is before t[${i - 1}] = ${t[i - 1]}`;
    return new SeriesError(`t[${i}] = ${ti} ${why}: timestamps must be strictly ascending`, i);
  }
  return new SeriesError(`v[${i}] = ${v[i]} is not a finite value (only a bad sample may have one)`, i);
}

function validateQuality(q: Uint8Array, n: number): void {
  if (!(q instanceof Uint8Array)) throw new TypeError("series.q must be a Uint8Array");
  if (q.length !== n) throw new SeriesError(`series.q has ${q.length} samples but series.t has ${n}`, Math.min(n, q.length));
  for (let i = 0; i < n; i++) {
    if (q[i] > QUALITY_BAD) throw new SeriesError(`q[${i}] = ${q[i]} is not a quality (0 good, 1 uncertain, 2 bad)`, i);
  }
}

/** Indices 0 … n−1: what a selection method returns when it keeps everything. */
export function allIndices(n: number): Uint32Array {
  const out = new Uint32Array(n);
  for (let i = 0; i < n; i++) out[i] = i;
  return out;
}

/** The kept indices from a keep-mask (1 = kept) holding exactly `count` ones, ascending. */
export function indicesFromMask(mask: Uint8Array, count: number): Uint32Array {
  const out = new Uint32Array(count);
  let k = 0;
  for (let i = 0; i < mask.length; i++) if (mask[i] !== 0) out[k++] = i;
  return out;
}
