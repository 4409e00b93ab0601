// Profile documents (DESIGN.md "Reduction profile", "Bundle"; the shape
// schemas/profile.schema.json will describe) and the METHODS table every view reads.
import { describe, expect, it } from "vitest";
import { METHODS, OUTPUT_NAME_PATTERN, type Profile, type StepMethod, TAG_KINDS, validateProfile } from "@/lib/reduction";
import { INVALID_STEPS, SHAPE, STATISTICS, VALID_STEPS } from "./profile-fixtures";

const analog = (steps: unknown[]): Profile => ({ name: "p", kinds: ["analog"], outputs: [{ name: "out", steps: steps as Profile["outputs"][0]["steps"] }] });

describe("validateProfile", () => {
  it("accepts the fixtures and a valid step of every method", () => {
    expect(validateProfile(STATISTICS)).toEqual([]);
    expect(validateProfile(SHAPE)).toEqual([]);
    for (const step of VALID_STEPS) expect(validateProfile(analog([step])), JSON.stringify(step)).toEqual([]);
    expect(new Set(VALID_STEPS.map((s) => s.method))).toEqual(new Set(Object.keys(METHODS)));
  });

  for (const [step, problem] of INVALID_STEPS) {
    it(`refuses ${JSON.stringify(step)}`, () => {
      const problems = validateProfile(analog([step]));
      expect(problems.map((p) => p.message).join("\n")).toMatch(problem);
      expect(problems[0]).toMatchObject({ output: "out", step: 0 });
    });
  }

  it("output names: the pattern, unique; at least one output and one step", () => {
    const names = (...list: string[]) => validateProfile({ name: "p", kinds: ["analog"], outputs: list.map((name) => ({ name, steps: [{ method: "pass-through" }] })) });
    expect(names("avg", "p95", "1min", "lo_hi", "x-y")).toEqual([]);
    expect(names("Avg")[0].message).toMatch(/output name "Avg"/);
    expect(names("-avg")[0].message).toMatch(/output name/);
    expect(names("a".repeat(33))[0].message).toMatch(/output name/);
    expect(names("avg", "avg")[0].message).toMatch(/used twice/);
    expect(names()[0].message).toMatch(/at least one output/);
    expect(validateProfile(analog([]))[0].message).toMatch(/at least one step/);
    expect(OUTPUT_NAME_PATTERN.test("a".repeat(32))).toBe(true);
  });

  it("kinds: known, listed once; every step must suit every kind the profile is meant for", () => {
    expect(validateProfile({ ...SHAPE, kinds: [] })[0].message).toMatch(/kinds must list/);
    expect(validateProfile({ ...SHAPE, kinds: ["analog", "analog"] })[0].message).toMatch(/twice/);
    const mixed = validateProfile({ ...SHAPE, kinds: ["analog", "discrete"] });
    expect(mixed.map((p) => p.message)).toEqual([expect.stringMatching(/step 1 \(swinging-door\): swinging-door does not suit discrete tags/)]);
  });
});

describe("METHODS", () => {
  const methods = Object.values(METHODS);

  it("analog takes any method; discrete and counter only their own and pass-through, drop, quality filter (DESIGN.md Signals)", () => {
    for (const m of methods) expect(m.kinds).toContain("analog");
    const common = ["drop", "pass-through", "quality-filter"];
    expect(methods.filter((m) => m.kinds.includes("discrete")).map((m) => m.method).sort()).toEqual([...common, "change-of-state", "time-in-state", "transition-count"].sort());
    expect(methods.filter((m) => m.kinds.includes("counter")).map((m) => m.method).sort()).toEqual([...common, "counter-delta", "counter-rate"].sort());
    for (const m of methods) for (const k of m.kinds) expect(TAG_KINDS).toContain(k);
  });

  it("LTTB, LTOB, RDP and M4 are batch-only; every other method streams", () => {
    expect(methods.filter((m) => !m.streaming).map((m) => m.method)).toEqual(["lttb", "ltob", "rdp", "m4"] satisfies StepMethod[]);
  });

  it("each entry names its method, a source and a one-sentence guarantee; magnitudes list the magnitude parameters", () => {
    for (const [key, m] of Object.entries(METHODS)) {
      expect(m.method).toBe(key);
      expect(m.source.length).toBeGreaterThan(10);
      expect(m.guarantee).toMatch(/^[A-Z].*\.$/);
      expect(m.guarantee.split(". ").length).toBe(1);
      expect(m.magnitudes).toEqual(m.params.filter((p) => p.type === "magnitude").map((p) => p.name));
      for (const p of m.params) if (p.type === "magnitude") expect(["width", "level"]).toContain(p.magnitude);
    }
    expect(METHODS["swinging-door"].guarantee).toBe("Every dropped sample stays within ±deviation of the line between the kept samples around it.");
    expect(METHODS.aggregate.role).toBe("aggregation");
    expect(METHODS["change-of-state"]).toMatchObject({ role: "selection", lossy: false, reconstruction: "step" });
  });
});
