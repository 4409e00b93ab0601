"use client";

import { useId } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import type { NumericParam } from "./numeric-params";

type Props = {
  params: readonly NumericParam[];
  values: Readonly<Record<string, string>>;
  problems: Readonly<Record<string, string>>;
  edited: boolean;
  ready: boolean;
  onChange: (key: string, text: string) => void;
  onRun: () => void;
  onRevert: () => void;
};

/** The selected revision's numeric parameters, editable here without saving a revision. */
export function ParamEditor({ params, values, problems, edited, ready, onChange, onRun, onRevert }: Readonly<Props>) {
  const id = useId();
  const steps = new Map<string, NumericParam[]>();
  for (const p of params) {
    const k = `${p.output}|${p.step}`;
    steps.set(k, [...(steps.get(k) ?? []), p]);
  }
  return (
    <form
      aria-label="Parameters"
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        onRun();
      }}
    >
      {params.length === 0 ? <p className="text-label text-ink-faint">No numeric parameters in this revision.</p> : null}
      {[...steps.values()].map((group) => {
        const first = group[0];
        return (
          <fieldset key={`${first.output}|${first.step}`} className="flex flex-wrap gap-3 rounded-panel border border-panel-line p-2">
            <legend className="px-1 text-label font-medium text-ink-soft">
              {first.output} · step {first.step + 1}: {first.methodTitle}
            </legend>
            {group.map((p) => {
              const fid = `${id}-${p.key.replace(/[^a-z0-9]/gi, "-")}`;
              const problem = problems[p.key];
              const changed = values[p.key] !== undefined && Number(values[p.key]) !== p.value;
              return (
                <div key={p.key} className="flex flex-col gap-1">
                  <label htmlFor={fid} className="text-micro text-ink-soft">
                    {p.label}
                    <span className="sr-only">
                      {" "}
                      of {p.output}, step {p.step + 1}
                    </span>
                    {changed ? <span className="ml-1 text-caution">(was {p.value})</span> : null}
                  </label>
                  <input
                    id={fid}
                    type="number"
                    step="any"
                    inputMode="decimal"
                    className={`${inputClass} w-36`}
                    value={values[p.key] ?? String(p.value)}
                    aria-invalid={!!problem}
                    aria-describedby={problem ? `${fid}-error` : undefined}
                    onChange={(e) => onChange(p.key, e.target.value)}
                  />
                  {problem ? (
                    <p id={`${fid}-error`} className="text-micro text-fault">
                      {problem}
                    </p>
                  ) : null}
                </div>
              );
            })}
          </fieldset>
        );
      })}
      <div className="flex flex-wrap items-center gap-2">
        <Button type="submit" disabled={!ready}>
          Run preview
        </Button>
        {edited ? (
          <>
            <Button tone="quiet" onClick={onRevert}>
              Back to the saved revision
            </Button>
            <span className="text-micro text-caution" data-testid="edited-note">
              Edited here, not saved: save a new revision in the profile editor to keep it.
            </span>
          </>
        ) : null}
      </div>
    </form>
  );
}
