import { IANAZone } from "luxon";
import { type WindowGrid, windowStart } from "./window-grid";

const HOUR = 3_600_000;
const DAY = 86_400_000;

/**
 * Windows aligned to a site's local calendar (DESIGN.md "Signals"), through luxon's IANA
 * time-zone data. A window is a span of local wall-clock time, [offset + k·w, offset +
 * (k + 1)·w) counted from local 1970-01-01 00:00, so with a length that divides a day
 * (1, 2, 3, 4, 6, 8, 12 or 24 h) or is a whole number of days, windows start at local
 * midnight plus the offset: a daily window lasts 23 hours on the spring change and 25
 * on the autumn change, an 8-hour shift 7 or 9.
 *
 * Sluice's rules where wall-clock time is not one-to-one (common practice, stated here
 * because the choice matters): a boundary whose local time occurs twice (the repeated
 * autumn hour) is its first occurrence, so the repeated hour belongs to the window that
 * started before it; a boundary whose local time does not exist (the skipped spring
 * hour) is the instant the clocks jump. A window that would hold no instant is skipped.
 */
export class CalendarGrid implements WindowGrid {
  start = 0;
  end = 0;
  private readonly zone: IANAZone;

  constructor(
    readonly windowMs: number,
    readonly offsetMs: number,
    timeZone: string,
  ) {
    if (windowMs < HOUR) throw new RangeError(`calendar windows are an hour or more, got windowMs ${windowMs}`);
    if (typeof timeZone !== "string" || !IANAZone.isValidZone(timeZone)) {
      throw new RangeError(`timeZone must be an IANA time zone such as Europe/Berlin, got ${String(timeZone)}`);
    }
    this.zone = IANAZone.create(timeZone);
  }

  locate(x: number): void {
    let wall = windowStart(x + this.offsetAt(x), this.windowMs, this.offsetMs);
    let start = this.instant(wall);
    let end = this.instant(wall + this.windowMs);
    // The rules above can move a boundary across x (a boundary inside the repeated hour):
    // step to the window that holds x.
    while (x >= end) {
      wall += this.windowMs;
      start = end;
      end = this.instant(wall + this.windowMs);
    }
    while (x < start) {
      wall -= this.windowMs;
      end = start;
      start = this.instant(wall);
    }
    this.start = start;
    this.end = end;
  }

  /** UTC offset at instant x, in ms. */
  private offsetAt(x: number): number {
    return Math.round(this.zone.offset(x) * 60_000);
  }

  /** The first instant whose local wall-clock time is `wall`, or the jump over it. */
  private instant(wall: number): number {
    const before = this.offsetAt(wall - DAY);
    const after = this.offsetAt(wall + DAY);
    const x1 = wall - before;
    const x2 = wall - after;
    const ok1 = this.offsetAt(x1) === before;
    const ok2 = this.offsetAt(x2) === after;
    if (ok1 && ok2) return Math.min(x1, x2);
    if (ok1) return x1;
    if (ok2) return x2;
    // A skipped local time: find the instant the offset changes, between x2 and x1.
    let lo = Math.min(x1, x2);
    let hi = Math.max(x1, x2);
    const first = this.offsetAt(lo);
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (this.offsetAt(mid) === first) lo = mid;
      else hi = mid;
    }
    return hi;
  }
}

/** True for a time zone name luxon knows (IANA). */
export function isTimeZone(name: string): boolean {
  return typeof name === "string" && IANAZone.isValidZone(name);
}
