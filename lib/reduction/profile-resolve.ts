import { isTimeZone } from "./calendar";
import { percentOfRange } from "./deadband";
import { METHODS, type ParamInfo } from "./methods";
import {
  type Magnitude,
  OUTPUT_NAME_PATTERN,
  type Profile,
  type ProfileTag,
  type ResolvedProfile,
  type ResolvedStep,
  type RunContext,
  type Step,
  type StepMethod,
  TAG_KINDS,
  type TagKind,
} from "./profile";
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

/**
 * The concrete parameters of every step of a profile for one tag, as a bundle carries
 * them: overrides applied, percent magnitudes resolved against the tag's engineering
 * range (OPC UA Part 8: percent × (high − low); a level counts from low), absolute ones
 * converted to the tag's unit through `ctx.convert` (a width as a difference). Seconds
 * stay seconds. Throws a {@link ProfileError} for a step that does not suit the tag's
 * kind, a percent without an engineering range, a unit that does not convert, a
 * calendar window without a time zone, or any problem of {@link validateProfile}.
 */
export function resolveSteps(profile: Profile, tag: ProfileTag, ctx: RunContext = {}): ResolvedProfile {
  checkTag(tag);
  const doc = applyOverrides(profile, ctx);
  if (Array.isArray(doc.outputs)) {
    for (const output of doc.outputs) {
      (isObject(output) && Array.isArray(output.steps) ? output.steps : []).forEach((step, index) => {
        if (isObject(step) && Object.hasOwn(METHODS, step.method) && !suits(step.method, tag.kind)) {
          throw unsuitable(output.name, index, step.method, tag.kind, `tag ${tag.name} is`);
        }
      });
    }
  }
  const problems = validateProfile(doc);
  if (problems.length > 0) throw problems[0];
  if (!doc.kinds.includes(tag.kind)) {
    throw new ProfileError(`profile "${doc.name}" is meant for ${doc.kinds.join(", ")} tags; tag ${tag.name} is ${tag.kind}`);
  }
  return {
    profile: doc.name,
    tag: tag.name,
    unit: tag.unit,
    outputs: doc.outputs.map((output) => ({
      name: output.name,
      steps: output.steps.map((step, index) => resolveStep(step, { output: output.name, step: index, method: step.method }, tag, ctx)),
    })),
  };
}

type Where = { output: string; step: number; method: string };

function resolveStep(step: Step, where: Where, tag: ProfileTag, ctx: RunContext): ResolvedStep {
  const resolved: Record<string, unknown> = { ...step };
  for (const param of METHODS[step.method].params) {
    const value = (step as Record<string, unknown>)[param.name];
    if (param.type === "magnitude" && value !== undefined) {
      resolved[param.name] = resolveMagnitude(value as Magnitude, param, tag, ctx, { ...where, parameter: param.name });
    }
  }
  if (step.method === "aggregate" && step.calendar) {
    if (ctx.timeZone === undefined) throw new ProfileError("calendar windows need the site's time zone in the run context", where);
    if (!isTimeZone(ctx.timeZone)) throw new ProfileError(`"${ctx.timeZone}" is not an IANA time zone`, where);
  }
  return resolved as ResolvedStep;
}

function resolveMagnitude(m: Magnitude, param: ParamInfo, tag: ProfileTag, ctx: RunContext, where: Where & { parameter: string }): number {
  if ("percent" in m) {
    if (tag.euLow === null || tag.euHigh === null) {
      throw new ProfileError(`${m.percent} % of the engineering range, but tag ${tag.name} has no engineering range`, where);
    }
    const width = percentOfRange(m.percent, tag.euLow, tag.euHigh);
    return param.magnitude === "level" ? tag.euLow + width : width;
  }
  if (m.unit === tag.unit) return m.value;
  if (ctx.convert === undefined) {
    throw new ProfileError(`${m.value} ${m.unit} does not match tag ${tag.name}'s unit ${tag.unit}, and no unit conversion was given`, where);
  }
  let converted: number;
  try {
    converted = ctx.convert(m.value, m.unit, tag.unit);
    if (param.magnitude === "width") converted -= ctx.convert(0, m.unit, tag.unit);
  } catch (e) {
    throw new ProfileError(`${m.unit} does not convert to ${tag.unit} (tag ${tag.name}): ${(e as Error).message}`, where);
  }
  if (!Number.isFinite(converted) || (param.magnitude === "width" && converted < 0)) {
    throw new ProfileError(`${m.value} ${m.unit} converts to ${converted} ${tag.unit}, which is not a usable ${param.magnitude}`, where);
  }
  return converted;
}

/** Does the method suit the kind (METHODS)? */
export function suits(method: StepMethod, kind: TagKind): boolean {
  return METHODS[method].kinds.includes(kind);
}

function unsuitable(output: string, step: number, method: StepMethod, kind: TagKind, whose: string): ProfileError {
  const fits = METHODS[method].kinds.join(", ");
  return new ProfileError(`${method} does not suit ${kind} tags (${whose} ${kind}); it suits ${fits}`, { output, step, method });
}

function checkTag(tag: ProfileTag): void {
  if (!isObject(tag) || typeof tag.name !== "string") throw new ProfileError("the tag needs a name");
  if (!TAG_KINDS.includes(tag.kind)) throw new ProfileError(`tag ${tag.name} has an unknown kind "${String(tag.kind)}"`);
  if (typeof tag.unit !== "string") throw new ProfileError(`tag ${tag.name} needs a unit`);
  if (!(Number.isFinite(tag.samplePeriodMs) && tag.samplePeriodMs > 0)) throw new ProfileError(`tag ${tag.name} needs a positive sample period`);
  const { euLow, euHigh } = tag;
  if ((euLow === null) !== (euHigh === null) || (euLow !== null && euHigh !== null && !(euLow < euHigh))) {
    throw new ProfileError(`tag ${tag.name} has an engineering range without both ends or with low ≥ high`);
  }
}

/** A copy of the profile with the overrides applied in order (later ones win). */
function applyOverrides(profile: Profile, ctx: RunContext): Profile {
  const overrides = ctx.overrides ?? [];
  if (overrides.length === 0 || !isObject(profile) || !Array.isArray(profile.outputs)) return profile;
  const outputs = profile.outputs.map((o) => ({ ...o, steps: Array.isArray(o.steps) ? o.steps.map((s) => ({ ...s })) : o.steps }));
  for (const o of overrides) {
    const output = outputs.find((x) => x.name === o.output);
    if (output === undefined) throw new ProfileError(`an override names output "${o.output}", which the profile does not have`);
    const step = Array.isArray(output.steps) ? output.steps[o.step] : undefined;
    if (!isObject(step)) throw new ProfileError(`an override names step ${o.step}, which the output does not have`, { output: o.output });
    const known = Object.hasOwn(METHODS, step.method) && METHODS[step.method].params.some((p) => p.name === o.parameter);
    if (!known) {
      throw new ProfileError(`an override sets "${o.parameter}", which is not a parameter of ${String(step.method)}`, {
        output: o.output,
        step: o.step,
        method: step.method,
      });
    }
    (step as Record<string, unknown>)[o.parameter] = o.value;
  }
  return { ...profile, outputs: outputs as Profile["outputs"] };
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
function isObject(x: unknown): x is Record<string, any> {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}
