import { METHODS, type ParamInfo } from "@/lib/reduction/methods";
import type { Magnitude, Profile, Step, StepMethod } from "@/lib/reduction/profile";
import type { TagKind } from "@/lib/reduction/profile-names";

// The profile editor's form values ("draft"): the document's shape with every field
// present and typed as its input holds it (numbers as text, magnitudes with their mode),
// so each form path is the document path of the same field. toDocument turns a draft
// into the candidate document the zod schema checks.

export type MagnitudeDraft = { mode: "absolute" | "percent"; value: string; unit: string; percent: string };
export type ParamDraft = string | boolean | MagnitudeDraft;
export type StepDraft = { method: StepMethod; [param: string]: ParamDraft };
export type OutputDraft = { name: string; steps: StepDraft[] };
export type ProfileDraft = { name: string; description: string; kinds: TagKind[]; outputs: OutputDraft[]; note: string };

/** Whether a parameter applies to the step as it stands (percentile and interpolation belong to one statistic each). */
export function paramApplies(step: { method: StepMethod; fn?: unknown }, name: string): boolean {
  if (step.method !== "aggregate") return true;
  if (name === "percentile") return step.fn === "percentile";
  if (name === "interpolation") return step.fn === "timeWeightedMean";
  return true;
}

function emptyParam(p: ParamInfo): ParamDraft {
  if (p.type === "magnitude") return { mode: "absolute", value: "", unit: "", percent: "" };
  if (p.type === "boolean") return p.default === true;
  if (p.type === "enum") return p.required ? (p.values?.[0] ?? "") : "";
  return "";
}

/** A new step of a method: required choices on their first value, everything else empty. */
export function emptyStep(method: StepMethod): StepDraft {
  const step: StepDraft = { method };
  for (const p of METHODS[method].params) step[p.name] = emptyParam(p);
  return step;
}

export function emptyOutput(name = ""): OutputDraft {
  return { name, steps: [] };
}

export function newProfileDraft(): ProfileDraft {
  return { name: "", description: "", kinds: ["analog"], outputs: [emptyOutput()], note: "" };
}

function paramDraft(p: ParamInfo, value: unknown): ParamDraft {
  if (value === undefined || value === null) return emptyParam(p);
  if (p.type === "magnitude") {
    const m = value as Magnitude;
    return "percent" in m ? { mode: "percent", value: "", unit: "", percent: String(m.percent) } : { mode: "absolute", value: String(m.value), unit: m.unit, percent: "" };
  }
  if (p.type === "boolean") return value === true;
  return String(value);
}

/** A stored document as form values. */
export function toDraft(profile: Profile, note = ""): ProfileDraft {
  return {
    name: profile.name,
    description: profile.description ?? "",
    kinds: [...profile.kinds],
    note,
    outputs: profile.outputs.map((o) => ({
      name: o.name,
      steps: o.steps.map((s: Step) => {
        const values = s as unknown as Record<string, unknown>;
        const step: StepDraft = { method: s.method };
        for (const p of METHODS[s.method].params) step[p.name] = paramDraft(p, values[p.name]);
        return step;
      }),
    })),
  };
}

/** Text from a number input: "" is absent; anything else a number (NaN when it is not one, for the schema to refuse). */
function numberFrom(text: string): number | undefined {
  const t = text.trim();
  return t === "" ? undefined : Number(t);
}

function magnitudeFrom(m: MagnitudeDraft, required: boolean): Record<string, unknown> | undefined {
  if (m.mode === "percent") {
    const percent = numberFrom(m.percent);
    return percent === undefined && !required ? undefined : { percent };
  }
  const value = numberFrom(m.value);
  if (value === undefined && m.unit.trim() === "" && !required) return undefined;
  return { value, unit: m.unit.trim() };
}

function paramValue(p: ParamInfo, draft: ParamDraft | undefined): unknown {
  if (draft === undefined) return undefined;
  if (p.type === "magnitude") return typeof draft === "object" ? magnitudeFrom(draft, p.required) : undefined;
  if (p.type === "boolean") return draft === true ? true : p.required ? false : undefined;
  if (p.type === "enum") return draft === "" ? undefined : draft;
  return typeof draft === "string" ? numberFrom(draft) : undefined;
}

/**
 * The document a draft stands for, unchecked: empty optional fields are left out, and
 * parameters that do not apply (percentile without fn percentile) are dropped. The
 * schema (profileFormSchema) checks the result.
 */
export function toDocument(draft: ProfileDraft): Record<string, unknown> {
  const description = draft.description.trim();
  return {
    name: draft.name.trim(),
    ...(description ? { description } : {}),
    kinds: Array.isArray(draft.kinds) ? draft.kinds : [],
    outputs: draft.outputs.map((o) => ({
      name: o.name.trim(),
      steps: o.steps.map((s) => {
        const step: Record<string, unknown> = { method: s.method };
        for (const p of METHODS[s.method].params) {
          if (!paramApplies(s, p.name)) continue;
          const v = paramValue(p, s[p.name]);
          if (v !== undefined) step[p.name] = v;
        }
        return step;
      }),
    })),
  };
}
