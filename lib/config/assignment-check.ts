import { applyOverrides, resolveSteps } from "@/lib/reduction/profile-resolve";
import { validateProfile } from "@/lib/reduction/profile-validate";
import { ProfileError } from "@/lib/reduction/profile-error";
import { METHODS, type ParameterOverride, type Profile, type ProfileTag } from "@/lib/reduction/profile";

export type AssignmentProblem = { field: string; message: string };
export type TagOverrides = { tag: string; overrides: ParameterOverride[] }[];
export type CheckContext = { timeZone?: string; convert?: (value: number, from: string, to: string) => number };

/** At most this many problems are listed; the rest are counted in the last one. */
const MAX_PROBLEMS = 20;

/**
 * Can this profile run on every tag of the group with these overrides? Runs the same
 * resolution a bundle will (`resolveSteps`): steps suit each tag's kind, percent
 * parameters need an engineering range, absolute parameters convert to the tag's unit.
 * Each problem names the field to fix: `overrides[i].value`, `tagOverrides[i].overrides[j].value`,
 * `tagOverrides[i].tag`, or `profile` when the profile's own parameter is at fault.
 */
export function checkAssignment(doc: Profile, tags: readonly ProfileTag[], overrides: ParameterOverride[], tagOverrides: TagOverrides, ctx: CheckContext = {}): AssignmentProblem[] {
  const problems: AssignmentProblem[] = [];
  const seen = new Set<string>();
  let dropped = 0;
  const add = (p: AssignmentProblem) => {
    const key = `${p.field}\u0000${p.message}`;
    if (seen.has(key)) return;
    seen.add(key);
    if (problems.length < MAX_PROBLEMS) problems.push(p);
    else dropped++;
  };
  // Overrides on their own: they must name a step parameter and keep the document valid.
  overrides.forEach((o, i) => {
    const p = overrideProblem(doc, o);
    if (p) add({ field: `overrides[${i}]`, message: p });
  });
  const byTag = new Map(tags.map((t) => [t.name, t]));
  tagOverrides.forEach((t, i) => {
    if (!byTag.has(t.tag)) add({ field: `tagOverrides[${i}].tag`, message: `tag ${t.tag} is not in this group` });
    t.overrides.forEach((o, j) => {
      const p = overrideProblem(doc, o);
      if (p) add({ field: `tagOverrides[${i}].overrides[${j}]`, message: p });
    });
  });
  if (problems.length) return problems;
  const own = new Map(tagOverrides.map((t, i) => [t.tag, i]));
  for (const tag of tags) {
    const i = own.get(tag.name);
    const mine = i === undefined ? [] : tagOverrides[i].overrides;
    try {
      resolveSteps(doc, tag, { ...ctx, overrides: [...overrides, ...mine] });
    } catch (e) {
      if (!(e instanceof ProfileError)) throw e;
      add({ field: fieldOf(e, overrides, i, mine), message: `tag ${tag.name}: ${e.message}` });
    }
  }
  if (dropped) problems.push({ field: problems[problems.length - 1].field, message: `… and ${dropped} more problems like these` });
  return problems;
}

const matches = (o: ParameterOverride, e: ProfileError) => o.output === e.output && o.step === e.step && o.parameter === e.parameter;

function fieldOf(e: ProfileError, overrides: ParameterOverride[], tagIndex: number | undefined, mine: ParameterOverride[]): string {
  if (e.parameter !== undefined) {
    for (let j = mine.length - 1; j >= 0; j--) if (matches(mine[j], e)) return `tagOverrides[${tagIndex}].overrides[${j}].value`;
    for (let j = overrides.length - 1; j >= 0; j--) if (matches(overrides[j], e)) return `overrides[${j}].value`;
  }
  return "profile";
}

function overrideProblem(doc: Profile, o: ParameterOverride): string | null {
  const output = doc.outputs.find((x) => x.name === o.output);
  if (!output) return `the profile has no output "${o.output}"`;
  const step = output.steps[o.step];
  if (!step) return `output "${o.output}" has no step ${o.step + 1}`;
  const param = METHODS[step.method].params.find((p) => p.name === o.parameter);
  if (!param) return `${step.method} has no parameter "${o.parameter}"`;
  try {
    const problems = validateProfile(applyOverrides(doc, { overrides: [o] })).filter((p) => p.output === o.output && p.step === o.step);
    return problems.length ? problems[0].message : null;
  } catch (e) {
    return (e as Error).message;
  }
}

/** Does any step of the profile lose information (DESIGN.md "Cautions")? */
export function hasLossyStep(doc: Profile): boolean {
  return doc.outputs.some((o) => o.steps.some((s) => METHODS[s.method]?.lossy));
}
