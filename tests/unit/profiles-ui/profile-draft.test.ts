import { describe, expect, it } from "vitest";
import { emptyStep, newProfileDraft, toDocument, toDraft, type ProfileDraft } from "@/components/profiles/profile-draft";
import { profileFormSchema } from "@/components/profiles/profile-form-schema";
import type { Profile } from "@/lib/reduction/profile";

const stats: Profile = {
  name: "1-minute statistics",
  description: "Mean, min and max per minute",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "quality-filter", keep: "good" }, { method: "aggregate", fn: "timeWeightedMean", window: 60, interpolation: "step" }] },
    { name: "shape", steps: [{ method: "swinging-door", deviation: { percent: 0.5 }, "max-interval": 600 }] },
    { name: "alarms", steps: [{ method: "exceedance-count", window: 3600, threshold: { value: -5, unit: "degC" }, hysteresis: { value: 0.5, unit: "degC" }, direction: "below" }] },
  ],
};

const paths = (draft: ProfileDraft) => {
  const r = profileFormSchema.safeParse(draft);
  return r.success ? [] : r.error.issues.map((i) => i.path.join("."));
};

describe("profile drafts", () => {
  it("round-trips a document through the form values", () => {
    expect(toDocument(toDraft(stats))).toEqual(stats);
    expect(profileFormSchema.parse(toDraft(stats))).toEqual(stats);
  });

  it("holds every parameter of a new step, optional ones empty and required choices on their first value", () => {
    expect(emptyStep("swinging-door")).toEqual({ method: "swinging-door", deviation: { mode: "absolute", value: "", unit: "", percent: "" }, "max-interval": "" });
    expect(emptyStep("quality-filter")).toEqual({ method: "quality-filter", keep: "good" });
    expect(emptyStep("aggregate")).toMatchObject({ fn: "mean", calendar: false, interpolation: "" });
  });

  it("leaves empty optional fields and parameters that do not apply out of the document", () => {
    const draft = newProfileDraft();
    draft.name = " Shape ";
    draft.outputs[0].name = "shape";
    draft.outputs[0].steps = [
      { ...emptyStep("swinging-door"), deviation: { mode: "percent", value: "3", unit: "degC", percent: "0.5" } },
      { ...emptyStep("aggregate"), window: "60", percentile: "95", interpolation: "linear" },
    ];
    expect(toDocument(draft)).toEqual({
      name: "Shape",
      kinds: ["analog"],
      outputs: [{ name: "shape", steps: [{ method: "swinging-door", deviation: { percent: 0.5 } }, { method: "aggregate", fn: "mean", window: 60 }] }],
    });
  });

  it("reports problems at the form's own field names", () => {
    const draft = newProfileDraft();
    draft.name = "x";
    draft.outputs[0].name = "Bad Name";
    expect(paths(draft)).toEqual(["outputs.0.name", "outputs.0.steps"]);
    draft.outputs[0].name = "ok";
    draft.outputs[0].steps = [{ ...emptyStep("swinging-door"), deviation: { mode: "percent", value: "", unit: "", percent: "150" }, "max-interval": "abc" }];
    expect(paths(draft)).toEqual(["outputs.0.steps.0.deviation.percent", "outputs.0.steps.0.max-interval"]);
    draft.outputs[0].steps = [emptyStep("swinging-door")];
    expect(paths(draft)).toEqual(["outputs.0.steps.0.deviation"]);
  });

  it("flags a step that does not suit a ticked kind at its method", () => {
    const draft = toDraft(stats);
    draft.kinds = ["analog", "discrete"];
    expect(paths(draft)).toContain("outputs.1.steps.0.method");
  });
});
