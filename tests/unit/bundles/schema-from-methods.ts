import { METHODS, type MethodInfo, type ParamInfo } from "@/lib/reduction/methods";

/**
 * What schemas/bundle.schema.json must say about each resolved step, derived from
 * METHODS: magnitudes are plain numbers in the tag's unit (widths ≥ 0), and every
 * parameter is a value or a map from tag name to value. The schema test compares the
 * file's `$defs` against this; `npx tsx tests/unit/bundles/schema-from-methods.ts`
 * prints the definitions to paste when METHODS changes.
 */
export function resolvedParamSchema(p: ParamInfo): Record<string, unknown> {
  const s = plainSchema(p);
  const shared = Object.entries(SHARED).find(([, x]) => JSON.stringify(x) === JSON.stringify(s));
  return shared ? { $ref: `#/$defs/value-${shared[0]}` } : perTag(s);
}

/** Value types many parameters share, each defined once as `value-<name>`. */
const SHARED: Record<string, Record<string, unknown>> = {
  number: { type: "number" },
  positive: { type: "number", exclusiveMinimum: 0 },
  "non-negative": { type: "number", minimum: 0 },
  boolean: { type: "boolean" },
};

const perTag = (s: Record<string, unknown>) => ({ anyOf: [s, { type: "object", $ref: "#/$defs/per-tag", additionalProperties: s }] });

function plainSchema(p: ParamInfo): Record<string, unknown> {
  const s: Record<string, unknown> = {};
  switch (p.type) {
    case "magnitude":
      s.type = "number";
      if (p.magnitude === "width") s.minimum = 0;
      break;
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
  return s;
}

export function resolvedStepSchema(m: MethodInfo): Record<string, unknown> {
  return {
    type: "object",
    required: ["method", ...m.params.filter((p) => p.required).map((p) => p.name)],
    additionalProperties: false,
    properties: { method: { const: m.method }, ...Object.fromEntries(m.params.map((p) => [p.name, resolvedParamSchema(p)])) },
  };
}

/** The step definitions and the dispatch from `method` to them. */
export function expectedStepDefs(): Record<string, unknown> {
  const methods = Object.keys(METHODS) as (keyof typeof METHODS)[];
  return {
    step: {
      type: "object",
      required: ["method"],
      properties: { method: { enum: methods } },
      allOf: methods.map((m) => ({ if: { properties: { method: { const: m } } }, then: { $ref: `#/$defs/step-${m}` } })),
    },
    ...Object.fromEntries(methods.map((m) => [`step-${m}`, resolvedStepSchema(METHODS[m])])),
    ...Object.fromEntries(Object.entries(SHARED).map(([name, s]) => [`value-${name}`, perTag(s)])),
  };
}

if (process.argv[1]?.endsWith("schema-from-methods.ts")) console.log(JSON.stringify(expectedStepDefs(), null, 2));
