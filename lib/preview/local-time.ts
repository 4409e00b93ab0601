import { IANAZone } from "luxon";

const DAY = 86_400_000;
const PROBE_MS = 7 * DAY;
const PROBES = 12;

/** What {@link LocalTimeResolver.resolve} found for a wall-clock time. */
export const LOCAL_UNIQUE = 1;
/** The wall time occurs twice (the repeated autumn hour): `first` and `second` are both instants. */
export const LOCAL_REPEATED = 2;
/** The wall time does not exist (the skipped spring hour): `first` is the instant the clocks jump. */
export const LOCAL_SKIPPED = 0;

/**
 * Local wall-clock time (ms since 1970-01-01T00:00 as if it were UTC) → UTC instants in
 * one IANA zone, through luxon's zone data, with the zone's offset segments cached so a
 * file of a million rows asks luxon about a handful of instants, not every row.
 *
 * A segment is a span of instants with one UTC offset, found by probing luxon week by
 * week (up to 12 weeks either side) and bisecting to the millisecond at a change, so
 * offset changes less than a week apart are assumed not to happen (none does in the
 * zone data since 1970). Common practice; no published source.
 */
export class LocalTimeResolver {
  /** The instant(s) of the last resolve: `first` ≤ `second`; equal unless repeated. */
  first = 0;
  second = 0;
  /** For a repeated or skipped time: the instant of the offset change. */
  changeAt = 0;
  /** Wall times in [safeLo, safeHi) map to exactly one instant: wall − safeOffset. */
  safeLo = 0;
  safeHi = -1;
  safeOffset = 0;

  private readonly zone: IANAZone;
  private from = 0;
  private to = -1;
  private offset = 0;
  private before = 0;
  private after = 0;

  constructor(timeZone: string) {
    if (typeof timeZone !== "string" || !IANAZone.isValidZone(timeZone)) {
      throw new RangeError(`timeZone must be an IANA time zone such as Europe/Dublin, got ${String(timeZone)}`);
    }
    this.zone = IANAZone.create(timeZone);
  }

  /** UTC offset at instant u, in ms. */
  offsetAt(u: number): number {
    return Math.round(this.zone.offset(u) * 60_000);
  }

  /** Resolves wall time w: LOCAL_UNIQUE, LOCAL_REPEATED or LOCAL_SKIPPED, with the instants in `first`/`second`. */
  resolve(w: number): number {
    if (this.to < this.from) this.segmentAt(w - this.offsetAt(w));
    for (let attempt = 0; attempt < 4; attempt++) {
      const u = w - this.offset;
      const inCur = u >= this.from && u < this.to;
      const realPrev = this.before !== this.offset;
      const realNext = this.after !== this.offset;
      const inPrev = realPrev && w - this.before < this.from;
      const inNext = realNext && w - this.after >= this.to;
      if (inCur && inPrev) return this.repeated(w - this.before, u, this.from);
      if (inCur && inNext) return this.repeated(u, w - this.after, this.to);
      if (inCur) {
        this.first = this.second = u;
        return LOCAL_UNIQUE;
      }
      if (u < this.from && realPrev && !inPrev && attempt > 0) return this.skipped(this.from);
      if (u >= this.to && realNext && !inNext && attempt > 0) return this.skipped(this.to);
      // Outside this segment's reach: move to the segment of the instant w would have there.
      this.segmentAt(u < this.from ? w - (realPrev ? this.before : this.offset) : w - (realNext ? this.after : this.offset));
    }
    // Unreachable for real zone data (offset changes at least a week apart); fall back to luxon's reading.
    this.first = this.second = w - this.offsetAt(w - this.offsetAt(w));
    return LOCAL_UNIQUE;
  }

  private repeated(a: number, b: number, change: number): number {
    this.first = Math.min(a, b);
    this.second = Math.max(a, b);
    this.changeAt = change;
    return LOCAL_REPEATED;
  }

  private skipped(change: number): number {
    this.first = this.second = this.changeAt = change;
    return LOCAL_SKIPPED;
  }

  /** Makes the segment holding instant u current, with its neighbours' offsets and its safe wall range. */
  private segmentAt(u: number): void {
    const o = this.offsetAt(u);
    this.offset = o;
    this.from = u - PROBES * PROBE_MS;
    this.before = o;
    for (let k = 1; k <= PROBES; k++) {
      const p = u - k * PROBE_MS;
      if (this.offsetAt(p) !== o) {
        this.from = this.change(p, p + PROBE_MS);
        this.before = this.offsetAt(this.from - 1);
        break;
      }
    }
    this.to = u + PROBES * PROBE_MS;
    this.after = o;
    for (let k = 1; k <= PROBES; k++) {
      const p = u + k * PROBE_MS;
      if (this.offsetAt(p) !== o) {
        this.to = this.change(p - PROBE_MS, p);
        this.after = this.offsetAt(this.to);
        break;
      }
    }
    this.safeOffset = o;
    this.safeLo = this.from + Math.max(o, this.before);
    this.safeHi = this.to + Math.min(o, this.after);
  }

  /** The first instant in (lo, hi] whose offset differs from lo's (bisection to the ms). */
  private change(lo: number, hi: number): number {
    const first = this.offsetAt(lo);
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (this.offsetAt(mid) === first) lo = mid;
      else hi = mid;
    }
    return hi;
  }
}
