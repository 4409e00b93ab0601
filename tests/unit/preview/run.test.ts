// previewProfile — DESIGN.md "Metrics": samples in/out, ratio, max error and RMSE of the
// reconstruction (linear for shape methods, step-hold for deadband), extrema kept, plain
// bytes (bytes per sample + transport overhead) and Gorilla bytes (Pelkonen et al. 2015).
// The oracles are lib/reduction's measure() and encodedBits(), called directly, and
// hand-worked values.
import { describe, expect, it } from "vitest";
import { mulberry32, previewProfile } from "@/lib/preview";
import { type Profile, ProfileError, type ProfileTag, type Series, encodedBits, measure, runProfile } from "@/lib/reduction";

const T0 = Date.UTC(2026, 0, 1); // a multiple of 5 s and of 2 h
const TAG: ProfileTag = { name: "PAST1/TT-101/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 100, samplePeriodMs: 1000 };
const BYTES = { bytesPerSample: 10, transportOverhead: 0.25 };

/** v = 0 … 9 at 1-s steps: a straight line. */
const LINE: Series = { t: Float64Array.from({ length: 10 }, (_, i) => T0 + i * 1000), v: Float64Array.from({ length: 10 }, (_, i) => i) };

const HAND: Profile = {
  name: "hand",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 5 }] },
    { name: "cnt", steps: [{ method: "aggregate", fn: "count", window: 5 }] },
    { name: "raw", steps: [{ method: "pass-through" }] },
    { name: "none", steps: [{ method: "drop" }] },
    { name: "hour", steps: [{ method: "aggregate", fn: "mean", window: 3600 }] },
  ],
};

describe("previewProfile — hand-worked", () => {
  const out = Object.fromEntries(previewProfile(LINE, HAND, TAG, { byteModel: BYTES }).map((o) => [o.name, o]));

  it("returns every output, in the profile's order", () => {
    expect(Object.keys(out)).toEqual(["avg", "cnt", "raw", "none", "hour"]);
  });

  it("5-s mean: windows [0, 5) and [5, 10) give 2 and 7; step-hold from the window start errs 2, 1, 0, 1, 2 per window", () => {
    const m = out.avg.metrics;
    expect(out.avg.reconstruction).toBe("step");
    expect(out.avg.kept).toBeNull();
    expect(Array.from(out.avg.reduced.v)).toEqual([2, 7]);
    expect(m.samplesOut).toBe(2);
    expect(m.ratio).toBe(5);
    expect(m.maxAbsError).toBe(2);
    // Squares 4 + 1 + 0 + 1 + 4 = 10 per window, 20 over 10 samples: RMSE √2.
    expect(m.rmse).toBeCloseTo(Math.SQRT2, 12);
    // Plain bytes: 2 samples × 10 bytes × (1 + 0.25) = 25.
    expect(m.bytesPlain).toBe(25);
  });

  it("a count per window is not a level of the signal: no reconstruction, no error", () => {
    expect(out.cnt.reconstruction).toBeNull();
    expect(out.cnt.metrics).toMatchObject({ samplesOut: 2, maxAbsError: null, rmse: null, extremaKeptShare: null });
  });

  it("pass-through: 10 samples × 10 bytes × 1.25 = 125 bytes; no reconstruction applies; no extrema to lose (share 1)", () => {
    expect(out.raw.metrics).toMatchObject({ samplesIn: 10, samplesOut: 10, ratio: 1, maxAbsError: null, rmse: null, extremaKeptShare: 1, bytesPlain: 125 });
    expect(Array.from(out.raw.kept as Uint32Array)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it("drop: nothing sent, ratio Infinity, no error, no bytes", () => {
    expect(out.none.metrics).toEqual({
      samplesIn: 10,
      samplesOut: 0,
      ratio: Infinity,
      maxAbsError: null,
      rmse: null,
      extremaKeptShare: null,
      bytesPlain: 0,
      bytesCompressed: 0,
    });
  });

  it("one sample at a 2-h block start: Gorilla header 64 + first delta 23 + value 64 = 151 bits → 19 bytes", () => {
    expect(out.hour.reduced.t[0]).toBe(T0);
    expect(out.hour.metrics.bytesCompressed).toBe(19);
  });

  it("the default byte model: 16 bytes + 10 % per sample", () => {
    const [raw] = previewProfile(LINE, { ...HAND, outputs: [HAND.outputs[2]] }, TAG, {});
    expect(raw.metrics.bytesPlain).toBeCloseTo(10 * 16 * 1.1, 9);
  });
});

/**
 * 14 samples, 1 s apart, with a gap (5 s → 20 s, longer than 3 × 1 s), an uncertain
 * sample (index 2) and a bad one (index 8).
 */
const MIXED: Series = {
  t: Float64Array.from([0, 1, 2, 3, 4, 5, 20, 21, 22, 23, 24, 25, 26, 27], (s) => T0 + s * 1000),
  v: Float64Array.from([20, 21.5, 24, 22, 22, 25, 27, 30, 99, 26, 26, 30, 31, 29]),
  q: Uint8Array.from([0, 0, 1, 0, 0, 0, 0, 0, 2, 0, 0, 0, 0, 0]),
};

const MIXED_PROFILE: Profile = {
  name: "mixed",
  kinds: ["analog"],
  outputs: [
    {
      name: "shape",
      steps: [
        { method: "quality-filter", keep: "good" },
        { method: "swinging-door", deviation: { percent: 2 } },
      ],
    },
    { name: "db", steps: [{ method: "deadband", deadband: { value: 1.5, unit: "degC" } }] },
    { name: "hi", steps: [{ method: "aggregate", fn: "max", window: 5, "include-uncertain": true }] },
    { name: "cos", steps: [{ method: "change-of-state" }] },
  ],
};

describe("previewProfile — metrics equal measure() and encodedBits() called directly", () => {
  const previews = previewProfile(MIXED, MIXED_PROFILE, TAG, { byteModel: BYTES });
  const run = runProfile(MIXED, MIXED_PROFILE, TAG);
  const want = { shape: "linear", db: "step", hi: "step", cos: "step" } as const;

  it.each(previews.map((p) => [p.name, p] as const))("%s", (name, p) => {
    const r = run[name];
    expect(p.reconstruction).toBe(want[name as keyof typeof want]);
    expect(Array.from(p.reduced.t)).toEqual(Array.from(r.series.t));
    const reduced = r.kept ?? r.series;
    // The tag's gap threshold: 3 × 1 s (DESIGN.md "Signals").
    const m = measure(MIXED, reduced, { reconstruction: want[name as keyof typeof want], gapMs: 3000 });
    expect(p.metrics).toEqual({
      samplesIn: 14,
      samplesOut: r.series.t.length,
      ratio: 14 / r.series.t.length,
      maxAbsError: m.maxAbsError,
      rmse: m.rmse,
      extremaKeptShare: m.extremaKeptShare,
      bytesPlain: r.series.t.length * 10 * 1.25,
      bytesCompressed: Math.ceil(encodedBits(r.series) / 8),
    });
    expect(p.metrics.samplesOut).toBeLessThan(14);
  });

  it("change of state keeps every change: step-hold reproduces the input exactly (error 0), two repeats dropped", () => {
    expect(previews[3].metrics).toMatchObject({ samplesOut: 12, maxAbsError: 0, rmse: 0 });
  });

  it("the shape output keeps the samples on both sides of the gap and drops the uncertain and bad ones", () => {
    const shape = previews[0];
    const kept = Array.from(shape.kept as Uint32Array);
    expect(kept).toEqual(expect.arrayContaining([0, 5, 6, 13]));
    expect(kept).not.toContain(2);
    expect(kept).not.toContain(8);
    // Swinging door's bound: deviation 2 % of 0–100 = 2 degC.
    expect(shape.metrics.maxAbsError).toBeLessThanOrEqual(2);
  });

  it("a larger gap factor changes what counts as a gap, and the error follows measure() with it", () => {
    const [hi] = previewProfile(MIXED, { ...MIXED_PROFILE, outputs: [MIXED_PROFILE.outputs[2]] }, TAG, { gapFactor: 100 });
    const r = runProfile(MIXED, { ...MIXED_PROFILE, outputs: [MIXED_PROFILE.outputs[2]] }, TAG, { gapFactor: 100 }).hi;
    expect(hi.metrics.rmse).toBe(measure(MIXED, r.series, { reconstruction: "step", gapMs: 100_000 }).rmse);
  });
});

describe("previewProfile — a series without quality or gaps", () => {
  it("metrics equal measure() given the tag's gap threshold (measure's general loops), though the preview may take its plain ones", () => {
    const rand = mulberry32(7);
    let x = 50;
    const s: Series = { t: Float64Array.from({ length: 5000 }, (_, i) => T0 + i * 1000 + Math.round(400 * rand())), v: Float64Array.from({ length: 5000 }, () => (x += rand() - 0.5)) };
    const profile: Profile = { name: "p", kinds: ["analog"], outputs: [{ name: "sd", steps: [{ method: "swinging-door", deviation: { value: 0.4, unit: "degC" } }] }, { name: "avg", steps: [{ method: "aggregate", fn: "median", window: 60 }] }] };
    const run = runProfile(s, profile, TAG);
    for (const p of previewProfile(s, profile, TAG, {})) {
      const m = measure(s, run[p.name].kept ?? run[p.name].series, { reconstruction: p.reconstruction as "linear" | "step", gapMs: 3000 });
      expect([p.metrics.maxAbsError, p.metrics.rmse, p.metrics.extremaKeptShare]).toEqual([m.maxAbsError, m.rmse, m.extremaKeptShare]);
      expect(p.metrics.maxAbsError).toBeGreaterThan(0);
    }
  });
});

describe("previewProfile — edges", () => {
  it("fractional-ms timestamps (from a CSV) are counted by Gorilla at whole ms", () => {
    const s: Series = { t: Float64Array.from([T0 + 0.25, T0 + 1000.5, T0 + 2000.75]), v: Float64Array.from([1, 2, 4]) };
    const [raw] = previewProfile(s, { name: "p", kinds: ["analog"], outputs: [{ name: "raw", steps: [{ method: "pass-through" }] }] }, TAG, {});
    const rounded = { t: Float64Array.from([T0, T0 + 1001, T0 + 2001]), v: s.v };
    expect(raw.metrics.bytesCompressed).toBe(Math.ceil(encodedBits(rounded) / 8));
  });

  it("throws the runner's ProfileError for a step that does not suit the tag, and refuses a bad byte model", () => {
    const discrete: ProfileTag = { ...TAG, kind: "discrete" };
    expect(() => previewProfile(LINE, MIXED_PROFILE, discrete, {})).toThrow(ProfileError);
    expect(() => previewProfile(LINE, HAND, TAG, { byteModel: { bytesPerSample: 0, transportOverhead: 0 } })).toThrow(RangeError);
    expect(() => previewProfile(LINE, HAND, TAG, { byteModel: { bytesPerSample: 16, transportOverhead: -0.1 } })).toThrow(RangeError);
  });
});
