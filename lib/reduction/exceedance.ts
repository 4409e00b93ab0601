import { requireFinite, requireNonNegative } from "./params";
import type { Series } from "./series";
import { splitWindows, type WindowParams, windowParams, type Windows } from "./windows";

export type ExceedanceParams = WindowParams & {
  threshold: number;
  /** `above` (default) counts upward crossings, `below` downward ones. */
  direction?: "above" | "below";
  /** Re-arm only after the value returns past threshold ∓ hysteresis (default 0). */
  hysteresis?: number;
};

export type ExceedanceEventParams = ExceedanceParams & {
  /** A window is an event when its crossing count exceeds this limit. */
  limit: number;
};

export type TimeAboveParams = WindowParams & { threshold: number };

/**
 * Threshold crossings per window — common practice (no canonical source), a Schmitt
 * trigger: `above` counts each step from ≤ threshold to > threshold; after one, the
 * count re-arms only once the value is ≤ threshold − hysteresis. `below` mirrors it
 * (from ≥ threshold to < threshold, re-arm at ≥ threshold + hysteresis). A series that
 * starts past the threshold does not count as a crossing. A crossing belongs to the
 * window of the sample that completes it; a window with samples but no crossing gives 0.
 */
export function exceedances(s: Series, p: ExceedanceParams): Series {
  const [windowMs, offsetMs] = windowParams(p);
  const w = splitWindows(s, windowMs, offsetMs);
  return { t: w.start, v: countCrossings(s.v, w, crossingParams(p)) };
}

/**
 * Exceedance events — common practice: the windows whose crossing count (as in
 * {@link exceedances}) is greater than `limit`; v is the count.
 */
export function exceedanceEvents(s: Series, p: ExceedanceEventParams): Series {
  const [windowMs, offsetMs] = windowParams(p);
  const limit = requireNonNegative("limit", p.limit);
  const w = splitWindows(s, windowMs, offsetMs);
  const counts = countCrossings(s.v, w, crossingParams(p));
  let events = 0;
  for (let k = 0; k < w.count; k++) if (counts[k] > limit) events++;
  const t = new Float64Array(events);
  const v = new Float64Array(events);
  for (let k = 0, e = 0; k < w.count; k++) {
    if (counts[k] > limit) {
      t[e] = w.start[k];
      v[e++] = counts[k];
    }
  }
  return { t, v };
}

/**
 * Time above threshold per window, in ms — common practice: each value holds until the
 * next sample (step-hold, as for deadband reconstruction); the time where the held value
 * is strictly above the threshold is summed within [window start, window end). The value
 * before a window's first sample is the previous sample's; the last sample of the series
 * holds to its window's end.
 */
export function timeAbove(s: Series, p: TimeAboveParams): Series {
  const [windowMs, offsetMs] = windowParams(p);
  const threshold = requireFinite("threshold", p.threshold);
  const { t, v } = s;
  const w = splitWindows(s, windowMs, offsetMs);
  const out = new Float64Array(w.count);
  fillTimeAbove(t, v, w, threshold, out);
  return { t: w.start, v: out };
}

/** Nothing follows the loop, so V8's mid-loop compiled code stays valid (see windows.ts). */
function fillTimeAbove(t: Float64Array, v: Float64Array, w: Windows, threshold: number, out: Float64Array): void {
  const { begin, start, windowMs, count } = w;
  for (let k = 0; k < count; k++) {
    const from = begin[k];
    const last = begin[k + 1] - 1;
    let ms = 0;
    if (from > 0 && v[from - 1] > threshold) ms += t[from] - start[k];
    for (let i = from; i < last; i++) if (v[i] > threshold) ms += t[i + 1] - t[i];
    if (v[last] > threshold) ms += start[k] + windowMs - t[last];
    out[k] = ms;
  }
}

type Crossing = { threshold: number; below: boolean; hysteresis: number };

function crossingParams(p: ExceedanceParams): Crossing {
  const threshold = requireFinite("threshold", p.threshold);
  const direction = p.direction ?? "above";
  if (direction !== "above" && direction !== "below") {
    throw new RangeError(`direction must be "above" or "below", got ${String(direction)}`);
  }
  const hysteresis = p.hysteresis === undefined ? 0 : requireNonNegative("hysteresis", p.hysteresis);
  return { threshold, below: direction === "below", hysteresis };
}

function countCrossings(v: Float64Array, w: Windows, c: Crossing): Float64Array {
  const counts = new Float64Array(w.count);
  if (w.count === 0) return counts;
  // Mirror `below` onto `above` by negating values and threshold.
  const sign = c.below ? -1 : 1;
  const threshold = sign * c.threshold;
  const rearm = threshold - c.hysteresis;
  let armed = !(sign * v[0] > threshold);
  for (let k = 0; k < w.count; k++) {
    let count = 0;
    const end = w.begin[k + 1];
    for (let i = w.begin[k]; i < end; i++) {
      const x = sign * v[i];
      if (armed) {
        if (x > threshold) {
          count++;
          armed = false;
        }
      } else if (x <= rearm) {
        armed = true;
      }
    }
    counts[k] = count;
  }
  return counts;
}
