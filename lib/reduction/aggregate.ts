import { requireFinite } from "./params";
import type { Series } from "./series";
import { timeWeightedMean } from "./time-average";
import * as stats from "./window-stats";
import { splitWindows, type WindowParams, windowParams, type Windows } from "./windows";

/** The window statistics `aggregate` computes (OPC UA Part 13 names in its JSDoc). */
export const AGGREGATE_FNS = [
  "mean",
  "timeWeightedMean",
  "min",
  "max",
  "range",
  "sum",
  "count",
  "first",
  "last",
  "median",
  "mode",
  "stdevPopulation",
  "stdevSample",
  "percentile",
] as const;
export type AggregateFn = (typeof AGGREGATE_FNS)[number];

export type AggregateParams = WindowParams & {
  fn: AggregateFn;
  /** For fn = percentile: 0–100 (Hyndman & Fan type 7). */
  percentile?: number;
  /** For fn = timeWeightedMean: step-hold or straight lines between samples (default linear). */
  interpolation?: "step" | "linear";
};

type WindowFn = (v: Float64Array, from: number, to: number) => number;

const SIMPLE: Partial<Record<AggregateFn, WindowFn>> = {
  mean: stats.windowMean,
  min: stats.windowMin,
  max: stats.windowMax,
  range: stats.windowRange,
  sum: stats.windowSum,
  count: (_v, from, to) => to - from,
  first: (v, from) => v[from],
  last: (v, _from, to) => v[to - 1],
  stdevPopulation: stats.windowStdevPopulation,
  stdevSample: stats.windowStdevSample,
};

/**
 * Windowed aggregates — definitions of OPC UA Part 13 (Aggregates): Average (mean),
 * TimeAverage (timeWeightedMean, see time-average.ts), Minimum, Maximum, Range, Total
 * (sum of values here, not a time integral), Count, Start (first), End (last), and the
 * standard deviations and percentiles Part 13 lists (population / sample). Median and
 * percentile use Hyndman & Fan type 7 (The American Statistician, 1996); mode is the
 * most frequent value, the smallest on a tie. Reference values in tests: simple-statistics.
 *
 * Windows align to the epoch plus `offsetMs`; each output sample is stamped with its
 * window start; windows without samples are absent. A one-sample window has a sample
 * standard deviation of NaN.
 */
export function aggregate(s: Series, p: AggregateParams): Series {
  const [windowMs, offsetMs] = windowParams(p);
  const fn = p.fn;
  if (!AGGREGATE_FNS.includes(fn)) throw new RangeError(`fn must be one of ${AGGREGATE_FNS.join(", ")}, got ${String(fn)}`);
  const { t, v } = s;
  const w = splitWindows(s, windowMs, offsetMs);
  const out = new Float64Array(w.count);
  const { begin, start } = w;

  const simple = SIMPLE[fn];
  if (simple !== undefined) {
    applyToWindows(simple, v, begin, w.count, out);
  } else if (fn === "timeWeightedMean") {
    const interpolation = p.interpolation ?? "linear";
    if (interpolation !== "step" && interpolation !== "linear") {
      throw new RangeError(`interpolation must be "step" or "linear", got ${String(interpolation)}`);
    }
    timeAverages(t, v, w, interpolation === "linear", out);
  } else {
    const q = fn === "median" ? 0.5 : fn === "percentile" ? percentileParam(p.percentile) / 100 : NaN;
    const scratch = new Float64Array(widestWindow(begin, w.count));
    if (fn === "mode") sortedStatistic((x) => stats.modeSorted(x), v, begin, w.count, scratch, out);
    else sortedStatistic((x) => stats.quantileSorted(x, q), v, begin, w.count, scratch, out);
  }
  return { t: start, v: out };
}

// The loops below stand alone with nothing after them, so V8's code compiled while they
// run (on-stack replacement) stays valid when they end.

function applyToWindows(fn: WindowFn, v: Float64Array, begin: Uint32Array, count: number, out: Float64Array): void {
  for (let k = 0; k < count; k++) out[k] = fn(v, begin[k], begin[k + 1]);
}

function timeAverages(t: Float64Array, v: Float64Array, w: Windows, linear: boolean, out: Float64Array): void {
  const { begin, start, windowMs, count } = w;
  for (let k = 0; k < count; k++) {
    out[k] = timeWeightedMean(t, v, begin[k], begin[k + 1], start[k], start[k] + windowMs, linear);
  }
}

function widestWindow(begin: Uint32Array, count: number): number {
  let widest = 0;
  for (let k = 0; k < count; k++) if (begin[k + 1] - begin[k] > widest) widest = begin[k + 1] - begin[k];
  return widest;
}

function sortedStatistic(
  statistic: (sorted: Float64Array) => number,
  v: Float64Array,
  begin: Uint32Array,
  count: number,
  scratch: Float64Array,
  out: Float64Array,
): void {
  for (let k = 0; k < count; k++) {
    const sorted = scratch.subarray(0, begin[k + 1] - begin[k]);
    sorted.set(v.subarray(begin[k], begin[k + 1]));
    sorted.sort();
    out[k] = statistic(sorted);
  }
}

function percentileParam(value: number | undefined): number {
  if (value === undefined) throw new RangeError("fn percentile needs a percentile (0–100)");
  requireFinite("percentile", value);
  if (value < 0 || value > 100) throw new RangeError(`percentile must be within 0–100, got ${value}`);
  return value;
}
