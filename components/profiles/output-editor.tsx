"use client";

import { useState } from "react";
import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import type { StepMethod } from "@/lib/reduction/profile";
import { describedBy, errorAt, ErrorText, HelpText } from "./form-bits";
import { fieldId } from "./form-paths";
import { methodGroups } from "./method-options";
import { emptyStep, type ProfileDraft } from "./profile-draft";
import { StepEditor } from "./step-editor";

type Props = { index: number; count: number; onRemove: () => void; onMove: (to: number) => void };

/** One output: its name and its ordered chain of steps, with a picker for the next step. */
export function OutputEditor({ index, count, onRemove, onMove }: Readonly<Props>) {
  const { control, register, formState } = useFormContext<ProfileDraft>();
  const steps = useFieldArray({ control, name: `outputs.${index}.steps` });
  const name = useWatch({ control, name: `outputs.${index}.name` });
  const kinds = useWatch({ control, name: "kinds" });
  const [pick, setPick] = useState<StepMethod | "">("");
  const label = name?.trim() || `output ${index + 1}`;
  const groups = methodGroups(Array.isArray(kinds) ? kinds : []);
  const offered = groups.flatMap((g) => g.methods.map((m) => m.method));
  const chosen = pick && offered.includes(pick) ? pick : offered[0];
  const nameId = fieldId(`outputs.${index}.name`);
  const nameError = errorAt(formState.errors, `outputs.${index}.name`);
  const stepsId = fieldId(`outputs.${index}.steps`);
  const stepsError = errorAt(formState.errors, `outputs.${index}.steps`);
  const pickId = `${stepsId}-new`;

  return (
    <section aria-labelledby={`${nameId}-heading`} className="flex flex-col gap-3 rounded-panel border border-panel-line bg-panel-sunk p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 id={`${nameId}-heading`} className="text-lead font-medium">
          Output {index + 1}
          {name?.trim() ? <span className="font-mono">: {name.trim()}</span> : null}
        </h3>
        <div className="flex gap-1">
          <Button tone="quiet" aria-label={`Move output ${label} up`} disabled={index === 0} onClick={() => onMove(index - 1)}>
            Up
          </Button>
          <Button tone="quiet" aria-label={`Move output ${label} down`} disabled={index === count - 1} onClick={() => onMove(index + 1)}>
            Down
          </Button>
          <Button tone="quiet" className="text-fault" aria-label={`Remove output ${label}`} disabled={count === 1} onClick={onRemove}>
            Remove
          </Button>
        </div>
      </div>
      <div className="flex max-w-md flex-col gap-1">
        <label htmlFor={nameId} className="text-label font-medium text-ink-soft">
          Name of output {index + 1}
        </label>
        <input
          id={nameId}
          autoComplete="off"
          className={`${inputClass} font-mono`}
          aria-invalid={!!nameError}
          aria-describedby={describedBy(nameId, nameError)}
          {...register(`outputs.${index}.name`)}
        />
        <HelpText id={nameId}>
          Lower-case letters, digits, - and _. The cloud receives this output under each tag&apos;s name with this name appended, so renaming or removing
          it changes what the cloud receives.
        </HelpText>
        <ErrorText id={nameId} error={nameError} />
      </div>
      {stepsError ? (
        <p id={`${stepsId}-error`} className="text-micro text-fault">
          {stepsError}
        </p>
      ) : null}
      {steps.fields.length === 0 ? <p className="text-label text-ink-faint">No steps yet. Steps run in order, each on what the one before it kept.</p> : null}
      <ol className="flex flex-col gap-3" aria-label={`Steps of ${label}`}>
        {steps.fields.map((f, j) => (
          <li key={f.id}>
            <StepEditor
              outputIndex={index}
              stepIndex={j}
              count={steps.fields.length}
              outputLabel={label}
              onRemove={() => steps.remove(j)}
              onMove={(to) => steps.move(j, to)}
            />
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex flex-col gap-1">
          <label htmlFor={pickId} className="text-label font-medium text-ink-soft">
            New step method<span className="sr-only"> for {label}</span>
          </label>
          <select id={pickId} className={inputClass} value={chosen ?? ""} onChange={(e) => setPick(e.target.value as StepMethod)}>
            {groups.map((g) => (
              <optgroup key={g.role} label={g.label}>
                {g.methods.map((m) => (
                  <option key={m.method} value={m.method}>
                    {m.title}
                  </option>
                ))}
              </optgroup>
            ))}
          </select>
        </div>
        <Button tone="quiet" disabled={!chosen} onClick={() => chosen && steps.append(emptyStep(chosen))}>
          Add step<span className="sr-only"> to {label}</span>
        </Button>
      </div>
      <p className="text-micro text-ink-faint">Only methods that suit every ticked kind are offered.</p>
    </section>
  );
}
