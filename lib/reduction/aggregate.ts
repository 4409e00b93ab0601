import { requireFinite } from "./params";
import type { Series } from "./series";
import { type SignalParams, signalParams } from "./signal";
import { timeWeightedMean } from "./time-average";
import { reduceWindows, type Samples, type WindowKernel, type WindowSeries } from "./window-kernel";
import * as stats from "./window-stats";
import { type WindowParams, windowGrid } from "./windows";

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

export type AggregateParams = WindowParams &
  SignalParams & {
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
 * Windows align to the epoch plus `offsetMs`, or to the local calendar of `timeZone`;
 * each output sample is stamped with its window start; windows without samples are
 * absent. Only usable samples enter a statistic — good ones, and uncertain ones with
 * `includeUncertain` (DESIGN.md "Signals"); the output carries each window's quality and
 * good share ({@link WindowSeries}). A one-sample window has a sample standard deviation
 * of NaN. The streaming form is {@link createAggregateStream}.
 */
export function aggregate(s: Series, p: AggregateParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, aggregateKernel(p), usableMax);
}

/** The kernel of {@link aggregate}, shared with its streaming form; checks the parameters. */
export function aggregateKernel(p: AggregateParams): WindowKernel {
  const fn = p.fn;
  if (!AGGREGATE_FNS.includes(fn)) throw new RangeError(`fn must be one of ${AGGREGATE_FNS.join(", ")}, got ${String(fn)}`);
  const [gapMs, usableMax] = signalParams(p);
  if (fn === "timeWeightedMean") {
    const interpolation = p.interpolation ?? "linear";
    if (interpolation !== "step" && interpolation !== "linear") {
      throw new RangeError(`interpolation must be "step" or "linear", got ${String(interpolation)}`);
    }
    return new TimeAverageKernel(interpolation === "linear", usableMax, gapMs);
  }
  const simple = SIMPLE[fn];
  if (simple !== undefined) return new StatisticKernel(simple, undefined, usableMax, fn === "count" ? 0 : Number.NaN);
  const quantile = fn === "median" ? 0.5 : fn === "percentile" ? percentileParam(p.percentile) / 100 : Number.NaN;
  const sorted = fn === "mode" ? stats.modeSorted : (x: Float64Array) => stats.quantileSorted(x, quantile);
  return new StatisticKernel(undefined, sorted, usableMax, Number.NaN);
}

/** A statistic of the window's usable values (in time order, or sorted). */
class StatisticKernel implements WindowKernel {
  readonly needsNext = false;
  readonly nanIsBad = false;
  private scratch = new Float64Array(256);

  constructor(
    private readonly simple: WindowFn | undefined,
    private readonly sorted: ((x: Float64Array) => number) | undefined,
    private readonly usableMax: number,
    readonly empty: number,
  ) {}

  value(s: Samples, from: number, to: number, _length: number, _start: number, _end: number, allUsable: boolean): number {
    const { v } = s;
    const q = allUsable ? undefined : s.q;
    if (to - from > this.scratch.length) this.scratch = new Float64Array(Math.max(to - from, 2 * this.scratch.length));
    let values = v;
    let a = from;
    let b = to;
    if (q !== undefined) {
      values = this.scratch;
      a = 0;
      b = gatherUsable(v, q, from, to, this.usableMax, values);
    }
    if (this.simple !== undefined) return this.simple(values, a, b);
    const x = this.scratch.subarray(0, b - a);
    if (q === undefined) x.set(v.subarray(from, to));
    x.sort();
    return (this.sorted as (x: Float64Array) => number)(x);
  }
}

/** Copies the usable values of [from, to) to the start of `out`; returns how many. */
function gatherUsable(v: Float64Array, q: Uint8Array, from: number, to: number, usableMax: number, out: Float64Array): number {
  let m = 0;
  for (let i = from; i < to; i++) if (q[i] <= usableMax) out[m++] = v[i];
  return m;
}

class TimeAverageKernel implements WindowKernel {
  readonly needsNext: boolean;
  readonly nanIsBad = true;
  readonly empty = Number.NaN;

  constructor(
    private readonly linear: boolean,
    private readonly usableMax: number,
    private readonly gapMs: number,
  ) {
    // The end of a window reads the next sample (linear), or whether a gap follows (gaps).
    this.needsNext = linear || gapMs !== Infinity;
  }

  value(s: Samples, from: number, to: number, length: number, start: number, end: number): number {
    return timeWeightedMean(s, from, to, length, start, end, this.linear, this.usableMax, this.gapMs);
  }
}

function percentileParam(value: number | undefined): number {
  if (value === undefined) throw new RangeError("fn percentile needs a percentile (0–100)");
  requireFinite("percentile", value);
  if (value < 0 || value > 100) throw new RangeError(`percentile must be within 0–100, got ${value}`);
  return value;
}
