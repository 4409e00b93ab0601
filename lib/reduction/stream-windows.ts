import { type AggregateParams, aggregateKernel } from "./aggregate";
import { type CounterParams, counterKernel } from "./counter";
import { type TimeInStateParams, type TransitionParams, timeInStateKernel, transitionKernel } from "./discrete";
import { crossingKernel, type ExceedanceEventParams, type ExceedanceParams, eventLimit, type TimeAboveParams, timeAboveKernel } from "./exceedance";
import { requireNonNegative } from "./params";
import type { Series } from "./series";
import { type SignalParams, signalParams } from "./signal";
import { QUALITY_BAD } from "./series";
import { checkChunk, MAX_TIME, SampleBuilder, type StreamChunk, type StreamParams, type StreamProcessor } from "./stream";
import { evaluateWindow, type Samples, type WindowKernel, type WindowSlot } from "./window-kernel";
import { type WindowGrid, type WindowParams, windowGrid } from "./windows";

// Module-local copies: hot loops read them without going through import bindings.
const BAD = QUALITY_BAD;
const LATEST = MAX_TIME;

/**
 * The streaming form of every aggregation: it holds the samples of the windows not yet
 * emitted (plus the sample before them) and evaluates each window with the same kernel
 * as the batch function, so the output equals the batch result for any chunking.
 *
 * Lateness (DESIGN.md "Signals"): the stream time is the newest sample accepted; a
 * window is sealed once the stream time reaches its end plus `graceMs`. A sample older
 * than the stream time is accepted, in its place, while its window is not sealed (and
 * its time is not already present); otherwise it is counted in `late` and dropped. A
 * window is emitted once it is sealed — and, for kernels that read the sample after the
 * window, once that sample's window is sealed too — so nothing accepted later can change
 * an emitted window. Hence a sample at most `graceMs` late is never dropped, and the
 * output equals the batch result on the accepted samples in time order.
 *
 * Memory: the samples of the open windows (about window + grace of data).
 */
class WindowStream implements StreamProcessor {
  late = 0;
  invalid = 0;
  private t = new Float64Array(1024);
  private v = new Float64Array(1024);
  private q = new Uint8Array(1024);
  private length = 0;
  /** The first sample of the first window not yet emitted; head − 1 (if any) precedes it. */
  private head = 0;
  private now = -Infinity;
  private finished = false;
  private readonly out = new SampleBuilder(true);
  private readonly slot: WindowSlot = { value: 0, quality: 0, goodShare: 0 };
  // The window of the head sample and how far it is known to reach (reset when head moves or a sample is inserted).
  private cachedHead = -1;
  private start = 0;
  private end = 0;
  private reach = 0;

  constructor(
    private readonly kernel: WindowKernel,
    private readonly grid: WindowGrid,
    private readonly usableMax: number,
    private readonly graceMs: number,
    private readonly keep: ((value: number) => boolean) | undefined,
  ) {}

  push(chunk: Series): StreamChunk {
    checkChunk(chunk, this.finished);
    this.scan(chunk.t, chunk.v, chunk.q);
    this.emit(false);
    this.compact();
    return this.out.take();
  }

  /** Ends with its loop, so V8's code compiled while the loop runs stays valid (see README). */
  private scan(t: Float64Array, v: Float64Array, q: Uint8Array | undefined): void {
    for (let i = 0; i < t.length; i++) {
      const ti = t[i];
      const vi = v[i];
      const qi = q === undefined ? 0 : q[i];
      // The rules of stream.ts (x − x is 0 only for finite x; NaN fails every comparison).
      if (!(ti <= LATEST && ti >= -LATEST) || qi > BAD || (qi !== BAD && vi - vi !== 0)) this.invalid++;
      else if (ti > this.now) {
        this.append(ti, vi, qi);
        this.now = ti;
      } else this.insertLate(ti, vi, qi);
    }
  }

  finish(): StreamChunk {
    checkChunk({ t: new Float64Array(0), v: new Float64Array(0) }, this.finished);
    this.finished = true;
    this.emit(true);
    return this.out.take();
  }

  private sealed(end: number): boolean {
    return this.now >= end + this.graceMs;
  }

  private emit(final: boolean): void {
    const samples: Samples = { t: this.t, v: this.v, q: this.q };
    while (this.head < this.length) {
      if (this.cachedHead !== this.head) {
        this.grid.locate(this.t[this.head]);
        this.start = this.grid.start;
        this.end = this.grid.end;
        this.reach = this.head;
        this.cachedHead = this.head;
      }
      while (this.reach < this.length && this.t[this.reach] < this.end) this.reach++;
      const to = this.reach;
      if (to === this.head) {
        // Float rounding left the head sample outside its own window (a window far
        // shorter than the time's precision): drop it rather than loop.
        this.invalid++;
        this.head++;
        continue;
      }
      if (!final) {
        if (!this.sealed(this.end)) return;
        if (this.kernel.needsNext) {
          if (to >= this.length) return;
          this.grid.locate(this.t[to]);
          if (!this.sealed(this.grid.end)) return;
        }
      }
      evaluateWindow(this.kernel, samples, this.head, to, this.length, this.start, this.end, this.usableMax, this.slot);
      const { value, quality, goodShare } = this.slot;
      if (this.keep === undefined || this.keep(value)) this.out.push(this.start, value, quality, goodShare);
      this.head = to;
    }
  }

  private insertLate(t: number, v: number, q: number): void {
    this.grid.locate(t);
    if (this.sealed(this.grid.end)) {
      this.late++;
      return;
    }
    // Its window is open, so it lies after every emitted window: search [head, length).
    let lo = this.head;
    let hi = this.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.t[mid] <= t) lo = mid + 1;
      else hi = mid;
    }
    if ((lo > 0 && this.t[lo - 1] === t) || (lo === this.head && lo > 0 && this.t[lo - 1] > t)) {
      this.late++;
      return;
    }
    this.append(0, 0, 0);
    this.t.copyWithin(lo + 1, lo, this.length - 1);
    this.v.copyWithin(lo + 1, lo, this.length - 1);
    this.q.copyWithin(lo + 1, lo, this.length - 1);
    this.t[lo] = t;
    this.v[lo] = v;
    this.q[lo] = q;
    this.cachedHead = -1;
  }

  private append(t: number, v: number, q: number): void {
    if (this.length === this.t.length) {
      const size = this.t.length * 2;
      const nt = new Float64Array(size);
      const nv = new Float64Array(size);
      const nq = new Uint8Array(size);
      nt.set(this.t);
      nv.set(this.v);
      nq.set(this.q);
      this.t = nt;
      this.v = nv;
      this.q = nq;
    }
    this.t[this.length] = t;
    this.v[this.length] = v;
    this.q[this.length] = q;
    this.length++;
  }

  /** Drops the emitted samples but the last (the sample before the next window). */
  private compact(): void {
    const drop = this.head - 1;
    if (drop <= 0) return;
    this.t.copyWithin(0, drop, this.length);
    this.v.copyWithin(0, drop, this.length);
    this.q.copyWithin(0, drop, this.length);
    this.length -= drop;
    this.head -= drop;
    if (this.cachedHead >= 0) {
      this.cachedHead -= drop;
      this.reach -= drop;
    }
  }
}

function windowStream(kernel: WindowKernel, p: WindowParams & SignalParams & StreamParams, keep?: (value: number) => boolean): StreamProcessor {
  const grid = windowGrid(p);
  const [, usableMax] = signalParams(p);
  const graceMs = p.graceMs === undefined ? 0 : requireNonNegative("graceMs", p.graceMs);
  return new WindowStream(kernel, grid, usableMax, graceMs, keep);
}

/** Streaming {@link aggregate} (OPC UA Part 13), every function: equal to the batch result for any chunking. */
export function createAggregateStream(p: AggregateParams & StreamParams): StreamProcessor {
  return windowStream(aggregateKernel(p), p);
}

/** Streaming {@link exceedances} (common practice). */
export function createExceedanceStream(p: ExceedanceParams & StreamParams): StreamProcessor {
  return windowStream(crossingKernel(p), p);
}

/** Streaming {@link exceedanceEvents} (common practice). */
export function createExceedanceEventStream(p: ExceedanceEventParams & StreamParams): StreamProcessor {
  const limit = eventLimit(p);
  return windowStream(crossingKernel(p), p, (count) => count > limit);
}

/** Streaming {@link timeAbove} (common practice). */
export function createTimeAboveStream(p: TimeAboveParams & StreamParams): StreamProcessor {
  return windowStream(timeAboveKernel(p), p);
}

/** Streaming {@link transitionCount} (common practice). */
export function createTransitionCountStream(p: TransitionParams & StreamParams): StreamProcessor {
  return windowStream(transitionKernel(p), p);
}

/** Streaming {@link timeInState} (common practice). */
export function createTimeInStateStream(p: TimeInStateParams & StreamParams): StreamProcessor {
  return windowStream(timeInStateKernel(p), p);
}

/** Streaming {@link counterDelta} (common practice). */
export function createCounterDeltaStream(p: CounterParams & StreamParams): StreamProcessor {
  return windowStream(counterKernel(p, false), p);
}

/** Streaming {@link counterRate} (common practice). */
export function createCounterRateStream(p: CounterParams & StreamParams): StreamProcessor {
  return windowStream(counterKernel(p, true), p);
}
