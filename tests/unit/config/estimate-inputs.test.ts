import { describe, expect, it } from "vitest";
import { DEFAULT_BITS_PER_SAMPLE, DEFAULT_PEAK_FACTOR, groupEstimateInput } from "@/lib/config/estimate-inputs";
import { DEFAULT_RATIOS } from "@/lib/estimates";
import type { Profile } from "@/lib/reduction/profile";

const doc: Profile = {
  name: "mixed",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "quality-filter", keep: "good" }, { method: "aggregate", fn: "mean", window: 60 }] },
    { name: "shape", steps: [{ method: "swinging-door", deviation: { percent: 1 } }] },
  ],
};

describe("groupEstimateInput", () => {
  it("takes a windowed output's ratio from the window and each tag's period (at most one sample per window)", () => {
    // 1 s tags: 60 in per window → 60:1; a 120 s tag sends every sample (a window holds at most one) → 1:1.
    const g = groupEstimateInput("g", doc, [{ samplePeriodMs: 1000 }, { samplePeriodMs: 120_000 }], null, "pass-through");
    const avg = g.outputs.find((o) => o.output === "avg")!;
    // In: 86,400 + 720 a day; out: 1,440 + 720 → (87,120 ÷ 2,160).
    expect(avg.ratio).toBeCloseTo(87_120 / 2_160, 12);
    expect(avg).toMatchObject({ peakRatio: avg.ratio, source: "window", bitsPerSample: DEFAULT_BITS_PER_SAMPLE });
  });

  it("uses the stated default per selection method, with a denser peak, and measured ratios when given", () => {
    const g = groupEstimateInput("g", doc, [{ samplePeriodMs: 1000 }], null, "pass-through");
    const shape = g.outputs.find((o) => o.output === "shape")!;
    expect(shape).toMatchObject({ ratio: DEFAULT_RATIOS["swinging-door"], peakRatio: Math.max(1, DEFAULT_RATIOS["swinging-door"] / DEFAULT_PEAK_FACTOR), source: "default" });
    const m = groupEstimateInput("g", doc, [{ samplePeriodMs: 1000 }], [{ output: "shape", ratio: 23, peakRatio: 4, bitsPerSample: 51 }], "pass-through");
    expect(m.outputs.find((o) => o.output === "shape")).toEqual({ output: "shape", ratio: 23, peakRatio: 4, bitsPerSample: 51, source: "measured" });
  });

  it("follows the site's default handling for a group without a profile", () => {
    expect(groupEstimateInput("g", null, [{ samplePeriodMs: 1000 }], null, "pass-through").outputs).toEqual([
      { output: "pass-through", ratio: 1, peakRatio: 1, bitsPerSample: DEFAULT_BITS_PER_SAMPLE, source: "default" },
    ]);
    expect(groupEstimateInput("g", null, [{ samplePeriodMs: 1000 }], null, "drop").outputs[0].ratio).toBe(Infinity);
  });
});
