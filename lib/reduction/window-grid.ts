/** Where windows lie on the time axis; `locate` sets `start` and `end` to the window holding x. */
export interface WindowGrid {
  readonly windowMs: number;
  start: number;
  end: number;
  locate(x: number): void;
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

/** Windows [offset + k·w, offset + (k + 1)·w) on the epoch time axis. */
export class EpochGrid implements WindowGrid {
  start = 0;
  end = 0;
  constructor(
    readonly windowMs: number,
    readonly offsetMs: number,
  ) {}

  locate(x: number): void {
    this.start = windowStart(x, this.windowMs, this.offsetMs);
    this.end = this.start + this.windowMs;
  }
}

