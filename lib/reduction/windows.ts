import { CalendarGrid } from "./calendar";
import { requireFinite, requirePositive } from "./params";
import { checkShape, failValidation, type Series, validateSeries } from "./series";
import { EpochGrid, type WindowGrid, windowStart } from "./window-grid";

export { EpochGrid, type WindowGrid, windowStart };

export type WindowParams = {
  /** Window length in ms; windows start at offsetMs + k·windowMs (k any integer). */
  windowMs: number;
  /** Alignment offset in ms (default 0): from the epoch, or from local midnight with a time zone. */
  offsetMs?: number;
  /**
   * IANA time zone of the site: windows of an hour or more then align to its local
   * calendar (see calendar.ts), e.g. a day runs from local midnight to local midnight
   * and lasts 23 or 25 hours on the days the clocks change.
   */
  timeZone?: string;
};

/**
 * The windows that hold samples, in order: window k is [start[k], end[k]) and holds the
 * samples `begin[k]` … `begin[k + 1] − 1`. Windows without samples are absent.
 */
export type Windows = { count: number; start: Float64Array; end: Float64Array; begin: Uint32Array };

/** Checks window parameters and returns [windowMs, offsetMs]. */
export function windowParams(p: WindowParams): [number, number] {
  const windowMs = requirePositive("windowMs", p.windowMs);
  const offsetMs = p.offsetMs === undefined ? 0 : requireFinite("offsetMs", p.offsetMs);
  return [windowMs, offsetMs];
}

/** The grid of checked window parameters: epoch-aligned, or the local calendar of `timeZone`. */
export function windowGrid(p: WindowParams): WindowGrid {
  const [windowMs, offsetMs] = windowParams(p);
  if (p.timeZone === undefined) return new EpochGrid(windowMs, offsetMs);
  return new CalendarGrid(windowMs, offsetMs, p.timeZone);
}

/**
 * Splits a series into the windows of `grid` in one pass, validating it (throws the
 * SeriesError of {@link validateSeries} for a bad series).
 */
export function splitWindows(s: Series, grid: WindowGrid): Windows {
  if (s.q === undefined && grid instanceof EpochGrid) return splitEpoch(s, grid.windowMs, grid.offsetMs);
  validateSeries(s);
  const { t } = s;
  const n = t.length;
  let start: Float64Array = new Float64Array(Math.min(n, 64));
  let end: Float64Array = new Float64Array(start.length);
  let begin = new Uint32Array(start.length + 1);
  let count = 0;
  let windowEnd = -Infinity;
  for (let i = 0; i < n; i++) {
    if (t[i] < windowEnd) continue;
    if (count === start.length) {
      start = grown(start);
      end = grown(end);
      const b = new Uint32Array(start.length + 1);
      b.set(begin);
      begin = b;
    }
    grid.locate(t[i]);
    start[count] = grid.start;
    end[count] = grid.end;
    begin[count] = i;
    windowEnd = grid.end;
    count++;
  }
  begin[count] = n;
  return { count, start: start.slice(0, count), end: end.slice(0, count), begin: begin.slice(0, count + 1) };
}

function grown(a: Float64Array): Float64Array {
  const b = new Float64Array(Math.max(16, a.length * 2));
  b.set(a);
  return b;
}

/** The epoch-aligned split of a series without quality, validating in the same pass. */
function splitEpoch(s: Series, windowMs: number, offsetMs: number): Windows {
  checkShape(s);
  const { t, v } = s;
  const n = t.length;
  if (n === 0) return { count: 0, start: new Float64Array(0), end: new Float64Array(0), begin: new Uint32Array(1) };
  const capacity = Math.min(n, Math.floor((t[n - 1] - t[0]) / windowMs) + 3);
  const start = new Float64Array(capacity);
  const begin = new Uint32Array(capacity + 1);
  const count = fillWindows(t, v, windowMs, offsetMs, start, begin);
  if (count < 0 || count > capacity) {
    failValidation(s);
    throw new Error("splitWindows: the scan stopped on a valid series");
  }
  begin[count] = n;
  const starts = count === capacity ? start : start.slice(0, count);
  const end = new Float64Array(count);
  for (let k = 0; k < count; k++) end[k] = starts[k] + windowMs;
  return { count, start: starts, end, begin: count === capacity ? begin : begin.slice(0, count + 1) };
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
