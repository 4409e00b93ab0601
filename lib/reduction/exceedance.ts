import { requireFinite, requireNonNegative } from "./params";
import type { Series } from "./series";
import { type SignalParams, signalParams } from "./signal";
import { timeMatching } from "./time-average";
import { filterWindows, reduceWindows, type Samples, type WindowKernel, type WindowSeries } from "./window-kernel";
import { type WindowParams, windowGrid } from "./windows";

export type ExceedanceParams = WindowParams &
  SignalParams & {
    threshold: number;
    /** `above` (default) counts upward crossings, `below` downward ones. */
    direction?: "above" | "below";
    /** Re-arm only after the value returns past threshold ∓ hysteresis (default 0). */
    hysteresis?: number;
  };

export type ExceedanceEventParams = ExceedanceParams & {
  /** A window is an event when its crossing count exceeds this limit. */
  limit: number;
};

export type TimeAboveParams = WindowParams & SignalParams & { threshold: number };

/**
 * Threshold crossings per window — common practice (no canonical source), a Schmitt
 * trigger: `above` counts each step from ≤ threshold to > threshold; after one, the
 * count re-arms only once the value is ≤ threshold − hysteresis. `below` mirrors it
 * (from ≥ threshold to < threshold, re-arm at ≥ threshold + hysteresis). A series that
 * starts past the threshold does not count as a crossing. A crossing belongs to the
 * window of the sample that completes it; a window with samples but no crossing gives 0.
 * Only usable samples are read (a bad stretch neither crosses nor re-arms); a crossing
 * across a gap still counts, at the sample after it — the value did cross. Streaming
 * form: {@link createExceedanceStream}.
 */
export function exceedances(s: Series, p: ExceedanceParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, crossingKernel(p), usableMax);
}

/**
 * Exceedance events — common practice: the windows whose crossing count (as in
 * {@link exceedances}) is greater than `limit`; v is the count.
 */
export function exceedanceEvents(s: Series, p: ExceedanceEventParams): WindowSeries {
  const limit = eventLimit(p);
  return filterWindows(exceedances(s, p), (count) => count > limit);
}

/** Checks and returns an event limit. */
export function eventLimit(p: ExceedanceEventParams): number {
  return requireNonNegative("limit", p.limit);
}

/**
 * Time above threshold per window, in ms — common practice: each value holds until the
 * next sample (step-hold, as for deadband reconstruction); the time where the held value
 * is strictly above the threshold is summed within [window start, window end). The value
 * before a window's first sample is the previous sample's; the last sample of the series
 * holds to its window's end. A value does not hold across a gap nor from an unusable
 * sample (see time-average.ts). Streaming form: {@link createTimeAboveStream}.
 */
export function timeAbove(s: Series, p: TimeAboveParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, timeAboveKernel(p), usableMax);
}

/** The kernel of {@link timeAbove}; checks the parameters. */
export function timeAboveKernel(p: TimeAboveParams): WindowKernel {
  return new TimeMatchingKernel(requireFinite("threshold", p.threshold), false, p);
}

/** Time during which a step-hold value is above, or equal to, a level (shared with time in state). */
export class TimeMatchingKernel implements WindowKernel {
  readonly needsNext: boolean;
  readonly nanIsBad = false;
  readonly empty = Number.NaN;
  private readonly usableMax: number;
  private readonly gapMs: number;

  constructor(
    private readonly level: number,
    private readonly equal: boolean,
    p: SignalParams,
  ) {
    [this.gapMs, this.usableMax] = signalParams(p);
    this.needsNext = this.gapMs !== Infinity; // whether a gap follows the window's last sample
  }

  value(s: Samples, from: number, to: number, length: number, start: number, end: number): number {
    return timeMatching(s, from, to, length, start, end, this.level, this.equal, this.usableMax, this.gapMs);
  }
}

/** The kernel of {@link exceedances}; checks the parameters. */
export function crossingKernel(p: ExceedanceParams): WindowKernel {
  const threshold = requireFinite("threshold", p.threshold);
  const direction = p.direction ?? "above";
  if (direction !== "above" && direction !== "below") {
    throw new RangeError(`direction must be "above" or "below", got ${String(direction)}`);
  }
  const hysteresis = p.hysteresis === undefined ? 0 : requireNonNegative("hysteresis", p.hysteresis);
  const [, usableMax] = signalParams(p);
  return new CrossingKernel(threshold, direction === "below", hysteresis, usableMax);
}

class CrossingKernel implements WindowKernel {
  readonly needsNext = false;
  readonly nanIsBad = false;
  readonly empty = Number.NaN;
  private readonly sign: number;
  private readonly threshold: number;
  private readonly rearm: number;
  /** Carried between windows; undefined until the first usable sample. */
  private armed: boolean | undefined;

  constructor(
    threshold: number,
    below: boolean,
    hysteresis: number,
    private readonly usableMax: number,
  ) {
    // Mirror `below` onto `above` by negating values and threshold.
    this.sign = below ? -1 : 1;
    this.threshold = this.sign * threshold;
    this.rearm = this.threshold - hysteresis;
  }

  value(s: Samples, from: number, to: number): number {
    const { v, q } = s;
    const { sign, threshold, rearm, usableMax } = this;
    let armed = this.armed;
    let count = 0;
    for (let i = from; i < to; i++) {
      if (q !== undefined && q[i] > usableMax) continue;
      const x = sign * v[i];
      if (armed === undefined) armed = !(x > threshold);
      if (armed) {
        if (x > threshold) {
          count++;
          armed = false;
        }
      } else if (x <= rearm) {
        armed = true;
      }
    }
    this.armed = armed;
    return count;
  }
}
