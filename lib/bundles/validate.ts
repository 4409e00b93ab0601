import Ajv2020, { type ErrorObject } from "ajv/dist/2020";
import { parseDocument } from "yaml";
import { METHODS, type StepMethod } from "@/lib/reduction/profile";
import bundleJsonSchema from "@/schemas/bundle.schema.json";
import { readCanonical } from "./yaml-in";

export type BundleProblem = { path: string; message: string };
export type CheckedBundle = { ok: true } | { ok: false; problems: BundleProblem[] };

const validate = new Ajv2020({ allErrors: true }).compile(bundleJsonSchema);
/** At most this many problems are listed. */
const MAX_PROBLEMS = 50;

/**
 * Checks a bundle's bytes before they are stored or released (DESIGN.md "Bundle"): one
 * YAML 1.2 document (no duplicate keys, no aliases), then schemas/bundle.schema.json
 * (ajv, JSON Schema 2020-12), then what the schema cannot state: each tag appears once,
 * per-tag maps (step parameters and the group's gap) name only tags of their group (and
 * every one of them for a required parameter), group and output names are unique. Paths read like
 * `groups[2].outputs[0].steps[1].deviation` ("" for the document).
 */
export function validateBundle(yamlText: string): CheckedBundle {
  // Bytes in the form renderBundle writes are read directly (see readCanonical); others by the yaml package.
  let value = readCanonical(yamlText);
  if (value === undefined) {
    const doc = parseDocument(yamlText, { prettyErrors: false, uniqueKeys: true, strict: true });
    const syntax = [...doc.errors, ...doc.warnings];
    if (syntax.length > 0) return { ok: false, problems: syntax.map((e) => ({ path: "", message: e.message.split("\n")[0] })) };
    try {
      value = doc.toJS({ maxAliasCount: 0 });
    } catch (e) {
      return { ok: false, problems: [{ path: "", message: (e as Error).message.split("\n")[0] }] };
    }
  }
  if (!validate(value)) return { ok: false, problems: schemaProblems(validate.errors ?? []).slice(0, MAX_PROBLEMS) };
  const problems = ruleProblems(value as Bundle);
  return problems.length === 0 ? { ok: true } : { ok: false, problems: problems.slice(0, MAX_PROBLEMS) };
}

type Step = { method: StepMethod } & Record<string, unknown>;
type Bundle = {
  unassigned: { tags: string[] };
  groups: { name: string; tags: string[]; gap?: number | Record<string, number>; outputs?: { name: string; steps: Step[] }[] }[];
};

function ruleProblems(b: Bundle): BundleProblem[] {
  const problems: BundleProblem[] = [];
  const seen = new Map<string, string>();
  const place = (tags: string[], where: string) =>
    tags.forEach((t, i) => {
      const first = seen.get(t);
      if (first !== undefined) problems.push({ path: `${where}[${i}]`, message: `tag ${t} is already listed at ${first}` });
      else seen.set(t, `${where}[${i}]`);
    });
  place(b.unassigned.tags, "unassigned.tags");
  const groupNames = new Set<string>();
  b.groups.forEach((g, gi) => {
    const at = `groups[${gi}]`;
    if (groupNames.has(g.name)) problems.push({ path: `${at}.name`, message: `group "${g.name}" appears twice` });
    groupNames.add(g.name);
    place(g.tags, `${at}.tags`);
    const members = new Set(g.tags);
    if (typeof g.gap === "object" && g.gap !== null) {
      const stranger = Object.keys(g.gap).find((t) => !members.has(t));
      if (stranger !== undefined) problems.push({ path: `${at}.gap.${stranger}`, message: `tag ${stranger} is not a tag of group "${g.name}"` });
    }
    const outputNames = new Set<string>();
    (g.outputs ?? []).forEach((o, oi) => {
      if (outputNames.has(o.name)) problems.push({ path: `${at}.outputs[${oi}].name`, message: `output "${o.name}" appears twice` });
      outputNames.add(o.name);
      o.steps.forEach((s, si) => {
        for (const p of METHODS[s.method].params) {
          const v = s[p.name];
          if (typeof v !== "object" || v === null) continue;
          const path = `${at}.outputs[${oi}].steps[${si}].${p.name}`;
          const named = Object.keys(v);
          const stranger = named.find((t) => !members.has(t));
          if (stranger !== undefined) problems.push({ path: `${path}.${stranger}`, message: `tag ${stranger} is not a tag of group "${g.name}"` });
          const missing = p.required ? g.tags.find((t) => !Object.hasOwn(v, t)) : undefined;
          if (missing !== undefined) problems.push({ path, message: `gives no value for tag ${missing}; a required parameter needs one for every tag` });
        }
      });
    });
  });
  return problems;
}

const segment = (s: string) => (/^\d+$/.test(s) ? `[${s}]` : `.${s}`);

/** `/groups/0/outputs` → `groups[0].outputs`. */
function formatPointer(pointer: string): string {
  const parts = pointer.split("/").slice(1).map((p) => p.replace(/~1/g, "/").replace(/~0/g, "~"));
  return parts.map(segment).join("").replace(/^\./, "");
}

const join = (path: string, key: string) => (path === "" ? key : `${path}.${key}`);

function schemaProblems(errors: ErrorObject[]): BundleProblem[] {
  // A value-or-map parameter reports once, not once per branch of its anyOf.
  const eitherPaths = errors.filter((e) => e.keyword === "anyOf").map((e) => e.instancePath);
  const inEither = (e: ErrorObject) => e.keyword !== "anyOf" && eitherPaths.some((p) => e.instancePath === p || e.instancePath.startsWith(`${p}/`));
  const out: BundleProblem[] = [];
  const seen = new Set<string>();
  for (const e of errors) {
    if (e.keyword === "if" || e.keyword === "oneOf" || inEither(e)) continue;
    const path = formatPointer(e.instancePath);
    const p = e.params as Record<string, unknown>;
    let problem: BundleProblem;
    if (e.keyword === "required") problem = { path: join(path, String(p.missingProperty)), message: "is required" };
    else if (e.keyword === "additionalProperties") problem = { path: join(path, String(p.additionalProperty)), message: "is not a key of a bundle here" };
    else if (e.keyword === "anyOf") problem = { path, message: "must be a value of the parameter's type, or a map from tag name to such values" };
    else if (e.keyword === "const" || e.keyword === "enum") problem = { path, message: `must be ${((p.allowedValues as unknown[]) ?? [p.allowedValue]).join(" or ")}` };
    else problem = { path, message: e.message ?? "is not valid" };
    const key = `${problem.path}\u0000${problem.message}`;
    if (!seen.has(key)) out.push(problem);
    seen.add(key);
  }
  if (out.length === 0 && errors.some((e) => e.keyword === "oneOf")) {
    const e = errors.find((x) => x.keyword === "oneOf")!;
    out.push({ path: formatPointer(e.instancePath), message: "a group has either a profile with outputs or a default handling, not both" });
  }
  return out;
}
