import type { Profile } from "@/lib/reduction/profile";
import type { ProfileError } from "@/lib/reduction/profile-error";
import { OUTPUT_NAME_PATTERN } from "@/lib/reduction/profile-names";
import { validateProfile } from "@/lib/reduction/profile-validate";

/** A key or an array index on the way from the document's root to a field. */
export type PathSegment = string | number;
/** One thing wrong with a profile document, at the field to fix ([] is the document itself). */
export type DocumentProblem = { path: PathSegment[]; message: string };

const PLAIN_KEY = /^[A-Za-z_][A-Za-z0-9_-]*$/;

/** `["outputs", 0, "steps", 1, "deviation"]` → `outputs[0].steps[1].deviation` ("" for the document itself). */
export function formatPath(path: readonly PathSegment[]): string {
  let out = "";
  for (const seg of path) {
    if (typeof seg === "number") out += `[${seg}]`;
    else if (PLAIN_KEY.test(seg)) out += out === "" ? seg : `.${seg}`;
    else out += `[${JSON.stringify(seg)}]`;
  }
  return out;
}

/** The message for a magnitude of the wrong shape, from the JSON Schema check and the zod schema alike. */
export function magnitudeMessage(parameter: string): string {
  return `Give the ${parameter} as a value with its unit, or a percent of the engineering range.`;
}

/**
 * The problems {@link validateProfile} finds in a structurally valid document (one the
 * JSON Schema or the zod schema accepts), each at the field to fix: output names used
 * twice, steps that do not suit a kind, percentile or interpolation with the wrong fn,
 * calendar windows under an hour. Outputs are located by index, so a problem in the
 * second of two outputs sharing a name lands on the second.
 */
export function semanticProblems(profile: Profile): DocumentProblem[] {
  const problems: DocumentProblem[] = [];
  const nameProblemAt = outputNameProblems(profile);
  let nameProblem = 0;
  for (const e of validateProfile(profile)) {
    if (e.output !== undefined) continue;
    if (e.message.startsWith("output name ") && nameProblem < nameProblemAt.length) {
      problems.push({ path: ["outputs", nameProblemAt[nameProblem++], "name"], message: e.message });
    } else {
      problems.push({ path: topLevelField(e.message), message: e.message });
    }
  }
  // Output-scoped problems, again with every output renamed after its index, so each lands on its own output.
  const indexed = { ...profile, outputs: profile.outputs.map((o, i) => ({ ...o, name: `o${i}` })) };
  for (const e of validateProfile(indexed)) {
    if (e.output === undefined) continue;
    const at: PathSegment[] = ["outputs", Number(e.output.slice(1))];
    problems.push({ path: e.step === undefined ? [...at, "steps"] : [...at, "steps", e.step, stepField(e)], message: bareMessage(e) });
  }
  return problems;
}

/** Indices of the outputs whose name validateProfile rejects, in its order (bad pattern, or used before). */
function outputNameProblems(profile: Profile): number[] {
  const seen = new Set<string>();
  const at: number[] = [];
  profile.outputs.forEach((o, i) => {
    if (!OUTPUT_NAME_PATTERN.test(o.name) || seen.has(o.name)) at.push(i);
    seen.add(o.name);
  });
  return at;
}

function topLevelField(message: string): PathSegment[] {
  if (/^the profile needs a name/.test(message)) return ["name"];
  if (/^description/.test(message)) return ["description"];
  if (/kind/.test(message)) return ["kinds"];
  return /output/.test(message) ? ["outputs"] : [];
}

/** The field of a step a problem belongs to; the method itself when it names no parameter. */
function stepField(e: ProfileError): string {
  if (e.parameter !== undefined) return e.parameter;
  const msg = bareMessage(e);
  const unknown = /^unknown parameter "(.*)" \(/.exec(msg);
  if (unknown) return unknown[1];
  if (/percentile/.test(msg)) return "percentile";
  if (/^interpolation/.test(msg)) return "interpolation";
  if (/^calendar windows/.test(msg)) return "window";
  return "method";
}

/** The message without the "output …, step …: " prefix ProfileError puts in front. */
export function bareMessage(e: ProfileError): string {
  const parts: string[] = [];
  if (e.output !== undefined) parts.push(`output "${e.output}"`);
  if (e.step !== undefined) parts.push(`step ${e.step}${e.method ? ` (${e.method})` : ""}`);
  if (e.parameter !== undefined) parts.push(`parameter "${e.parameter}"`);
  const prefix = parts.length ? `${parts.join(", ")}: ` : "";
  return prefix && e.message.startsWith(prefix) ? e.message.slice(prefix.length) : e.message;
}
