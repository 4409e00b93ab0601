import { IndexBuffer } from "./index-buffer";
import { optionalGap, requireFinite } from "./params";
import type { Series } from "./series";
import { type SignalParams, signalParams } from "./signal";
import { selectByStretch } from "./stretches";
import { TimeMatchingKernel } from "./exceedance";
import { reduceWindows, type Samples, type WindowKernel, type WindowSeries } from "./window-kernel";
import { type WindowParams, windowGrid } from "./windows";

export type ChangeOfStateParams = Pick<SignalParams, "gapMs">;
export type TransitionParams = WindowParams & SignalParams;
export type TimeInStateParams = WindowParams & SignalParams & { state: number };

/**
 * Change of state for discrete signals — common practice (report by exception with a
 * zero deadband): keep the first sample, every sample whose value differs from the
 * previous one (exactly, no tolerance) and the last. The receiver reconstructs by
 * step-hold, which equals the input at every input sample. Stretches between gaps and
 * quality changes as for every selection method (see stretches.ts). Streaming form:
 * {@link createChangeOfStateStream}.
 *
 * @returns kept indices, ascending.
 */
export function changeOfState(s: Series, p: ChangeOfStateParams = {}): Uint32Array {
  return selectByStretch(s, optionalGap(p.gapMs), keepChanges);
}

function keepChanges(s: Series): Uint32Array {
  const { v } = s;
  const n = v.length;
  const kept = new IndexBuffer(64);
  if (n === 0) return kept.toArray();
  kept.push(0);
  for (let i = 1; i < n; i++) if (v[i] !== v[i - 1]) kept.push(i);
  if (kept.last() !== n - 1) kept.push(n - 1);
  return kept.toArray();
}

/**
 * State transitions per window — common practice: the usable samples whose value differs
 * from the previous usable sample's, counted in the window of the later one (a change
 * across a gap counts: the state did change). Streaming form: {@link createTransitionCountStream}.
 */
export function transitionCount(s: Series, p: TransitionParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, transitionKernel(p), usableMax);
}

/**
 * Time in a state per window, in ms — common practice: the step-hold time during which
 * the value equals `state`, with the coverage rules of time above threshold (a value does
 * not hold across a gap nor from an unusable sample; see time-average.ts). Streaming
 * form: {@link createTimeInStateStream}.
 */
export function timeInState(s: Series, p: TimeInStateParams): WindowSeries {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  return reduceWindows(s, grid, timeInStateKernel(p), usableMax);
}

/** The kernel of {@link transitionCount}. */
export function transitionKernel(p: TransitionParams): WindowKernel {
  const [, usableMax] = signalParams(p);
  return new TransitionKernel(usableMax);
}

/** The kernel of {@link timeInState}; checks the parameters. */
export function timeInStateKernel(p: TimeInStateParams): WindowKernel {
  return new TimeMatchingKernel(requireFinite("state", p.state), true, p);
}

class TransitionKernel implements WindowKernel {
  readonly needsNext = false;
  readonly nanIsBad = false;
  readonly empty = Number.NaN;
  private seen = false;
  private last = 0;

  constructor(private readonly usableMax: number) {}

  value(s: Samples, from: number, to: number): number {
    const { v, q } = s;
    let count = 0;
    for (let i = from; i < to; i++) {
      if (q !== undefined && q[i] > this.usableMax) continue;
      if (this.seen && v[i] !== this.last) count++;
      this.last = v[i];
      this.seen = true;
    }
    return count;
  }
}
