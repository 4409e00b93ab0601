/** Test helpers for real-plant signals (quality, gaps) and for streams: chunkings and collection. */
import fc from "fast-check";
import type { QualifiedSeries, Series, StreamChunk, StreamProcessor, WindowSeries } from "@/lib/reduction";

export const SECOND = 1000;

/** Options of {@link arbitrarySignal}. */
export type SignalShape = {
  maxLength?: number;
  /** Values: small integers (states, many ties) or doubles. */
  values?: "states" | "doubles" | "counter";
  /** Add quality codes in runs. */
  quality?: boolean;
  /** Mean step in ms (default 1 s); a step of 10× this appears now and then (a gap at factor 3). */
  stepMs?: number;
};

/**
 * Arbitrary signals: steps of 0.5–1.5 × stepMs (quarter steps) with occasional gaps, values of the chosen
 * shape, and (optionally) quality in runs of good, uncertain and bad, bad ones sometimes
 * carrying NaN. Starts on 2026-01-01 plus a random offset.
 */
export function arbitrarySignal(o: SignalShape = {}): fc.Arbitrary<Series> {
  const step = o.stepMs ?? SECOND;
  const value =
    o.values === "doubles"
      ? fc.double({ min: -50, max: 50, noNaN: true })
      : o.values === "counter"
        ? fc.integer({ min: 0, max: 40 })
        : fc.integer({ min: -2, max: 2 });
  const row = fc.tuple(
    fc.integer({ min: 2, max: 6 }).map((k) => (k * step) / 4), // 0.5–1.5 steps on a quarter grid: exact ties at interval limits
    fc.integer({ min: 0, max: 39 }),
    value,
    fc.integer({ min: 0, max: 19 }),
  );
  return fc.tuple(fc.array(row, { minLength: 0, maxLength: o.maxLength ?? 200 }), fc.integer({ min: 0, max: 10 * step })).map(([rows, offset]) => {
    let now = Date.UTC(2026, 0, 1) + offset;
    let quality = 0;
    let total = 0;
    const t: number[] = [];
    const v: number[] = [];
    const q: number[] = [];
    for (const [dt, gap, x, flip] of rows) {
      now += gap === 0 ? 10 * dt : dt;
      if (flip === 0) quality = (quality + 1 + (x & 1)) % 3;
      t.push(now);
      if (o.values === "counter") {
        total = (total + x) % 1000; // wraps at 1000
        if (flip === 1 && gap === 1) total = 0; // a reset now and then
        v.push(total);
      } else {
        v.push(o.quality && quality === 2 && flip === 2 ? Number.NaN : x);
      }
      q.push(quality);
    }
    const s: Series = { t: Float64Array.from(t), v: Float64Array.from(v) };
    if (o.quality) s.q = Uint8Array.from(q);
    return s;
  });
}

/** Cut points for a series of length n: any split into chunks, empty chunks included. */
export function arbitraryCuts(): fc.Arbitrary<number[]> {
  return fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 12 });
}

/** Splits a series at the given fractions of its length (sorted; repeats give empty chunks). */
export function chunksOf(s: Series, cuts: number[]): Series[] {
  const n = s.t.length;
  const at = [0, ...cuts.map((c) => Math.floor(c * n)).sort((a, b) => a - b), n];
  const chunks: Series[] = [];
  for (let k = 0; k + 1 < at.length; k++) {
    const [a, b] = [at[k], at[k + 1]];
    chunks.push({ t: s.t.subarray(a, b), v: s.v.subarray(a, b), q: s.q?.subarray(a, b) });
  }
  return chunks;
}

/** Pushes every chunk, finishes, and joins what the processor emitted. */
export function runStream(p: StreamProcessor, chunks: Series[]): StreamChunk {
  const parts = [...chunks.map((c) => p.push(c)), p.finish()];
  return joinChunks(parts);
}

export function joinChunks(parts: StreamChunk[]): StreamChunk {
  const cat = <T extends Float64Array | Uint8Array>(make: (n: number) => T, pick: (c: StreamChunk) => T) => {
    const out = make(parts.reduce((n, c) => n + pick(c).length, 0));
    let at = 0;
    for (const c of parts) {
      out.set(pick(c), at);
      at += pick(c).length;
    }
    return out;
  };
  const out: StreamChunk = {
    t: cat((n) => new Float64Array(n), (c) => c.t),
    v: cat((n) => new Float64Array(n), (c) => c.v),
    q: cat((n) => new Uint8Array(n), (c) => c.q),
  };
  if (parts.every((c) => c.goodShare !== undefined)) out.goodShare = cat((n) => new Float64Array(n), (c) => c.goodShare as Float64Array);
  return out;
}

/** The samples of kept indices, with quality (good when the series has none). */
export function picked(s: Series, kept: Uint32Array): QualifiedSeries {
  return {
    t: Float64Array.from(kept, (i) => s.t[i]),
    v: Float64Array.from(kept, (i) => s.v[i]),
    q: Uint8Array.from(kept, (i) => s.q?.[i] ?? 0),
  };
}

/** Plain arrays for toEqual (NaN equals NaN there). */
export function plain(s: StreamChunk | WindowSeries | QualifiedSeries): Record<string, number[]> {
  const out: Record<string, number[]> = { t: Array.from(s.t), v: Array.from(s.v), q: Array.from(s.q) };
  if ("goodShare" in s && s.goodShare !== undefined) out.goodShare = Array.from(s.goodShare);
  return out;
}

/** A series from plain arrays, with quality. */
export function qseries(t: number[], v: number[], q?: number[]): Series {
  const s: Series = { t: Float64Array.from(t), v: Float64Array.from(v) };
  if (q) s.q = Uint8Array.from(q);
  return s;
}
