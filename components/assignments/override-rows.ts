import { METHODS, type ParamInfo } from "@/lib/reduction/methods";
import type { Magnitude, ParameterOverride, Profile } from "@/lib/reduction/profile";

/** One overridable parameter of a profile document: where it is and what it holds now. */
export type ParamChoice = { id: string; output: string; step: number; param: ParamInfo; label: string; current: unknown };

/** An override as the form edits it (strings, parsed on save). */
export type OverrideRow = { target: string; mode: "abs" | "pct" | "plain"; value: string; unit: string };

/** Every parameter of every step that an override may set (all but `fn`, which changes what a step computes). */
export function paramChoices(doc: Profile | undefined): ParamChoice[] {
  if (!doc) return [];
  return doc.outputs.flatMap((o) =>
    o.steps.flatMap((s, i) =>
      METHODS[s.method].params
        .filter((p) => p.name !== "fn")
        .map((p) => ({
          id: `${o.name}|${i}|${p.name}`,
          output: o.name,
          step: i,
          param: p,
          label: `${o.name} › step ${i + 1} ${METHODS[s.method].title} › ${p.name}`,
          current: (s as Record<string, unknown>)[p.name],
        })),
    ),
  );
}

export function showValue(v: unknown): string {
  if (v === undefined) return "default";
  if (typeof v === "object" && v !== null) {
    const m = v as Magnitude;
    return "percent" in m ? `${m.percent} % of range` : `${m.value} ${m.unit}`;
  }
  return String(v);
}

/** The form row for an existing override. */
export function rowFromOverride(o: ParameterOverride): OverrideRow {
  const target = `${o.output}|${o.step}|${o.parameter}`;
  const v = o.value;
  if (typeof v === "object" && v !== null) {
    return "percent" in v ? { target, mode: "pct", value: String(v.percent), unit: "" } : { target, mode: "abs", value: String(v.value), unit: v.unit };
  }
  return { target, mode: "plain", value: String(v), unit: "" };
}

/** The override a row stands for; numbers parsed by the parameter's type (the server checks the rest). */
export function overrideFromRow(row: OverrideRow, choices: ParamChoice[]): ParameterOverride {
  const [output, step, parameter] = row.target.split("|");
  const choice = choices.find((c) => c.id === row.target);
  const type = choice?.param.type;
  let value: ParameterOverride["value"];
  if (type === "magnitude") value = row.mode === "pct" ? { percent: Number(row.value) } : { value: Number(row.value), unit: row.unit.trim() };
  else if (type === "boolean") value = row.value === "true";
  else if (type === "enum") value = row.value;
  else value = Number(row.value);
  return { output, step: Number(step), parameter, value };
}

/** A fresh row for a parameter, starting from its current value. */
export function newRow(choice: ParamChoice | undefined, defaultUnit: string): OverrideRow {
  if (!choice) return { target: "", mode: "plain", value: "", unit: "" };
  const cur = choice.current;
  if (choice.param.type === "magnitude") {
    const m = cur as Magnitude | undefined;
    if (m && "percent" in m) return { target: choice.id, mode: "pct", value: String(m.percent), unit: "" };
    return { target: choice.id, mode: "abs", value: m ? String(m.value) : "", unit: m && "unit" in m ? m.unit : defaultUnit };
  }
  return { target: choice.id, mode: "plain", value: cur === undefined ? String(choice.param.default ?? "") : String(cur), unit: "" };
}
