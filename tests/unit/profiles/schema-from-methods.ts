import { METHODS, type MethodInfo, type ParamInfo } from "@/lib/reduction/methods";

/**
 * What schemas/profile.schema.json must say about each step, derived from METHODS. The
 * coverage test compares the file against this with annotations (title, description,
 * $comment) stripped; `npx tsx tests/unit/profiles/schema-from-methods.ts` prints the
 * step definitions to paste when METHODS changes.
 */
export function expectedParamSchema(p: ParamInfo): Record<string, unknown> {
  const s: Record<string, unknown> = { description: p.help };
  switch (p.type) {
    case "magnitude":
      return { $ref: `#/$defs/${p.magnitude === "level" ? "level" : "width"}-magnitude`, ...s };
    case "enum":
      s.type = "string";
      s.enum = [...(p.values ?? [])];
      break;
    case "boolean":
      s.type = "boolean";
      break;
    default:
      s.type = p.type === "integer" ? "integer" : "number";
      if (p.min !== undefined) s[p.minExclusive ? "exclusiveMinimum" : "minimum"] = p.min;
      if (p.max !== undefined) s.maximum = p.max;
  }
  if (p.default !== undefined) s.default = p.default;
  return s;
}

export function expectedStepSchema(m: MethodInfo): Record<string, unknown> {
  return {
    title: m.title,
    description: m.guarantee,
    $comment: m.source,
    type: "object",
    required: ["method", ...m.params.filter((p) => p.required).map((p) => p.name)],
    additionalProperties: false,
    properties: { method: { const: m.method }, ...Object.fromEntries(m.params.map((p) => [p.name, expectedParamSchema(p)])) },
  };
}

/** The dispatch from `method` to its step definition. */
export function expectedStepDispatch(): Record<string, unknown> {
  const methods = Object.keys(METHODS);
  return {
    type: "object",
    required: ["method"],
    properties: { method: { type: "string", enum: methods } },
    allOf: methods.map((m) => ({
      if: { type: "object", required: ["method"], properties: { method: { const: m } } },
      then: { $ref: `#/$defs/step-${m}` },
    })),
  };
}

const ANNOTATIONS = new Set(["title", "description", "$comment"]);

/** A copy without annotation keywords, for comparing what validates. */
export function stripAnnotations(x: unknown): unknown {
  if (Array.isArray(x)) return x.map(stripAnnotations);
  if (typeof x !== "object" || x === null) return x;
  return Object.fromEntries(
    Object.entries(x)
      .filter(([k, v]) => !(ANNOTATIONS.has(k) && typeof v === "string"))
      .map(([k, v]) => [k, k === "properties" || k === "$defs" ? Object.fromEntries(Object.entries(v as object).map(([pk, pv]) => [pk, stripAnnotations(pv)])) : stripAnnotations(v)]),
  );
}

if (process.argv[1]?.endsWith("schema-from-methods.ts")) {
  const defs = Object.fromEntries(Object.values(METHODS).map((m) => [`step-${m.method}`, expectedStepSchema(m)]));
  console.log(JSON.stringify({ step: expectedStepDispatch(), ...defs }, null, 2));
}
