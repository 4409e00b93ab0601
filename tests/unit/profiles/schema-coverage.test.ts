import Ajv2020 from "ajv/dist/2020";
import { describe, expect, it } from "vitest";
import { METHODS, type ParamInfo } from "@/lib/reduction/methods";
import type { StepMethod } from "@/lib/reduction/profile";
import { validateProfile } from "@/lib/reduction/profile-validate";
import { stepSchema } from "@/schemas/profile";
import jsonSchema from "@/schemas/profile.schema.json";
import { expectedStepDispatch, expectedStepSchema, stripAnnotations } from "./schema-from-methods";

// METHODS is the one table of methods and parameters; the JSON Schema contract and the
// zod schema must say the same, so neither can drift from it.

const defs = jsonSchema.$defs as Record<string, unknown>;
const methods = Object.keys(METHODS) as StepMethod[];
const stepValid = new Ajv2020({ allErrors: true }).compile({ $schema: jsonSchema.$schema, $defs: jsonSchema.$defs, $ref: "#/$defs/step" });

/** A step with every required parameter at a valid value. */
function minimalStep(method: StepMethod): Record<string, unknown> {
  const step: Record<string, unknown> = { method };
  for (const p of METHODS[method].params.filter((x) => x.required)) step[p.name] = sample(p);
  return step;
}

function sample(p: ParamInfo): unknown {
  if (p.type === "magnitude") return { percent: 1 };
  if (p.type === "enum") return p.values![0];
  if (p.type === "boolean") return false;
  return Math.min((p.min ?? 0) + 2, p.max ?? Infinity);
}

/** Values at and around every bound, and of the wrong type. */
function probes(p: ParamInfo): unknown[] {
  const wrong = ["1", null, [], {}];
  switch (p.type) {
    case "magnitude":
      return [{ percent: 0 }, { percent: 1e-9 }, { percent: 100 }, { percent: 100.5 }, { value: -1, unit: "K" }, { value: 0, unit: "K" }, { value: 1 }, { unit: "K" }, { value: 1, unit: " " }, { value: 1, unit: "" }, { value: 1, unit: "K", percent: 2 }, 1, ...wrong];
    case "enum":
      return [...p.values!, "nope", true, ...wrong];
    case "boolean":
      return [true, false, "true", 0, ...wrong];
    default: {
      const at = [p.min, p.max].filter((x) => x !== undefined).flatMap((x) => [x - 1, x - 0.5, x, x + 0.5, x + 1]);
      return [...at, -1e9, -1, 0, 0.25, 1, 2, 1e9, true, ...wrong];
    }
  }
}

describe("schemas/profile.schema.json against METHODS", () => {
  it("dispatches on every method", () => {
    expect(stripAnnotations(defs.step)).toEqual(stripAnnotations(expectedStepDispatch()));
    expect(Object.keys(defs).filter((k) => k.startsWith("step-")).sort()).toEqual(methods.map((m) => `step-${m}`).sort());
  });

  it.each(methods)("describes %s with its parameters' types, bounds, enums and defaults", (method) => {
    expect(stripAnnotations(defs[`step-${method}`])).toEqual(stripAnnotations(expectedStepSchema(METHODS[method])));
  });
});

describe("schemas/profile.ts against METHODS", () => {
  it.each(methods)("%s takes exactly the parameters of METHODS, required as there", (method) => {
    const option = stepSchema.options.find((o) => o.shape.method.value === method);
    expect(option).toBeDefined();
    const shape = option!.shape as Record<string, { safeParse(v: unknown): { success: boolean } }>;
    expect(Object.keys(shape)).toEqual(["method", ...METHODS[method].params.map((p) => p.name)]);
    for (const p of METHODS[method].params) expect([p.name, shape[p.name].safeParse(undefined).success]).toEqual([p.name, !p.required]);
  });
});

describe("every parameter at and around its bounds", () => {
  const cases = methods.flatMap((method) => METHODS[method].params.map((p) => [method, p.name, p] as const));
  it.each(cases)("%s %s: JSON Schema, zod and validateProfile agree", (method, name, p) => {
    for (const value of probes(p)) {
      const step = { ...minimalStep(method), [name]: value };
      const doc = { name: "x", kinds: [...METHODS[method].kinds], outputs: [{ name: "o", steps: [step] }] };
      const byMethods = !validateProfile(doc as never).some((e) => e.parameter === name || e.message.includes(`"${name}"`));
      expect([JSON.stringify(value), stepValid(step)]).toEqual([JSON.stringify(value), byMethods]);
      expect([JSON.stringify(value), stepSchema.safeParse(step).success]).toEqual([JSON.stringify(value), byMethods]);
    }
  });
});
