import { isTimeZone } from "./calendar";
import { percentOfRange } from "./deadband";
import { METHODS, type ParamInfo } from "./methods";
import type { Magnitude, Profile, ProfileTag, ResolvedProfile, ResolvedStep, RunContext, Step } from "./profile";
import { TAG_KINDS } from "./profile-names";
import { ProfileError } from "./profile-error";
import { isObject, suits, unsuitable, validateProfile } from "./profile-validate";

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
export function applyOverrides(profile: Profile, ctx: Pick<RunContext, "overrides">): Profile {
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
