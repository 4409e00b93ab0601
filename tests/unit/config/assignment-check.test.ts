import { describe, expect, it } from "vitest";
import { checkAssignment, hasLossyStep } from "@/lib/config/assignment-check";
import { resolveSteps, type Profile, type ProfileTag } from "@/lib/reduction/profile";
import { convertUnit } from "@/lib/units";

const tag = (name: string, unit: string, range: [number, number] | null = [0, 100], kind: ProfileTag["kind"] = "analog"): ProfileTag => ({
  name,
  unit,
  kind,
  euLow: range?.[0] ?? null,
  euHigh: range?.[1] ?? null,
  samplePeriodMs: 1000,
});

const shape: Profile = {
  name: "shape",
  kinds: ["analog"],
  outputs: [{ name: "shape", steps: [{ method: "quality-filter", keep: "good" }, { method: "swinging-door", deviation: { value: 1, unit: "degC" }, "max-interval": 600 }] }],
};
const ctx = { convert: convertUnit };

describe("checkAssignment", () => {
  it("accepts °C widths on °F tags: a 1 °C deviation is 1.8 °F (°F = °C × 9/5 + 32, NIST SP 811 B.9; a difference drops the 32)", () => {
    const f = tag("OVEN/TT-1/PV", "degF", [32, 400]);
    expect(checkAssignment(shape, [f], [], [], ctx)).toEqual([]);
    const resolved = resolveSteps(shape, f, ctx).outputs[0].steps[1] as { deviation: number };
    expect(resolved.deviation).toBeCloseTo(1.8, 12);
  });

  it("refuses °C on kPa tags at the profile, naming the tag", () => {
    const problems = checkAssignment(shape, [tag("LINE/PT-1/PV", "kPa")], [], [], ctx);
    expect(problems).toHaveLength(1);
    expect(problems[0].field).toBe("profile");
    expect(problems[0].message).toMatch(/^tag LINE\/PT-1\/PV: .*kPa/);
  });

  it("points at the override that brings the bad unit or the percent without a range", () => {
    const tags = [tag("A/TT-1/PV", "degC"), tag("A/TT-2/PV", "degC", null)];
    const pct = { output: "shape", step: 1, parameter: "deviation", value: { percent: 1 } };
    const problems = checkAssignment(shape, tags, [pct], [], ctx);
    expect(problems).toEqual([{ field: "overrides[0].value", message: expect.stringMatching(/A\/TT-2\/PV.*no engineering range/) }]);
    // A tag override replacing it for the tag without a range fixes that tag.
    const fixed = checkAssignment(shape, tags, [pct], [{ tag: "A/TT-2/PV", overrides: [{ output: "shape", step: 1, parameter: "deviation", value: { value: 0.4, unit: "degC" } }] }], ctx);
    expect(fixed).toEqual([]);
    const badTag = checkAssignment(shape, tags, [], [{ tag: "A/TT-1/PV", overrides: [{ output: "shape", step: 1, parameter: "deviation", value: { value: 2, unit: "bar" } }] }], ctx);
    expect(badTag).toEqual([{ field: "tagOverrides[0].overrides[0].value", message: expect.stringMatching(/bar/) }]);
  });

  it("refuses overrides naming a missing output, step or parameter, or a value out of range", () => {
    const t = [tag("A/TT-1/PV", "degC")];
    const o = (x: object) => ({ output: "shape", step: 1, parameter: "deviation", value: 1, ...x });
    expect(checkAssignment(shape, t, [o({ output: "nope" })], [], ctx)[0]).toMatchObject({ field: "overrides[0]", message: 'the profile has no output "nope"' });
    expect(checkAssignment(shape, t, [o({ step: 5 })], [], ctx)[0].message).toBe('output "shape" has no step 6');
    expect(checkAssignment(shape, t, [o({ parameter: "epsilon" })], [], ctx)[0].message).toBe('swinging-door has no parameter "epsilon"');
    expect(checkAssignment(shape, t, [o({ parameter: "max-interval", value: -5 })], [], ctx)[0].field).toBe("overrides[0]");
    expect(checkAssignment(shape, t, [o({ parameter: "max-interval", value: 300 })], [], ctx)).toEqual([]);
  });

  it("refuses steps that do not suit a tag's kind and lists at most 20 problems", () => {
    const many = Array.from({ length: 30 }, (_, i) => tag(`V/XV-${i}/STATE`, "state", null, "discrete"));
    const problems = checkAssignment(shape, many, [], [], ctx);
    // The same problem on every tag is listed per tag (each names its tag), capped with a count.
    expect(problems).toHaveLength(21);
    expect(problems[0].message).toMatch(/V\/XV-0\/STATE.*does not suit discrete/);
    expect(problems[20].message).toBe("… and 10 more problems like these");
  });

  it("knows lossless profiles", () => {
    expect(hasLossyStep(shape)).toBe(true);
    expect(hasLossyStep({ ...shape, outputs: [{ name: "raw", steps: [{ method: "pass-through" }] }] })).toBe(false);
  });
});
