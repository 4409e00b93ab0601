import { IndexBuffer } from "./index-buffer";
import { optionalGap, optionalInterval, requireFinite, requireNonNegative } from "./params";
import { allIndices, checkShape, failValidation, type Series } from "./series";
import { hasStretches, type SignalParams } from "./signal";
import { selectByStretch } from "./stretches";

export type DeadbandParams = Pick<SignalParams, "gapMs"> & {
  /** Absolute deadband in the tag's engineering unit (see percentOfRange). */
  deadband: number;
  /** Keep a sample at least this often (ms), unless two neighbours are further apart. */
  maxIntervalMs?: number;
};

/**
 * Absolute deadband — OPC UA Part 4 (Services), DataChangeFilter with
 * DeadbandType Absolute: a sample is reported when |v − last reported value| > deadband
 * (strictly). The receiver reconstructs by step-hold.
 *
 * `maxIntervalMs` (common practice, a "max silence" heartbeat; not part of OPC UA): when
 * a sample would stretch the time since the last kept sample past the interval, the
 * sample before it is kept first (and becomes the reference value). So no two
 * consecutive kept samples are further apart than the interval unless they are
 * neighbours in the input. First and last samples are always kept.
 *
 * With quality or `gapMs`, each stretch between gaps and quality changes is reduced on
 * its own (see stretches.ts). The streaming form is {@link createDeadbandStream}.
 *
 * @returns kept indices, ascending.
 */
export function deadband(s: Series, p: DeadbandParams): Uint32Array {
  const band = requireNonNegative("deadband", p.deadband);
  const maxInterval = optionalInterval("maxIntervalMs", p.maxIntervalMs);
  const gapMs = optionalGap(p.gapMs);
  if (hasStretches(s.q, gapMs)) return selectByStretch(s, gapMs, (part) => deadband(part, { deadband: band, maxIntervalMs: p.maxIntervalMs }));
  checkShape(s);
  const { t, v } = s;
  const n = t.length;
  if (n <= 2) {
    failValidation(s);
    return allIndices(n);
  }
  const kept = new IndexBuffer(n >>> 5);
  const last = keepOutsideBand(t, v, band, maxInterval, kept);
  if (last < 0) {
    failValidation(s);
    throw new Error("deadband: the scan stopped on a valid series");
  }
  if (last !== n - 1) kept.push(n - 1);
  return kept.toArray();
}

/**
 * The scan, checking order and finiteness as it goes; returns the last kept index, or
 * −1 at a timestamp that does not ascend or a value that is not finite. Nothing follows
 * the loop, so V8's code compiled while it runs (on-stack replacement) stays valid.
 */
function keepOutsideBand(t: Float64Array, v: Float64Array, band: number, maxInterval: number, kept: IndexBuffer): number {
  const n = t.length;
  kept.push(0);
  let last = 0;
  let tLast = t[0];
  let vLast = v[0];
  let tPrev = tLast;
  for (let i = 1; i < n; i++) {
    const ti = t[i];
    const vi = v[i];
    if (!(ti > tPrev) || vi - vi !== 0) return -1;
    tPrev = ti;
    if (ti - tLast > maxInterval && i - 1 > last) {
      last = i - 1;
      kept.push(last);
      tLast = t[last];
      vLast = v[last];
    }
    const d = vi - vLast;
    if (d > band || -d > band) {
      last = i;
      kept.push(i);
      tLast = ti;
      vLast = vi;
    }
  }
  return last;
}

/**
 * Converts a percent deadband to an absolute one — OPC UA Part 8 (Data Access),
 * PercentDeadband: deadband = (percent / 100) × (EURange.high − EURange.low) (formula
 * as recalled from the specification, and as DESIGN.md states it).
 * Throws when percent is outside 0–100 or low ≥ high.
 */
export function percentOfRange(percent: number, low: number, high: number): number {
  requireFinite("percent", percent);
  requireFinite("low", low);
  requireFinite("high", high);
  if (percent < 0 || percent > 100) throw new RangeError(`percent must be within 0–100, got ${percent}`);
  if (!(low < high)) throw new RangeError(`engineering range low (${low}) must be below high (${high})`);
  return (percent / 100) * (high - low);
}
