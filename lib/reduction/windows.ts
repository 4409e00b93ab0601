import { requireFinite, requirePositive } from "./params";
import { checkShape, failValidation, type Series } from "./series";

export type WindowParams = {
  /** Window length in ms; windows start at offsetMs + k·windowMs (k any integer). */
  windowMs: number;
  /** Alignment offset from the epoch in ms (default 0). */
  offsetMs?: number;
};

/**
 * The windows that hold samples, in order: window k starts at `start[k]` and holds the
 * samples `begin[k]` … `begin[k + 1] − 1`. Windows without samples are absent.
 */
export type Windows = { count: number; start: Float64Array; begin: Uint32Array; windowMs: number };

/** Checks window parameters and returns [windowMs, offsetMs]. */
export function windowParams(p: WindowParams): [number, number] {
  const windowMs = requirePositive("windowMs", p.windowMs);
  const offsetMs = p.offsetMs === undefined ? 0 : requireFinite("offsetMs", p.offsetMs);
  return [windowMs, offsetMs];
}

/**
 * Start of the window holding time x: offset + ⌊(x − offset)/w⌋·w, corrected by one
 * window if float rounding put x outside [start, start + w). Epoch alignment with an
 * offset is common practice for sub-hour windows (DESIGN.md, Signals).
 */
export function windowStart(x: number, windowMs: number, offsetMs: number): number {
  let start = offsetMs + Math.floor((x - offsetMs) / windowMs) * windowMs;
  if (start > x) start -= windowMs;
  else if (start + windowMs <= x) start += windowMs;
  return start;
}

/**
 * Splits a series into epoch-aligned windows in one pass, validating it as it goes
 * (throws the SeriesError of {@link validateSeries} for a bad series).
 */
export function splitWindows(s: Series, windowMs: number, offsetMs: number): Windows {
  checkShape(s);
  const { t, v } = s;
  const n = t.length;
  if (n === 0) return { count: 0, start: new Float64Array(0), begin: new Uint32Array(1), windowMs };
  const capacity = Math.min(n, Math.floor((t[n - 1] - t[0]) / windowMs) + 3);
  const start = new Float64Array(capacity);
  const begin = new Uint32Array(capacity + 1);
  const count = fillWindows(t, v, windowMs, offsetMs, start, begin);
  if (count < 0 || count > capacity) {
    failValidation(s);
    throw new Error("splitWindows: the scan stopped on a valid series");
  }
  begin[count] = n;
  return {
    count,
    start: count === capacity ? start : start.slice(0, count),
    begin: count === capacity ? begin : begin.slice(0, count + 1),
    windowMs,
  };
}

/**
 * Returns the window count, or −1 at a timestamp that does not ascend or a value that is
 * not finite. Nothing follows the loop, so V8's code compiled while it runs (on-stack
 * replacement) stays valid.
 */
function fillWindows(
  t: Float64Array,
  v: Float64Array,
  windowMs: number,
  offsetMs: number,
  start: Float64Array,
  begin: Uint32Array,
): number {
  const n = t.length;
  const capacity = start.length;
  let count = 0;
  let end = -Infinity;
  let tPrev = -Infinity;
  for (let i = 0; i < n; i++) {
    const ti = t[i];
    if (!(ti > tPrev) || v[i] - v[i] !== 0) return -1;
    tPrev = ti;
    if (ti >= end) {
      if (count === capacity) return -1;
      const s = windowStart(ti, windowMs, offsetMs);
      start[count] = s;
      begin[count] = i;
      count++;
      end = s + windowMs;
    }
  }
  return count;
}
