import { type DeadbandParams } from "./deadband";
import type { ChangeOfStateParams } from "./discrete";
import { optionalGap, optionalInterval, requireNonNegative } from "./params";
import { keptQuality, type QualityFilterParams } from "./quality";
import { QUALITY_BAD, type Series } from "./series";
import { checkChunk, MAX_TIME, SampleBuilder, type StreamChunk, type StreamProcessor } from "./stream";
import type { SwingingDoorParams } from "./swinging-door";

// Module-local copies: hot loops read them without going through import bindings.
const BAD = QUALITY_BAD;
const LATEST = MAX_TIME;

/**
 * The loop every selection stream shares: checks each sample, drops late and invalid
 * ones (see stream.ts), hands the rest to `accept` in order and collects what it keeps.
 * Samples before a gap or a quality change end a stretch: the subclasses keep the sample
 * on each side, as their batch forms do (see stretches.ts).
 */
abstract class SelectionStream implements StreamProcessor {
  late = 0;
  invalid = 0;
  private lastT = -Infinity;
  private finished = false;
  protected readonly out = new SampleBuilder(false);
  // The previous accepted sample, and whether it was kept.
  protected started = false;
  protected pt = 0;
  protected pv = 0;
  protected pq = 0;
  protected prevKept = false;

  constructor(protected readonly gapMs: number) {}

  push(chunk: Series): StreamChunk {
    checkChunk(chunk, this.finished);
    this.scan(chunk.t, chunk.v, chunk.q);
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
      else if (!(ti > this.lastT)) this.late++;
      else {
        this.lastT = ti;
        this.accept(ti, vi, qi);
      }
    }
  }

  finish(): StreamChunk {
    checkChunk({ t: new Float64Array(0), v: new Float64Array(0) }, this.finished);
    this.finished = true;
    if (this.started && !this.prevKept) this.out.push(this.pt, this.pv, this.pq);
    return this.out.take();
  }

  protected abstract accept(t: number, v: number, q: number): void;

  /** True when (t, q) starts a new stretch; then the previous sample is kept if it was not. */
  protected startsStretch(t: number, q: number): boolean {
    if (!(t - this.pt > this.gapMs || q !== this.pq) && this.started) return false;
    if (this.started && !this.prevKept) this.out.push(this.pt, this.pv, this.pq);
    this.started = true;
    return true;
  }

  protected setPrevious(t: number, v: number, q: number, kept: boolean): void {
    if (kept) this.out.push(t, v, q);
    this.pt = t;
    this.pv = v;
    this.pq = q;
    this.prevKept = kept;
  }
}

class SwingingDoorStream extends SelectionStream {
  private ta = 0;
  private va = 0;
  private upper = Infinity;
  private lower = -Infinity;

  constructor(
    private readonly deviation: number,
    private readonly maxInterval: number,
    gapMs: number,
  ) {
    super(gapMs);
  }

  protected accept(t: number, v: number, q: number): void {
    if (this.startsStretch(t, q)) {
      this.setAnchor(t, v);
      this.setPrevious(t, v, q, true);
      return;
    }
    // Within a stretch q equals the previous quality: only t, v and prevKept change.
    if (q !== BAD) {
      if (!this.prevKept) {
        const slope = (v - this.va) / (t - this.ta);
        if (t - this.ta > this.maxInterval || slope > this.upper || slope < this.lower) {
          this.out.push(this.pt, this.pv, q);
          this.setAnchor(this.pt, this.pv);
        }
      }
      const dt = t - this.ta;
      const up = (v - this.va + this.deviation) / dt;
      const lo = (v - this.va - this.deviation) / dt;
      if (up < this.upper) this.upper = up;
      if (lo > this.lower) this.lower = lo;
    }
    this.pt = t;
    this.pv = v;
    this.prevKept = false;
  }

  private setAnchor(t: number, v: number): void {
    this.ta = t;
    this.va = v;
    this.upper = Infinity;
    this.lower = -Infinity;
  }
}

class DeadbandStream extends SelectionStream {
  private tLast = 0;
  private vLast = 0;

  constructor(
    private readonly band: number,
    private readonly maxInterval: number,
    gapMs: number,
  ) {
    super(gapMs);
  }

  protected accept(t: number, v: number, q: number): void {
    if (this.startsStretch(t, q)) {
      this.keepAsReference(t, v, q);
      return;
    }
    // Within a stretch q equals the previous quality: only t, v and prevKept change.
    if (q !== BAD) {
      if (t - this.tLast > this.maxInterval && !this.prevKept) {
        this.out.push(this.pt, this.pv, q);
        this.tLast = this.pt;
        this.vLast = this.pv;
      }
      const d = v - this.vLast;
      if (d > this.band || -d > this.band) {
        this.keepAsReference(t, v, q);
        return;
      }
    }
    this.pt = t;
    this.pv = v;
    this.prevKept = false;
  }

  private keepAsReference(t: number, v: number, q: number): void {
    this.tLast = t;
    this.vLast = v;
    this.setPrevious(t, v, q, true);
  }
}

class ChangeOfStateStream extends SelectionStream {
  protected accept(t: number, v: number, q: number): void {
    if (this.startsStretch(t, q)) this.setPrevious(t, v, q, true);
    else this.setPrevious(t, v, q, q !== BAD && v !== this.pv);
  }
}

/** Keeps the samples `keep` accepts; no stretch ends (quality filter, pass-through, drop). */
class FilterStream extends SelectionStream {
  constructor(private readonly keep: (q: number) => boolean) {
    super(Infinity);
  }

  protected accept(t: number, v: number, q: number): void {
    if (this.keep(q)) this.out.push(t, v, q);
  }

  finish(): StreamChunk {
    this.started = false; // no last sample to keep
    return super.finish();
  }
}

/** Streaming {@link swingingDoor} (Bristol 1990, DESIGN.md formulation): equal to the batch result for any chunking. */
export function createSwingingDoorStream(p: SwingingDoorParams): StreamProcessor {
  const deviation = requireNonNegative("deviation", p.deviation);
  return new SwingingDoorStream(deviation, optionalInterval("maxIntervalMs", p.maxIntervalMs), optionalGap(p.gapMs));
}

/** Streaming {@link deadband} (OPC UA Part 4 absolute deadband): equal to the batch result for any chunking. */
export function createDeadbandStream(p: DeadbandParams): StreamProcessor {
  const band = requireNonNegative("deadband", p.deadband);
  return new DeadbandStream(band, optionalInterval("maxIntervalMs", p.maxIntervalMs), optionalGap(p.gapMs));
}

/** Streaming {@link changeOfState} (common practice): equal to the batch result for any chunking. */
export function createChangeOfStateStream(p: ChangeOfStateParams = {}): StreamProcessor {
  return new ChangeOfStateStream(optionalGap(p.gapMs));
}

/** Streaming {@link qualityFilter} (common practice). */
export function createQualityFilterStream(p: QualityFilterParams): StreamProcessor {
  const highest = keptQuality(p);
  return new FilterStream((q) => q <= highest);
}

/** Streaming {@link passThrough}: every accepted sample, as it comes. */
export function createPassThroughStream(): StreamProcessor {
  return new FilterStream(() => true);
}

/** Streaming {@link drop}: nothing. */
export function createDropStream(): StreamProcessor {
  return new FilterStream(() => false);
}
