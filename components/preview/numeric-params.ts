// The numeric parameters of a profile document that the workbench edits in place and
// sweeps: plain numbers, seconds, and the number inside a magnitude (absolute or percent).
import { paramLabel } from "@/components/profiles/describe-step";
import { METHODS, type ParamInfo } from "@/lib/reduction/methods";
import type { Magnitude, Profile } from "@/lib/reduction/profile";

export type NumericParam = {
  /** "output|step|parameter", unique in the profile. */
  key: string;
  output: string;
  /** 0-based index of the step in its output. */
  step: number;
  method: string;
  methodTitle: string;
  parameter: string;
  /** "Deviation (degC)", "Window (s)", "Deadband (% of range)". */
  label: string;
  value: number;
  info: ParamInfo;
};

const NUMERIC = new Set<ParamInfo["type"]>(["magnitude", "seconds", "integer", "number"]);

function numberOf(raw: unknown): { value: number; suffix: string } | null {
  if (typeof raw === "number") return { value: raw, suffix: "" };
  if (raw && typeof raw === "object") {
    const m = raw as Magnitude;
    if ("percent" in m) return { value: m.percent, suffix: "% of range" };
    if ("value" in m) return { value: m.value, suffix: m.unit };
  }
  return null;
}

/** Every numeric parameter the document sets, output by output, step by step. */
export function numericParams(profile: Profile): NumericParam[] {
  const out: NumericParam[] = [];
  for (const o of profile.outputs) {
    o.steps.forEach((step, i) => {
      const method = METHODS[step.method];
      for (const info of method?.params ?? []) {
        if (!NUMERIC.has(info.type)) continue;
        const found = numberOf((step as Record<string, unknown>)[info.name]);
        if (!found) continue;
        const suffix = info.type === "seconds" ? "s" : found.suffix;
        out.push({
          key: `${o.name}|${i}|${info.name}`,
          output: o.name,
          step: i,
          method: step.method,
          methodTitle: method.title,
          parameter: info.name,
          label: `${paramLabel(info.name)}${suffix ? ` (${suffix})` : ""}`,
          value: found.value,
          info,
        });
      }
    });
  }
  return out;
}

/** A copy of the document with one numeric parameter set (a magnitude keeps its unit or percent form). */
export function withParam(profile: Profile, output: string, step: number, parameter: string, value: number): Profile {
  const copy = structuredClone(profile);
  const target = copy.outputs.find((o) => o.name === output)?.steps[step] as Record<string, unknown> | undefined;
  if (!target) return copy;
  const raw = target[parameter];
  if (raw && typeof raw === "object") target[parameter] = "percent" in raw ? { percent: value } : { ...(raw as object), value };
  else target[parameter] = value;
  return copy;
}

/** Reads the in-place form's values into a document; the problems name the field. */
export function applyValues(base: Profile, values: Readonly<Record<string, string>>): { profile: Profile; problems: Record<string, string> } {
  let profile = base;
  const problems: Record<string, string> = {};
  for (const p of numericParams(base)) {
    const text = values[p.key];
    if (text === undefined) continue;
    const n = Number(text.trim());
    if (text.trim() === "" || !Number.isFinite(n)) {
      problems[p.key] = `${p.label} must be a number.`;
      continue;
    }
    if (p.info.type === "integer" && !Number.isInteger(n)) problems[p.key] = `${p.label} must be a whole number.`;
    else if (p.info.min !== undefined && (p.info.minExclusive ? n <= p.info.min : n < p.info.min)) {
      problems[p.key] = `${p.label} must be ${p.info.minExclusive ? "more than" : "at least"} ${p.info.min}.`;
    } else if (p.info.max !== undefined && n > p.info.max) problems[p.key] = `${p.label} must be at most ${p.info.max}.`;
    else if (n !== p.value) profile = withParam(profile, p.output, p.step, p.parameter, n);
  }
  return { profile, problems };
}
