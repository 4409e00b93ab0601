import { QUALITY_BAD, QUALITY_GOOD, QUALITY_UNCERTAIN, type QualifiedSeries, type Series } from "./series";
import { splitWindows, type WindowGrid } from "./windows";

// Module-local copies: hot loops read them without going through import bindings.
const GOOD = QUALITY_GOOD;
const UNCERTAIN = QUALITY_UNCERTAIN;
const BAD = QUALITY_BAD;

/** What an aggregation returns: one sample per window, stamped with the window start. */
export type WindowSeries = QualifiedSeries & {
  /**
   * Share of the window's samples that are good (0–1). `q` is the window quality: good
   * when every sample is good, bad when no sample is usable (v is then NaN, or 0 for
   * counts), uncertain otherwise — OPC UA Part 13's PercentDataGood / PercentDataBad
   * rule at its default of 100 % (recalled from memory), counted by samples here.
   */
  goodShare: Float64Array;
};

/** The samples a kernel reads; q absent means all good. */
export type Samples = { t: Float64Array; v: Float64Array; q: Uint8Array | undefined };

/**
 * One windowed computation, shared by a batch function and its streaming processor so
 * that both do exactly the same arithmetic. Windows are visited in time order, each
 * once; a kernel may carry state from one window to the next (an exceedance's arming, a
 * counter's last value), which only usable samples change.
 */
export interface WindowKernel {
  /** The value depends on the first sample after the window, not only on earlier ones. */
  readonly needsNext: boolean;
  /** A NaN value means the window had no usable time: its quality becomes bad. */
  readonly nanIsBad: boolean;
  /** The value of a window without usable samples. */
  readonly empty: number;
  /**
   * The value of window [start, end) holding samples [from, to) of `s`, at least one of
   * them usable (`allUsable` when every one is). The sample before it (from − 1) exists
   * when from > 0, the one after it (to) when to < length.
   */
  value(s: Samples, from: number, to: number, length: number, start: number, end: number, allUsable: boolean): number;
}

/** The result of one window (reused between windows; no object per window). */
export type WindowSlot = { value: number; quality: number; goodShare: number };

/** Evaluates one window: its value, quality and good share (see {@link WindowSeries}). */
export function evaluateWindow(
  kernel: WindowKernel,
  s: Samples,
  from: number,
  to: number,
  length: number,
  start: number,
  end: number,
  usableMax: number,
  slot: WindowSlot,
): void {
  const { q } = s;
  const all = to - from;
  let good = all;
  let usable = all;
  if (q !== undefined) {
    good = 0;
    usable = 0;
    for (let i = from; i < to; i++) {
      const x = q[i];
      if (x === GOOD) good++;
      if (x <= usableMax) usable++;
    }
  }
  slot.goodShare = good / all;
  if (usable === 0) {
    slot.value = kernel.empty;
    slot.quality = BAD;
    return;
  }
  const value = kernel.value(s, from, to, length, start, end, usable === all);
  slot.value = value;
  slot.quality = kernel.nanIsBad && Number.isNaN(value) ? BAD : good === all ? GOOD : UNCERTAIN;
}

/** Runs a kernel over the windows of a whole series (the batch form of every aggregation). */
export function reduceWindows(s: Series, grid: WindowGrid, kernel: WindowKernel, usableMax: number): WindowSeries {
  const w = splitWindows(s, grid);
  const samples: Samples = { t: s.t, v: s.v, q: s.q };
  const v = new Float64Array(w.count);
  const q = new Uint8Array(w.count);
  const goodShare = new Float64Array(w.count);
  const slot: WindowSlot = { value: 0, quality: 0, goodShare: 0 };
  const n = s.t.length;
  for (let k = 0; k < w.count; k++) {
    evaluateWindow(kernel, samples, w.begin[k], w.begin[k + 1], n, w.start[k], w.end[k], usableMax, slot);
    v[k] = slot.value;
    q[k] = slot.quality;
    goodShare[k] = slot.goodShare;
  }
  return { t: w.start, v, q, goodShare };
}

/** Keeps the windows whose value passes `keep` (exceedance events). */
export function filterWindows(w: WindowSeries, keep: (value: number) => boolean): WindowSeries {
  let count = 0;
  for (let k = 0; k < w.t.length; k++) if (keep(w.v[k])) count++;
  const out: WindowSeries = { t: new Float64Array(count), v: new Float64Array(count), q: new Uint8Array(count), goodShare: new Float64Array(count) };
  for (let k = 0, j = 0; k < w.t.length; k++) {
    if (!keep(w.v[k])) continue;
    out.t[j] = w.t[k];
    out.v[j] = w.v[k];
    out.q[j] = w.q[k];
    out.goodShare[j++] = w.goodShare[k];
  }
  return out;
}
