// sweepParameter (issue #8) on a real series. Oracles: previewProfile's metrics at the
// same setting, and swinging door's published bound (E. H. Bristol, "Swinging door
// trending: adaptive trend recording?", ISA 1990: every dropped sample within ±deviation
// of the line between kept samples, so the max error is at most the deviation).
import { describe, expect, it } from "vitest";
import { bestPoint, demoSignal, findSetting, gridValues, previewProfile, sweepParameter } from "@/lib/preview";
import { type Profile, ProfileError, type ProfileTag } from "@/lib/reduction";

const TAG: ProfileTag = { name: "PAST1/TT-101/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 100, samplePeriodMs: 1000 };
const SHAPE: Profile = {
  name: "shape",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 60 }] },
    {
      name: "shape",
      steps: [
        { method: "quality-filter", keep: "good" },
        { method: "swinging-door", deviation: { value: 0.5, unit: "degC" }, "max-interval": 600 },
      ],
    },
  ],
};

describe("sweepParameter on a real series (demo temperature, 20,000 samples)", () => {
  const s = demoSignal("temperature", { samples: 20_000, periodMs: 1000, seed: 11 });
  const target = { output: "shape", step: 1, parameter: "deviation" };
  const values = gridValues(0.01, 2, 12, "log");
  const points = sweepParameter(s, SHAPE, TAG, target, values, {});

  it("swinging door: every point's max error within its deviation; the ratio grows overall (not asserted monotone)", () => {
    expect(points.map((p) => p.value)).toEqual(values);
    for (const p of points) expect(p.maxAbsError).toBeLessThanOrEqual(p.value + 1e-9);
    expect(points[points.length - 1].ratio).toBeGreaterThan(5 * points[0].ratio);
    const rises = points.slice(1).filter((p, i) => p.ratio >= points[i].ratio).length;
    expect(rises).toBeGreaterThanOrEqual(points.length - 3);
  });

  it("each point equals previewProfile at that deviation", () => {
    for (const p of [points[0], points[7]]) {
      const profile: Profile = { ...SHAPE, outputs: [{ ...SHAPE.outputs[1], steps: [SHAPE.outputs[1].steps[0], { method: "swinging-door", deviation: { value: p.value, unit: "degC" }, "max-interval": 600 }] }] };
      const [m] = previewProfile(s, profile, TAG, {}).map((o) => o.metrics);
      expect(p).toEqual({ value: p.value, ratio: m.ratio, maxAbsError: m.maxAbsError, rmse: m.rmse });
    }
  });

  it("findSetting for max error 0.3 °C picks a deviation whose max error is within the bound", () => {
    const evaluate = (x: number) => sweepParameter(s, SHAPE, TAG, target, [x], {})[0];
    const { best } = findSetting(evaluate, values, { maxError: 0.3 });
    expect(best).not.toBeNull();
    expect(best?.maxAbsError).toBeLessThanOrEqual(0.3);
    expect(best?.ratio).toBeGreaterThanOrEqual(bestPoint(points, { maxError: 0.3 })?.ratio as number);
  });

  it("a percent parameter stays percent; an override of the same output applies first", () => {
    const pct: Profile = { ...SHAPE, outputs: [{ name: "shape", steps: [{ method: "swinging-door", deviation: { percent: 1 } }] }] };
    const [p] = sweepParameter(s, pct, TAG, { output: "shape", step: 0, parameter: "deviation" }, [0.25], {});
    const [m] = previewProfile(s, { ...pct, outputs: [{ name: "shape", steps: [{ method: "swinging-door", deviation: { percent: 0.25 } }] }] }, TAG, {});
    expect(p.maxAbsError).toBe(m.metrics.maxAbsError);
    expect(p.ratio).toBe(m.metrics.ratio);
    const ctx = { overrides: [{ output: "shape", step: 0, parameter: "max-interval", value: 5 }] };
    const [capped] = sweepParameter(s, pct, TAG, { output: "shape", step: 0, parameter: "deviation" }, [0.25], ctx);
    expect(capped.ratio).toBeLessThanOrEqual(5.000001);
  });

  it("an aggregate of other kinds gives NaN errors; unknown outputs, steps and parameters are refused", () => {
    const cnt: Profile = { ...SHAPE, outputs: [{ name: "n", steps: [{ method: "aggregate", fn: "count", window: 60 }] }] };
    const [p] = sweepParameter(s, cnt, TAG, { output: "n", step: 0, parameter: "window" }, [120], {});
    expect(p.maxAbsError).toBeNaN();
    expect(p.ratio).toBeGreaterThan(100);
    expect(() => sweepParameter(s, SHAPE, TAG, { ...target, output: "nope" }, [1], {})).toThrow(ProfileError);
    expect(() => sweepParameter(s, SHAPE, TAG, { ...target, step: 5 }, [1], {})).toThrow(ProfileError);
    expect(() => sweepParameter(s, SHAPE, TAG, { output: "shape", step: 0, parameter: "keep" }, [1], {})).toThrow(ProfileError);
  });
});
