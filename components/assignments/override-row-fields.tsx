"use client";

import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { newRow, showValue, type OverrideRow, type ParamChoice } from "./override-rows";

type Props = {
  row: OverrideRow;
  name: string;
  choices: ParamChoice[];
  defaultUnit: string;
  onChange: (row: OverrideRow) => void;
  onRemove: () => void;
};

/** One parameter override: which parameter, and its new value (absolute with unit, percent, or plain). */
export function OverrideRowFields({ row, name, choices, defaultUnit, onChange, onRemove }: Readonly<Props>) {
  const choice = choices.find((c) => c.id === row.target);
  const id = name.replace(/\W+/g, "-");
  const type = choice?.param.type;
  return (
    <fieldset className="flex flex-wrap items-end gap-2 rounded-panel border border-panel-line p-2">
      <legend className="sr-only">{name}</legend>
      <label className="flex flex-col gap-1 text-micro text-ink-soft">
        Parameter ({name})
        <select id={`${id}-param`} className={inputClass} value={row.target} onChange={(e) => onChange(newRow(choices.find((c) => c.id === e.target.value), defaultUnit))}>
          <option value="">Choose…</option>
          {choices.map((c) => (
            <option key={c.id} value={c.id}>
              {c.label} (now {showValue(c.current)})
            </option>
          ))}
        </select>
      </label>
      {type === "magnitude" ? (
        <label className="flex flex-col gap-1 text-micro text-ink-soft">
          Value kind ({name})
          <select className={inputClass} value={row.mode} onChange={(e) => onChange({ ...row, mode: e.target.value as OverrideRow["mode"], unit: row.unit || defaultUnit })}>
            <option value="abs">absolute</option>
            <option value="pct">% of engineering range</option>
          </select>
        </label>
      ) : null}
      {type === "enum" || type === "boolean" ? (
        <label className="flex flex-col gap-1 text-micro text-ink-soft">
          Value ({name})
          <select className={inputClass} value={row.value} onChange={(e) => onChange({ ...row, value: e.target.value })}>
            {(type === "boolean" ? ["true", "false"] : (choice?.param.values ?? [])).map((v) => (
              <option key={v}>{v}</option>
            ))}
          </select>
        </label>
      ) : choice ? (
        <label className="flex flex-col gap-1 text-micro text-ink-soft">
          Value ({name})
          <input className={`${inputClass} w-28`} inputMode="decimal" value={row.value} onChange={(e) => onChange({ ...row, value: e.target.value })} />
        </label>
      ) : null}
      {type === "magnitude" && row.mode === "abs" ? (
        <label className="flex flex-col gap-1 text-micro text-ink-soft">
          Unit ({name})
          <input className={`${inputClass} w-24`} value={row.unit} onChange={(e) => onChange({ ...row, unit: e.target.value })} />
        </label>
      ) : null}
      {type === "seconds" ? <span className="pb-2 text-micro text-ink-faint">seconds</span> : null}
      <Button tone="quiet" onClick={onRemove} aria-label={`Remove ${name}`}>
        Remove
      </Button>
      {choice ? <p className="basis-full text-micro text-ink-faint">{choice.param.help}</p> : null}
    </fieldset>
  );
}
