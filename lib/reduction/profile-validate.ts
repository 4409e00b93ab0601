import { METHODS, type ParamInfo } from "./methods";
import type { Profile, StepMethod } from "./profile";
import { OUTPUT_NAME_PATTERN, TAG_KINDS, type TagKind } from "./profile-names";
import { ProfileError } from "./profile-error";

const HOUR_S = 3600;

/**
 * The problems of a profile document on its own (no tag): name, kinds, output names
 * (pattern, unique), steps (known methods, known parameters of the right types and
 * ranges, see {@link METHODS}) and steps that do not suit a kind the profile is meant
 * for. Empty when the document is valid. For the profile editor and the runner.
 */
export function validateProfile(profile: Profile): ProfileError[] {
  const problems: ProfileError[] = [];
  if (!isObject(profile)) return [new ProfileError("a profile is an object with name, kinds and outputs")];
  if (typeof profile.name !== "string" || profile.name.trim() === "") problems.push(new ProfileError("the profile needs a name"));
  if (profile.description !== undefined && typeof profile.description !== "string") problems.push(new ProfileError("description must be text"));
  const kinds = Array.isArray(profile.kinds) ? profile.kinds : [];
  if (kinds.length === 0) problems.push(new ProfileError(`kinds must list the tag kinds the profile is meant for (${TAG_KINDS.join(", ")})`));
  for (const kind of kinds) if (!TAG_KINDS.includes(kind)) problems.push(new ProfileError(`unknown kind "${String(kind)}" (${TAG_KINDS.join(", ")})`));
  if (new Set(kinds).size !== kinds.length) problems.push(new ProfileError("kinds lists a kind twice"));
  if (!Array.isArray(profile.outputs) || profile.outputs.length === 0) {
    problems.push(new ProfileError("the profile needs at least one output"));
    return problems;
  }
  const names = new Set<string>();
  for (const output of profile.outputs) {
    const name = isObject(output) && typeof output.name === "string" ? output.name : "";
    if (!OUTPUT_NAME_PATTERN.test(name)) {
      problems.push(new ProfileError(`output name "${name}" must be 1–32 lower-case letters, digits, - or _, starting with a letter or digit`));
    } else if (names.has(name)) {
      problems.push(new ProfileError(`output name "${name}" is used twice`));
    }
    names.add(name);
    const steps = isObject(output) && Array.isArray(output.steps) ? output.steps : [];
    if (steps.length === 0) problems.push(new ProfileError("an output needs at least one step", { output: name }));
    steps.forEach((step, index) => {
      problems.push(...stepProblems(step, name, index));
      if (isObject(step) && Object.hasOwn(METHODS, step.method)) {
        for (const kind of kinds) {
          if (TAG_KINDS.includes(kind) && !suits(step.method, kind)) problems.push(unsuitable(name, index, step.method, kind, "the profile is meant for"));
        }
      }
    });
  }
  return problems;
}

/** Does the method suit the kind (METHODS)? */
export function suits(method: StepMethod, kind: TagKind): boolean {
  return METHODS[method].kinds.includes(kind);
}

/** The error for a step that does not suit a kind, naming the output, step, method and kind. */
export function unsuitable(output: string, step: number, method: StepMethod, kind: TagKind, whose: string): ProfileError {
  const fits = METHODS[method].kinds.join(", ");
  return new ProfileError(`${method} does not suit ${kind} tags (${whose} ${kind}); it suits ${fits}`, { output, step, method });
}

function stepProblems(step: unknown, output: string, index: number): ProfileError[] {
  if (!isObject(step) || typeof step.method !== "string" || !Object.hasOwn(METHODS, step.method)) {
    const method = isObject(step) ? String(step.method) : String(step);
    return [new ProfileError(`unknown method "${method}" (${Object.keys(METHODS).join(", ")})`, { output, step: index })];
  }
  const method = step.method as StepMethod;
  const where = { output, step: index, method };
  const problems: ProfileError[] = [];
  const params = METHODS[method].params;
  for (const key of Object.keys(step)) {
    if (key !== "method" && !params.some((p) => p.name === key)) {
      problems.push(new ProfileError(`unknown parameter "${key}" (${params.map((p) => p.name).join(", ") || "none"})`, where));
    }
  }
  for (const param of params) {
    const problem = paramProblem(param, step[param.name]);
    if (problem !== undefined) problems.push(new ProfileError(problem, { ...where, parameter: param.name }));
  }
  if (method === "aggregate") {
    if (step.fn === "percentile" && step.percentile === undefined) problems.push(new ProfileError("fn percentile needs a percentile (0–100)", where));
    if (step.fn !== "percentile" && step.percentile !== undefined) problems.push(new ProfileError("percentile applies only to fn percentile", where));
    if (step.fn !== "timeWeightedMean" && step.interpolation !== undefined) problems.push(new ProfileError("interpolation applies only to fn timeWeightedMean", where));
    if (step.calendar === true && typeof step.window === "number" && step.window < HOUR_S) {
      problems.push(new ProfileError(`calendar windows are an hour (3600 s) or more, got ${step.window} s`, where));
    }
  }
  return problems;
}

function paramProblem(p: ParamInfo, value: unknown): string | undefined {
  if (value === undefined) return p.required ? "is required" : undefined;
  switch (p.type) {
    case "boolean":
      return typeof value === "boolean" ? undefined : "must be true or false";
    case "enum":
      return p.values?.includes(value as string) ? undefined : `must be one of ${p.values?.join(", ")}`;
    case "magnitude":
      return magnitudeProblem(p, value);
    default: {
      if (typeof value !== "number" || !Number.isFinite(value)) return "must be a finite number";
      if (p.type === "integer" && !Number.isInteger(value)) return "must be a whole number";
      if (p.min !== undefined && (p.minExclusive ? !(value > p.min) : !(value >= p.min))) return `must be ${p.minExclusive ? ">" : "≥"} ${p.min}`;
      if (p.max !== undefined && !(value <= p.max)) return `must be ≤ ${p.max}`;
      return undefined;
    }
  }
}

function magnitudeProblem(p: ParamInfo, value: unknown): string | undefined {
  if (!isObject(value)) return "must be { value, unit } or { percent }";
  const keys = Object.keys(value).sort().join(",");
  if (keys === "percent") {
    const x = value.percent;
    return typeof x === "number" && x > 0 && x <= 100 ? undefined : "percent must be within (0, 100]";
  }
  if (keys === "unit,value") {
    if (typeof value.unit !== "string" || value.unit.trim() === "") return "needs a unit";
    if (typeof value.value !== "number" || !Number.isFinite(value.value)) return "value must be a finite number";
    return p.magnitude === "width" && value.value < 0 ? "value must be ≥ 0" : undefined;
  }
  return "must be { value, unit } or { percent }";
}

/** A plain object (typed loosely: a document from outside is checked key by key). */
export function isObject(x: unknown): x is Record<string, any> {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}
