// Input rules for every method (the "Input errors"): unsorted or duplicate
// timestamps name the first bad index; empty and one-sample series work; 10M samples
// work without running out of memory. Common practice; no published source.
import { describe, expect, it } from "vitest";
import {
  aggregate,
  changeOfState,
  counterDelta,
  counterRate,
  deadband,
  drop,
  exceedanceEvents,
  exceedances,
  ltob,
  lttb,
  m4,
  measure,
  passThrough,
  qualityFilter,
  rdp,
  type Series,
  SeriesError,
  swingingDoor,
  timeAbove,
  timeInState,
  transitionCount,
  validateSeries,
} from "@/lib/reduction";
import { randomWalk, series } from "./helpers";

/** Every public method, with parameters that reduce a 1 s-sampled series. */
const METHODS: [string, (s: Series) => unknown][] = [
  ["swingingDoor", (s) => swingingDoor(s, { deviation: 0.5 })],
  ["swingingDoor max interval", (s) => swingingDoor(s, { deviation: 0.5, maxIntervalMs: 30_000 })],
  ["deadband", (s) => deadband(s, { deadband: 0.5, maxIntervalMs: 60_000 })],
  ["lttb", (s) => lttb(s, { points: Math.max(2, Math.floor(s.t.length / 10)) })],
  ["ltob", (s) => ltob(s, { points: Math.max(2, Math.floor(s.t.length / 10)) })],
  ["rdp vertical", (s) => rdp(s, { epsilon: 0.5 })],
  ["rdp perpendicular", (s) => rdp(s, { epsilon: 0.5, distance: "perpendicular" })],
  ["m4", (s) => m4(s, { windowMs: 60_000 })],
  ["aggregate mean", (s) => aggregate(s, { windowMs: 60_000, fn: "mean" })],
  ["aggregate time-weighted", (s) => aggregate(s, { windowMs: 60_000, fn: "timeWeightedMean" })],
  ["aggregate percentile", (s) => aggregate(s, { windowMs: 60_000, fn: "percentile", percentile: 95 })],
  ["exceedances", (s) => exceedances(s, { windowMs: 60_000, threshold: 0, hysteresis: 0.1 })],
  ["exceedanceEvents", (s) => exceedanceEvents(s, { windowMs: 60_000, threshold: 0, limit: 2 })],
  ["timeAbove", (s) => timeAbove(s, { windowMs: 60_000, threshold: 0 })],
  ["measure", (s) => measure(s, Uint32Array.from(s.t, (_, i) => i), { reconstruction: "linear" })],
  ["changeOfState", (s) => changeOfState(s, { gapMs: 3000 })],
  ["transitionCount", (s) => transitionCount(s, { windowMs: 60_000 })],
  ["timeInState", (s) => timeInState(s, { windowMs: 60_000, state: 0, gapMs: 3000 })],
  ["counterDelta", (s) => counterDelta(s, { windowMs: 60_000, rollover: 1e6 })],
  ["counterRate", (s) => counterRate(s, { windowMs: 3_600_000, timeZone: "Europe/Berlin", rollover: 1e6 })],
  ["qualityFilter", (s) => qualityFilter(s, { keep: "good" })],
  ["passThrough", (s) => passThrough(s)],
  ["swingingDoor with gaps", (s) => swingingDoor(s, { deviation: 0.5, gapMs: 3000 })],
  ["aggregate with gaps", (s) => aggregate(s, { windowMs: 60_000, fn: "timeWeightedMean", gapMs: 3000 })],
];

function errorOf(run: () => unknown): SeriesError {
  try {
    run();
  } catch (e) {
    if (e instanceof SeriesError) return e;
    throw e;
  }
  throw new Error("no SeriesError thrown");
}

describe("validateSeries", () => {
  it("names the first bad index: unsorted, duplicate, non-finite", () => {
    expect(errorOf(() => validateSeries(series([0, 2, 1, 3], [0, 0, 0, 0]))).index).toBe(2);
    const dup = errorOf(() => validateSeries(series([0, 1, 1, 2], [0, 0, 0, 0])));
    expect(dup.index).toBe(2);
    expect(dup.message).toMatch(/t\[2\] = 1 duplicates t\[1\]/);
    expect(errorOf(() => validateSeries(series([0, 1, 2], [0, Number.NaN, 0]))).index).toBe(1);
    expect(errorOf(() => validateSeries(series([0, 1, Number.POSITIVE_INFINITY], [0, 0, 0]))).index).toBe(2);
    expect(errorOf(() => validateSeries(series([Number.NaN, 1], [0, 0]))).index).toBe(0);
    // A bad last sample does not hide an earlier one.
    expect(errorOf(() => validateSeries(series([0, 2, 1, 3], [0, 0, 0, Number.NaN]))).index).toBe(2);
  });

  it("checks lengths, array types and quality codes", () => {
    expect(() => validateSeries({ t: new Float64Array(3), v: new Float64Array(2) })).toThrow(SeriesError);
    expect(() => validateSeries({ t: [0, 1] as unknown as Float64Array, v: new Float64Array(2) })).toThrow(TypeError);
    const s = series([0, 1, 2], [0, 0, 0]);
    expect(() => validateSeries({ ...s, q: new Uint8Array(2) })).toThrow(/q has 2/);
    expect(errorOf(() => validateSeries({ ...s, q: Uint8Array.from([0, 1, 3]) })).index).toBe(2);
    expect(() => validateSeries({ ...s, q: Uint8Array.from([0, 1, 2]) })).not.toThrow();
  });
});

describe("every method", () => {
  const base = randomWalk(5_000, 17);

  for (const [name, run] of METHODS) {
    it(`${name}: rejects unsorted or duplicate timestamps and non-finite values, naming the first bad index`, () => {
      for (const bad of [1, 2, 700, 2_500, 4_998, 4_999]) {
        const unsorted = { t: base.t.slice(), v: base.v.slice() };
        unsorted.t[bad] = unsorted.t[bad - 1] - 1;
        expect(errorOf(() => run(unsorted)).index).toBe(bad);
        const duplicate = { t: base.t.slice(), v: base.v.slice() };
        duplicate.t[bad] = duplicate.t[bad - 1];
        expect(errorOf(() => run(duplicate)).index).toBe(bad);
        const nan = { t: base.t.slice(), v: base.v.slice() };
        nan.v[bad] = Number.NaN;
        nan.v[4_999] = Number.POSITIVE_INFINITY; // a later bad sample must not be the one named
        expect(errorOf(() => run(nan)).index).toBe(bad);
      }
    });

    it(`${name}: works on empty, one- and two-sample series`, () => {
      expect(() => run(series([], []))).not.toThrow();
      expect(() => run(series([1_000], [1]))).not.toThrow();
      expect(() => run(series([1_000, 2_000], [1, 5]))).not.toThrow();
    });
  }
});

describe("drop", () => {
  it("validates its input like every method and keeps nothing", () => {
    expect(errorOf(() => drop(series([0, 2, 1], [0, 0, 0]))).index).toBe(2);
    expect(drop(randomWalk(100, 3)).length).toBe(0);
  });
});

describe("10M samples", () => {
  it("every method runs on 10 million samples without running out of memory", { timeout: 300_000 }, () => {
    const n = 10_000_000;
    const t = new Float64Array(n);
    const v = new Float64Array(n);
    let level = 0;
    for (let i = 0; i < n; i++) {
      t[i] = 1_767_225_600_000 + i * 1000;
      level += ((i * 2654435761) % 1000) / 1000 - 0.4995; // cheap deterministic wiggle
      v[i] = Math.sin(i / 5_000) * 10 + level * 0.01;
    }
    const s = { t, v };
    for (const [name, run] of METHODS) {
      const out = run(s);
      const size = out instanceof Uint32Array ? out.length : (out as { t?: Float64Array }).t?.length;
      expect(size, name).not.toBe(0);
    }
  });
});
