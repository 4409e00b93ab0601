"use client";

import { useFormContext, useWatch, type FieldPath } from "react-hook-form";
import { inputClass } from "@/components/ui/field";
import type { ParamInfo } from "@/lib/reduction/methods";
import { paramLabel } from "./describe-step";
import { describedBy, errorAt, ErrorText, HelpText } from "./form-bits";
import { fieldId } from "./form-paths";
import type { ProfileDraft } from "./profile-draft";

type Props = { name: string; param: ParamInfo };

/**
 * A magnitude: an absolute value with its engineering unit, or a percent of each tag's
 * engineering range (a width counts from the span, a level from the range's low end).
 */
export function MagnitudeField({ name, param }: Readonly<Props>) {
  const { register, control, formState } = useFormContext<ProfileDraft>();
  const path = (suffix: string) => `${name}.${suffix}` as FieldPath<ProfileDraft>;
  const mode = useWatch({ control, name: path("mode") });
  const id = fieldId(name);
  const label = paramLabel(param.name);
  const error = errorAt(formState.errors, name);
  const sub = (k: string) => ({ id: fieldId(`${name}.${k}`), error: errorAt(formState.errors, `${name}.${k}`) });
  const value = sub("value");
  const unit = sub("unit");
  const percent = sub("percent");
  const percentHelp =
    param.magnitude === "level"
      ? "Percent of each tag's engineering range, counted from its low end."
      : "Percent of each tag's engineering range span (high − low).";
  const optional = param.required ? "" : " Optional: leave empty for none.";
  const inputAria = (f: { id: string; error?: string }) => ({
    "aria-invalid": !!(f.error || error),
    "aria-describedby": [describedBy(id, error), f.error ? `${f.id}-error` : null].filter(Boolean).join(" "),
  });

  return (
    <fieldset className="flex flex-col gap-1.5 rounded-panel border border-panel-line p-2 sm:col-span-2" aria-describedby={describedBy(id, error)}>
      <legend className="px-1 text-label font-medium text-ink-soft">
        {label}
        {param.required ? "" : " (optional)"}
      </legend>
      <div className="flex flex-wrap gap-4 text-label">
        <label className="flex items-center gap-1.5">
          <input type="radio" value="absolute" {...register(path("mode"))} />
          <span className="sr-only">{label} as an </span>absolute value
        </label>
        <label className="flex items-center gap-1.5">
          <input type="radio" value="percent" {...register(path("mode"))} />
          <span className="sr-only">{label} as </span>% of engineering range
        </label>
      </div>
      {mode === "percent" ? (
        <div className="flex max-w-56 flex-col gap-1">
          <label htmlFor={percent.id} className="text-micro text-ink-soft">
            <span className="sr-only">{label} </span>% of range
          </label>
          <span className="flex items-center gap-1.5">
            <input id={percent.id} type="number" step="any" inputMode="decimal" className={`${inputClass} w-full`} {...inputAria(percent)} {...register(path("percent"))} />
            <span aria-hidden className="text-label text-ink-faint">
              %
            </span>
          </span>
          <ErrorText id={percent.id} error={percent.error} />
        </div>
      ) : (
        <div className="grid grid-cols-2 gap-2 sm:max-w-md">
          <div className="flex flex-col gap-1">
            <label htmlFor={value.id} className="text-micro text-ink-soft">
              <span className="sr-only">{label} </span>value
            </label>
            <input id={value.id} type="number" step="any" inputMode="decimal" className={inputClass} {...inputAria(value)} {...register(path("value"))} />
            <ErrorText id={value.id} error={value.error} />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor={unit.id} className="text-micro text-ink-soft">
              <span className="sr-only">{label} </span>unit
            </label>
            <input id={unit.id} placeholder="e.g. degC" autoComplete="off" className={`${inputClass} font-mono`} {...inputAria(unit)} {...register(path("unit"))} />
            <ErrorText id={unit.id} error={unit.error} />
          </div>
        </div>
      )}
      <HelpText id={id}>
        {param.help} {mode === "percent" ? percentHelp : "In the engineering unit you name; tags in another unit convert it."}
        {optional}
      </HelpText>
      <ErrorText id={id} error={error} />
    </fieldset>
  );
}
