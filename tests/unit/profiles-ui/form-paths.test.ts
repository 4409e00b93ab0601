import { describe, expect, it } from "vitest";
import { describeFieldPath, fieldId, flattenErrors, issueToFormPath, splitLine } from "@/components/profiles/form-paths";

describe("server issue path → form field path", () => {
  it("takes the zod paths of the route handlers", () => {
    expect(issueToFormPath("document.outputs.0.steps.1.deviation")).toBe("outputs.0.steps.1.deviation");
    expect(issueToFormPath("document.outputs.0.steps.1.deviation.percent")).toBe("outputs.0.steps.1.deviation.percent");
    expect(issueToFormPath("document.name")).toBe("name");
  });

  it("takes the bracketed paths of the JSON Schema check", () => {
    expect(issueToFormPath("document.outputs[0].steps[1].max-interval")).toBe("outputs.0.steps.1.max-interval");
    expect(issueToFormPath('outputs[2]["odd key"]')).toBe("outputs.2.odd key");
  });

  it("sends whole-document problems to the form and a conflict nowhere", () => {
    expect(issueToFormPath("document")).toBe("");
    expect(issueToFormPath("note")).toBe("note");
    expect(issueToFormPath("baseRevision")).toBeNull();
  });
});

describe("form errors as a list", () => {
  it("flattens nested errors, array-level ones at the array's name, and skips refs", () => {
    const ref = { self: null as unknown };
    ref.self = ref;
    const errors = {
      name: { type: "too_small", message: "Give the profile a name.", ref },
      outputs: [
        {
          steps: Object.assign([undefined, { deviation: { type: "invalid_union", message: "Give the deviation." } }], {
            root: { type: "custom", message: "At most 16 steps." },
          }),
        },
      ],
    };
    expect(flattenErrors(errors)).toEqual([
      { path: "name", message: "Give the profile a name." },
      { path: "outputs.0.steps", message: "At most 16 steps." },
      { path: "outputs.0.steps.1.deviation", message: "Give the deviation." },
    ]);
  });

  it("names a field in words", () => {
    expect(describeFieldPath("outputs.0.steps.1.deviation.value", ["avg"])).toBe('Output "avg", step 2, deviation value');
    expect(describeFieldPath("outputs.1.steps.0.threshold.percent", ["avg"])).toBe("Output 2, step 1, threshold (% of range)");
    expect(describeFieldPath("outputs.0.steps.0.max-interval", [""])).toBe("Output 1, step 1, max interval");
    expect(describeFieldPath("kinds")).toBe("Kinds");
    expect(describeFieldPath("")).toBe("The profile");
  });

  it("makes DOM ids and splits import lines", () => {
    expect(fieldId("outputs.0.steps.1.max-interval")).toBe("pf-outputs-0-steps-1-max-interval");
    expect(splitLine("line 12: must be one of good, good-and-uncertain")).toEqual({ line: 12, message: "must be one of good, good-and-uncertain" });
    expect(splitLine("is required")).toEqual({ line: null, message: "is required" });
  });
});
