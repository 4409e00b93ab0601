import Ajv2020, { type ErrorObject } from "ajv/dist/2020";
import { METHODS } from "@/lib/reduction/methods";
import type { Profile } from "@/lib/reduction/profile";
import profileJsonSchema from "@/schemas/profile.schema.json";
import { type DocumentProblem, type PathSegment, formatPath, magnitudeMessage, semanticProblems } from "./problems";

export type CheckedProfile = { ok: true; profile: Profile } | { ok: false; problems: { path: string; message: string }[] };

const validate = new Ajv2020({ allErrors: true }).compile<Profile>(profileJsonSchema);

/**
 * Checks a profile document from outside (an API body, an imported file, a stored
 * revision) against the contract, schemas/profile.schema.json (ajv, JSON Schema
 * 2020-12), then against the rules only {@link semanticProblems} can check. Each problem
 * names the field to fix, e.g. `outputs[0].steps[1].deviation` ("" for the document).
 */
export function checkProfileDocument(doc: unknown): CheckedProfile {
  const problems = documentProblems(doc);
  if (problems.length > 0) return { ok: false, problems: problems.map((p) => ({ path: formatPath(p.path), message: p.message })) };
  return { ok: true, profile: doc as Profile };
}

/** The problems of a document as paths of segments (for callers that locate them further, such as the YAML import). */
export function documentProblems(doc: unknown): DocumentProblem[] {
  if (validate(doc)) return semanticProblems(doc);
  const problems: DocumentProblem[] = [];
  const seen = new Set<string>();
  for (const error of validate.errors ?? []) {
    if (error.keyword === "if") continue;
    const problem = describe(error, doc);
    const key = `${formatPath(problem.path)}\u0000${problem.message}`;
    if (!seen.has(key)) problems.push(problem);
    seen.add(key);
  }
  return problems;
}

function describe(error: ErrorObject, doc: unknown): DocumentProblem {
  const path = instancePath(error.instancePath, doc);
  const magnitude = magnitudeAt(path, doc);
  if (magnitude !== undefined && ["type", "required"].includes(error.keyword)) {
    return { path: path.slice(0, 5), message: magnitudeMessage(magnitude) };
  }
  const p = error.params as Record<string, unknown>;
  switch (error.keyword) {
    case "required":
      return { path: [...path, String(p.missingProperty)], message: "is required" };
    case "additionalProperties":
      return { path: [...path, String(p.additionalProperty)], message: unknownKeyMessage(path, doc, String(p.additionalProperty)) };
    case "enum":
      return { path, message: `must be one of ${(p.allowedValues as unknown[]).join(", ")}` };
    case "pattern":
      return { path, message: patternMessage(path) };
    case "type":
      return { path, message: `must be ${TYPE_WORDS[String(p.type)] ?? String(p.type)}` };
    case "uniqueItems":
      return { path, message: "lists the same kind twice" };
    default:
      return { path, message: (error.message ?? "is not valid").replace(">=", "≥").replace("<=", "≤") };
  }
}

const TYPE_WORDS: Record<string, string> = {
  object: "an object",
  array: "a list",
  string: "text",
  number: "a number",
  integer: "a whole number",
  boolean: "true or false",
};

/** A JSON pointer as segments, array indices as numbers. */
function instancePath(pointer: string, doc: unknown): PathSegment[] {
  const path: PathSegment[] = [];
  let node: unknown = doc;
  for (const raw of pointer.split("/").slice(1)) {
    const key = raw.replace(/~1/g, "/").replace(/~0/g, "~");
    const seg = Array.isArray(node) ? Number(key) : key;
    path.push(seg);
    node = node !== null && typeof node === "object" ? (node as Record<PathSegment, unknown>)[seg] : undefined;
  }
  return path;
}

function stepAt(path: PathSegment[], doc: unknown): { method?: unknown } | undefined {
  if (path[0] !== "outputs" || path[2] !== "steps" || path.length < 4) return undefined;
  const step = (doc as Profile).outputs?.[path[1] as number]?.steps?.[path[3] as number];
  return step !== null && typeof step === "object" ? step : undefined;
}

/** The parameter name when `path` is at or inside a magnitude parameter of a step. */
function magnitudeAt(path: PathSegment[], doc: unknown): string | undefined {
  const method = stepAt(path, doc)?.method;
  if (path.length < 5 || typeof method !== "string" || !Object.hasOwn(METHODS, method)) return undefined;
  const name = path[4];
  return METHODS[method as keyof typeof METHODS].magnitudes.includes(name as string) ? (name as string) : undefined;
}

function unknownKeyMessage(path: PathSegment[], doc: unknown, key: string): string {
  if (path.length === 4) {
    const method = String(stepAt(path, doc)?.method);
    const names = METHODS[method as keyof typeof METHODS]?.params.map((p) => p.name) ?? [];
    return `${method} has no parameter "${key}" (${names.length ? `it takes ${names.join(", ")}` : "it takes none"})`;
  }
  if (path.length === 5) return `"${key}" does not belong in a magnitude ({ value, unit } or { percent })`;
  return `"${key}" is not a field here`;
}

function patternMessage(path: PathSegment[]): string {
  if (path.at(-1) === "name" && path[0] === "outputs") return "an output name is 1–32 lower-case letters, digits, - or _, starting with a letter or digit";
  if (path.length === 1 && path[0] === "description") return "must not hold control characters other than tabs and line breaks";
  return "must not be blank or hold control characters";
}
