"use client";

import { useFormContext, type FieldPath } from "react-hook-form";
import { inputClass } from "@/components/ui/field";
import type { ParamInfo } from "@/lib/reduction/methods";
import { describeValue, paramLabel } from "./describe-step";
import { describedBy, errorAt, ErrorText, HelpText } from "./form-bits";
import { fieldId } from "./form-paths";
import { MagnitudeField } from "./magnitude-field";
import type { ProfileDraft } from "./profile-draft";

type Props = { stepPath: string; param: ParamInfo };

/** "Optional; default 0 s." for the help line of a parameter that may be left empty. */
export function optionalNote(p: ParamInfo): string {
  if (p.required) return "";
  return p.default === undefined ? " Optional." : ` Optional; default ${describeValue(p, p.default)}.`;
}

/** One parameter of a step, its input chosen by the parameter's type in METHODS. */
export function ParamField({ stepPath, param }: Readonly<Props>) {
  const { register, formState } = useFormContext<ProfileDraft>();
  if (param.type === "magnitude") return <MagnitudeField name={`${stepPath}.${param.name}`} param={param} />;
  const name = `${stepPath}.${param.name}` as FieldPath<ProfileDraft>;
  const id = fieldId(name);
  const error = errorAt(formState.errors, name);
  const label = paramLabel(param.name);
  const help = `${param.help}${optionalNote(param)}`;
  const aria = { "aria-invalid": !!error, "aria-describedby": describedBy(id, error) };

  if (param.type === "boolean") {
    return (
      <div className="flex flex-col gap-1 sm:col-span-2">
        <label htmlFor={id} className="flex items-center gap-2 text-label font-medium text-ink-soft">
          <input id={id} type="checkbox" {...aria} {...register(name)} /> {label}
        </label>
        <HelpText id={id}>{help}</HelpText>
        <ErrorText id={id} error={error} />
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-label font-medium text-ink-soft">
        {label}
        {param.type === "seconds" ? " (s)" : ""}
      </label>
      {param.type === "enum" ? (
        <select id={id} className={inputClass} {...aria} {...register(name)}>
          {param.required ? null : <option value="">default{param.default !== undefined ? ` (${String(param.default)})` : ""}</option>}
          {(param.values ?? []).map((v) => (
            <option key={v} value={v}>
              {v}
            </option>
          ))}
        </select>
      ) : (
        <span className="flex items-center gap-1.5">
          <input
            id={id}
            type="number"
            step={param.type === "integer" ? 1 : "any"}
            inputMode={param.type === "integer" ? "numeric" : "decimal"}
            placeholder={param.required ? undefined : param.default !== undefined ? `default ${String(param.default)}` : "none"}
            className={`${inputClass} w-full`}
            {...aria}
            {...register(name)}
          />
          {param.type === "seconds" ? (
            <span aria-hidden className="text-label text-ink-faint">
              s
            </span>
          ) : null}
        </span>
      )}
      <HelpText id={id}>{help}</HelpText>
      <ErrorText id={id} error={error} />
    </div>
  );
}
