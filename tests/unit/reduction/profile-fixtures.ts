/** Profiles and tags for the runner tests (DESIGN.md "Reduction profile": a statistics and a shape profile). */
import type { Profile, ProfileTag, Series } from "@/lib/reduction";

export const T0 = Date.UTC(2026, 0, 1);

/** TT-101: a temperature, 0–150 degC, sampled every second. */
export const TT101: ProfileTag = { name: "PAST1/TT-101/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 150, samplePeriodMs: 1000 };

/**
 * Twelve 1-s samples: t = 0 … 11 s; 23 (t = 2 s) is uncertain and 99 (t = 7 s) bad.
 *   v: 20 21 23 22 20 | 25 27 99 26 24 | 30 31
 */
export const FIXTURE: Series = {
  t: Float64Array.from({ length: 12 }, (_, i) => T0 + i * 1000),
  v: Float64Array.from([20, 21, 23, 22, 20, 25, 27, 99, 26, 24, 30, 31]),
  q: Uint8Array.from([0, 0, 1, 0, 0, 0, 0, 2, 0, 0, 0, 0]),
};

/** 5-s statistics: mean, min, max (max with uncertain samples). */
export const STATISTICS: Profile = {
  name: "5 s statistics",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 5 }] },
    { name: "lo", steps: [{ method: "aggregate", fn: "min", window: 5 }] },
    { name: "hi", steps: [{ method: "aggregate", fn: "max", window: 5, "include-uncertain": true }] },
  ],
};

/** Drop bad and uncertain samples, then keep the shape within 2 % of the range. */
export const SHAPE: Profile = {
  name: "Shape 2 %",
  kinds: ["analog"],
  outputs: [
    {
      name: "shape",
      steps: [
        { method: "quality-filter", keep: "good" },
        { method: "swinging-door", deviation: { percent: 2 }, "max-interval": 600 },
      ],
    },
  ],
};

/** At least one valid step per method (a corpus the JSON Schema and zod views can share). */
export const VALID_STEPS: import("@/lib/reduction").Step[] = [
  { method: "quality-filter", keep: "good" },
  { method: "quality-filter", keep: "good-and-uncertain" },
  { method: "pass-through" },
  { method: "drop" },
  { method: "deadband", deadband: { value: 0.5, unit: "degC" } },
  { method: "deadband", deadband: { percent: 0.5 }, "max-interval": 900 },
  { method: "swinging-door", deviation: { percent: 1 }, "max-interval": 600 },
  { method: "lttb", points: 500 },
  { method: "ltob", points: 2 },
  { method: "rdp", epsilon: { value: 0.1, unit: "degC" }, distance: "perpendicular" },
  { method: "m4", window: 60, offset: 30 },
  { method: "aggregate", fn: "percentile", percentile: 95, window: 60 },
  { method: "aggregate", fn: "timeWeightedMean", interpolation: "step", window: 3600, calendar: true, "include-uncertain": true },
  { method: "exceedance-count", window: 60, threshold: { percent: 90 }, direction: "below", hysteresis: { value: 1, unit: "degC" } },
  { method: "exceedance-events", window: 600, threshold: { value: 80, unit: "degC" }, limit: 3 },
  { method: "time-above", window: 60, threshold: { value: 72, unit: "degC" }, offset: -30 },
  { method: "change-of-state" },
  { method: "transition-count", window: 3600 },
  { method: "time-in-state", window: 3600, state: 1 },
  { method: "counter-delta", window: 900, rollover: 65536 },
  { method: "counter-rate", window: 60, rollover: 1e6, "reset-share": 0.1 },
];

/** Invalid steps and the problem each must report. */
export const INVALID_STEPS: [unknown, RegExp][] = [
  [{ method: "swinging-gate" }, /unknown method "swinging-gate"/],
  [{ method: "quality-filter", keep: "all" }, /"keep": must be one of good, good-and-uncertain/],
  [{ method: "deadband" }, /"deadband": is required/],
  [{ method: "deadband", deadband: { percent: 0 } }, /percent must be within \(0, 100\]/],
  [{ method: "deadband", deadband: { percent: 101 } }, /percent must be within/],
  [{ method: "deadband", deadband: { value: -1, unit: "degC" } }, /value must be ≥ 0/],
  [{ method: "deadband", deadband: { value: 1 } }, /must be \{ value, unit \} or \{ percent \}/],
  [{ method: "deadband", deadband: 0.5 }, /must be \{ value, unit \}/],
  [{ method: "swinging-door", deviation: { percent: 1 }, "max-interval": 0 }, /"max-interval": must be > 0/],
  [{ method: "swinging-door", deviation: { percent: 1 }, maxInterval: 10 }, /unknown parameter "maxInterval"/],
  [{ method: "lttb", points: 1 }, /"points": must be ≥ 2/],
  [{ method: "lttb", points: 2.5 }, /whole number/],
  [{ method: "m4", window: -60 }, /"window": must be > 0/],
  [{ method: "aggregate", fn: "average", window: 60 }, /"fn": must be one of mean/],
  [{ method: "aggregate", fn: "percentile", window: 60 }, /fn percentile needs a percentile/],
  [{ method: "aggregate", fn: "mean", window: 60, percentile: 50 }, /percentile applies only to fn percentile/],
  [{ method: "aggregate", fn: "mean", window: 60, interpolation: "step" }, /interpolation applies only to fn timeWeightedMean/],
  [{ method: "aggregate", fn: "mean", window: 60, calendar: true }, /calendar windows are an hour/],
  [{ method: "exceedance-events", window: 60, threshold: { percent: 50 } }, /"limit": is required/],
  [{ method: "counter-delta", window: 60, rollover: 100, "reset-share": 0 }, /"reset-share": must be > 0/],
  [{ method: "time-in-state", window: 60, state: Number.NaN }, /"state": must be a finite number/],
];
