"use client";

import { useFormContext, useWatch, type FieldPath } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { METHODS } from "@/lib/reduction/methods";
import { errorAt } from "./form-bits";
import { fieldId } from "./form-paths";
import { MethodHelp } from "./method-help";
import { unsuitedMessage } from "./method-options";
import { ParamField } from "./param-field";
import { paramApplies, type ProfileDraft, type StepDraft } from "./profile-draft";

type Props = {
  outputIndex: number;
  stepIndex: number;
  count: number;
  outputLabel: string;
  onRemove: () => void;
  onMove: (to: number) => void;
};

/** One step of an output: its method's help and a form for its parameters. */
export function StepEditor({ outputIndex, stepIndex, count, outputLabel, onRemove, onMove }: Readonly<Props>) {
  const { control, formState } = useFormContext<ProfileDraft>();
  const path = `outputs.${outputIndex}.steps.${stepIndex}`;
  const step = useWatch({ control, name: path as FieldPath<ProfileDraft> }) as StepDraft | undefined;
  const kinds = useWatch({ control, name: "kinds" });
  if (!step || !(step.method in METHODS)) return null;
  const info = METHODS[step.method];
  const id = fieldId(path);
  const where = `step ${stepIndex + 1} of ${outputLabel}`;
  const unsuited = unsuitedMessage(step.method, Array.isArray(kinds) ? kinds : []);
  const methodError = errorAt(formState.errors, `${path}.method`) ?? errorAt(formState.errors, path);
  const notes = [`${id}-about`, unsuited ? `${id}-unsuited` : null, methodError ? `${id}-error` : null].filter(Boolean).join(" ");
  const params = info.params.filter((p) => paramApplies(step, p.name));

  return (
    <fieldset
      aria-describedby={notes}
      className={`flex flex-col gap-3 rounded-panel border bg-panel p-3 ${unsuited || methodError ? "border-caution" : "border-panel-line"}`}
    >
      <legend className="px-1 text-label font-medium">
        Step {stepIndex + 1} of {outputLabel} — {info.title}
      </legend>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <MethodHelp method={step.method} id={`${id}-about`} />
        <div className="flex shrink-0 gap-1">
          <Button tone="quiet" aria-label={`Move ${where} up`} disabled={stepIndex === 0} onClick={() => onMove(stepIndex - 1)}>
            Up
          </Button>
          <Button tone="quiet" aria-label={`Move ${where} down`} disabled={stepIndex === count - 1} onClick={() => onMove(stepIndex + 1)}>
            Down
          </Button>
          <Button tone="quiet" className="text-fault" aria-label={`Remove ${where}`} onClick={onRemove}>
            Remove
          </Button>
        </div>
      </div>
      {unsuited ? (
        <p id={`${id}-unsuited`} className="rounded-panel bg-caution-soft px-2 py-1 text-label text-caution">
          {unsuited}
        </p>
      ) : null}
      {methodError ? (
        <p id={`${id}-error`} className="text-micro text-fault">
          {methodError}
        </p>
      ) : null}
      {params.length > 0 ? (
        <div className="grid gap-3 sm:grid-cols-2">
          {params.map((p) => (
            <ParamField key={p.name} stepPath={path} param={p} />
          ))}
        </div>
      ) : (
        <p className="text-micro text-ink-faint">This method takes no parameters.</p>
      )}
    </fieldset>
  );
}
