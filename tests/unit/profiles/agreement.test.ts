import Ajv2020 from "ajv/dist/2020";
import { describe, expect, it } from "vitest";
import { checkProfileDocument } from "@/lib/profiles/document";
import { METHODS } from "@/lib/reduction/methods";
import { validateProfile } from "@/lib/reduction/profile-validate";
import { profileDocumentSchema, zodIssuesToFieldErrors } from "@/schemas/profile";
import jsonSchema from "@/schemas/profile.schema.json";
import { INVALID, VALID } from "./corpus";

// STYLE.md "One schema, three places": the JSON Schema contract (ajv, then validateProfile)
// and the zod schema accept and refuse the same documents, and name the same field.

const schemaAccepts = new Ajv2020({ allErrors: true }).compile(jsonSchema);

function zodPaths(doc: unknown): string[] {
  const parsed = profileDocumentSchema.safeParse(doc);
  return parsed.success ? [] : zodIssuesToFieldErrors(parsed.error.issues).map((p) => p.path);
}

function contractPaths(doc: unknown): string[] {
  const checked = checkProfileDocument(doc);
  return checked.ok ? [] : checked.problems.map((p) => p.path);
}

describe("profile corpus", () => {
  it("is large enough and covers every method", () => {
    expect(VALID.length).toBeGreaterThanOrEqual(25);
    expect(INVALID.length).toBeGreaterThanOrEqual(30);
    const methods = new Set(VALID.flatMap((v) => v.doc.outputs.flatMap((o) => o.steps.map((s) => s.method))));
    expect([...methods].sort()).toEqual(Object.keys(METHODS).sort());
  });

  it.each(VALID.map((v) => [v.label, v.doc] as const))("accepts %s", (_label, doc) => {
    expect(checkProfileDocument(doc)).toEqual({ ok: true, profile: doc });
    expect(validateProfile(doc)).toEqual([]);
    const parsed = profileDocumentSchema.safeParse(doc);
    expect(parsed.success && parsed.data).toEqual(doc);
  });

  it.each(INVALID.map((v) => [v.label, v] as const))("refuses %s, both at the same field", (_label, { doc, path, semantic }) => {
    const contract = contractPaths(doc);
    const zod = zodPaths(doc);
    expect(contract[0]).toBe(path);
    expect(zod[0]).toBe(path);
    expect(new Set(zod)).toEqual(new Set(contract));
    // Structural faults are the JSON Schema's to find; the rest only validateProfile finds.
    expect(schemaAccepts(doc)).toBe(semantic === true);
  });

  it("gives human messages from zod", () => {
    const doc = INVALID.find((v) => v.label === "deviation without a unit")!.doc;
    const parsed = profileDocumentSchema.safeParse(doc);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0].message).toBe("Give the deviation as a value with its unit, or a percent of the engineering range.");
    expect(parsed.error?.issues[0].path).toEqual(["outputs", 0, "steps", 0, "deviation"]);
  });

  it("puts each semantic problem on the output it belongs to when names repeat", () => {
    const step = { method: "aggregate", fn: "mean", window: 60 };
    const doc = { name: "x", kinds: ["analog"], outputs: [{ name: "a", steps: [step] }, { name: "a", steps: [step, { ...step, percentile: 5 }] }] };
    expect(contractPaths(doc)).toEqual(["outputs[1].name", "outputs[1].steps[1].percentile"]);
    expect(zodPaths(doc)).toEqual(["outputs[1].name", "outputs[1].steps[1].percentile"]);
  });
});
