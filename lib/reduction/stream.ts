import type { QualifiedSeries, Series } from "./series";

/** What a streaming processor emits from one call: samples with quality, and each window's good share for aggregations. */
export type StreamChunk = QualifiedSeries & { goodShare?: Float64Array };

/**
 * A streaming form of a reduction method (DESIGN.md "Signals"): `push` takes the next
 * chunk of samples and returns what could be decided so far; `finish` ends the stream and
 * returns the rest. State is carried between chunks, so any split of an input into chunks
 * gives exactly the result of the batch method on the whole input.
 *
 * Data never throws: a sample not newer than the last one processed is counted in `late`
 * and dropped (aggregations accept it while its window is still open, see
 * stream-windows.ts); a sample with a time outside the ECMAScript Date range (±8.64e15
 * ms, non-finite included), a quality code above 2 or a non-finite value without bad
 * quality is counted in `invalid` and dropped. Misuse does:
 * a chunk whose arrays are not typed arrays of one length, or a push after finish.
 */
export interface StreamProcessor {
  push(chunk: Series): StreamChunk;
  finish(): StreamChunk;
  readonly late: number;
  readonly invalid: number;
}

/** The largest |t| a stream accepts: the ECMAScript Date range (ECMA-262, Time Values and Time Range). */
export const MAX_TIME = 8.64e15;

/** Options every aggregation stream takes. */
export type StreamParams = {
  /** How long (ms) a window stays open for late samples after its end (default 0). */
  graceMs?: number;
};

/** Throws a TypeError for a chunk that is not a series (the caller's bug, not data). */
export function checkChunk(chunk: Series, finished: boolean): void {
  if (finished) throw new Error("push after finish: start a new stream");
  const { t, v, q } = chunk;
  if (!(t instanceof Float64Array) || !(v instanceof Float64Array) || t.length !== v.length) {
    throw new TypeError("a chunk needs t and v as Float64Array of one length");
  }
  if (q !== undefined && (!(q instanceof Uint8Array) || q.length !== t.length)) {
    throw new TypeError("a chunk's q must be a Uint8Array as long as t");
  }
}

/** A growable output of samples (and good shares), taken as right-sized arrays. */
export class SampleBuilder {
  private t = new Float64Array(256);
  private v = new Float64Array(256);
  private q = new Uint8Array(256);
  private share: Float64Array | undefined;
  length = 0;

  constructor(withShare: boolean) {
    if (withShare) this.share = new Float64Array(256);
  }

  push(t: number, v: number, q: number, share = 1): void {
    if (this.length === this.t.length) this.grow();
    this.t[this.length] = t;
    this.v[this.length] = v;
    this.q[this.length] = q;
    if (this.share !== undefined) this.share[this.length] = share;
    this.length++;
  }

  take(): StreamChunk {
    const n = this.length;
    this.length = 0;
    const out: StreamChunk = { t: this.t.slice(0, n), v: this.v.slice(0, n), q: this.q.slice(0, n) };
    if (this.share !== undefined) out.goodShare = this.share.slice(0, n);
    return out;
  }

  private grow(): void {
    const size = this.t.length * 2;
    const t = new Float64Array(size);
    const v = new Float64Array(size);
    const q = new Uint8Array(size);
    t.set(this.t);
    v.set(this.v);
    q.set(this.q);
    this.t = t;
    this.v = v;
    this.q = q;
    if (this.share !== undefined) {
      const share = new Float64Array(size);
      share.set(this.share);
      this.share = share;
    }
  }
}
