import { requirePositive, shareParam } from "./params";
import type { Series } from "./series";
import { type SignalParams, signalParams } from "./signal";
import { reduceWindows, type Samples, type WindowKernel, type WindowSeries } from "./window-kernel";
import { type WindowParams, windowGrid } from "./windows";

export type CounterParams = WindowParams &
  SignalParams & {
    /** The value at which the counter wraps to 0 (it shows 0 … rollover − ε), e.g. 65536. */
    rollover: number;
    /**
     * The largest share of `rollover` the counter can plausibly advance between two
     * samples (0–1, default 0.5): a decrease that would mean more through a rollover is
     * a reset. With the default, the reading implying the smaller change wins.
     */
    resetShare?: number;
  };

/**
 * Counter (totaliser) increase per window — common practice: the sum of the increments
 * between consecutive usable samples, counted in the window of the later one (counts
 * across a gap are real counts and are included). An increment is the difference when
 * the value rises; when it falls by `drop`, the counter either wrapped — increment
 * rollover − drop — or was reset and counted from 0 since — increment = the new value;
 * it wrapped when rollover − drop ≤ resetShare × rollover, i.e. a drop smaller than
 * (1 − resetShare) × rollover is a reset. Streaming form: {@link createCounterDeltaStream}.
 */
export function counterDelta(s: Series, p: CounterParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, counterKernel(p, false), usableMax);
}

/**
 * Counter rate per window, per second: {@link counterDelta} divided by the window's
 * length in seconds (a calendar day lasts 23 or 25 hours on DST changes). Common
 * practice. Streaming form: {@link createCounterRateStream}.
 */
export function counterRate(s: Series, p: CounterParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, counterKernel(p, true), usableMax);
}

/** The increment from `prev` to `x` of a counter wrapping at `rollover` (see counterDelta). */
export function counterIncrement(prev: number, x: number, rollover: number, resetShare: number): number {
  const d = x - prev;
  if (d >= 0) return d;
  const wrapped = rollover + d;
  return wrapped <= resetShare * rollover ? wrapped : x;
}

/** The kernel of {@link counterDelta} (rate false) or {@link counterRate}; checks the parameters. */
export function counterKernel(p: CounterParams, rate: boolean): WindowKernel {
  const rollover = requirePositive("rollover", p.rollover);
  const resetShare = shareParam("resetShare", p.resetShare, 0.5);
  const [, usableMax] = signalParams(p);
  return new CounterKernel(rollover, resetShare, usableMax, rate);
}

class CounterKernel implements WindowKernel {
  readonly needsNext = false;
  readonly nanIsBad = false;
  readonly empty = Number.NaN;
  private seen = false;
  private last = 0;

  constructor(
    private readonly rollover: number,
    private readonly resetShare: number,
    private readonly usableMax: number,
    private readonly rate: boolean,
  ) {}

  value(s: Samples, from: number, to: number, _length: number, start: number, end: number): number {
    const { v, q } = s;
    let delta = 0;
    for (let i = from; i < to; i++) {
      if (q !== undefined && q[i] > this.usableMax) continue;
      if (this.seen) delta += counterIncrement(this.last, v[i], this.rollover, this.resetShare);
      this.last = v[i];
      this.seen = true;
    }
    return this.rate ? delta / ((end - start) / 1000) : delta;
  }
}
