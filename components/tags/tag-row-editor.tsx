"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import type { CSSProperties } from "react";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { api, ApiFailure } from "@/lib/client/api";
import { TAG_KINDS, tagSchema, type TagInput, type TagValues } from "@/schemas/tag";
import type { TagRow } from "./use-site-tags";

type Props = { site: string; tag: TagRow; gateways: string[]; style: CSSProperties; onDone: (saved: boolean) => void };

const cell = "min-w-0 rounded border border-panel-line bg-panel px-1 py-0.5 text-label aria-[invalid=true]:border-fault";

/** One tag row turned into inputs; Enter saves, Escape cancels. The name is the key and stays. */
export function TagRowEditor({ site, tag, gateways, style, onDone }: Readonly<Props>) {
  const { register, handleSubmit, setError, formState } = useForm<TagInput, unknown, TagValues>({
    resolver: zodResolver(tagSchema),
    defaultValues: { ...tag, euLow: tag.euLow ?? undefined, euHigh: tag.euHigh ?? undefined },
  });
  const e = formState.errors;
  const firstError = Object.entries(e)[0]?.[1]?.message as string | undefined;

  const save = handleSubmit(async (values) => {
    try {
      await api(`/api/sites/${site}/tags/${tag.id}`, { method: "PATCH", json: values });
      toast.success(`${tag.name} saved.`);
      onDone(true);
    } catch (err) {
      if (err instanceof ApiFailure && err.detail.field) setError(err.detail.field as keyof TagInput, { message: err.message });
      toast.error(`Not saved: ${err instanceof Error ? err.message : "the server did not answer"}`);
    }
  });

  const num = { setValueAs: (v: string) => (v === "" ? null : Number(v)) };
  return (
    <form
      role="row"
      aria-label={`Editing ${tag.name}`}
      className="grid items-center gap-1 border-b border-weir-300 bg-weir-50 text-label"
      style={style}
      onSubmit={save}
      onKeyDown={(ev) => {
        if (ev.key === "Escape") onDone(false);
      }}
      noValidate
    >
      <span />
      <span className="truncate px-2 font-mono" title={firstError}>
        {tag.name}
        {firstError ? <span className="ml-2 text-fault">{firstError}</span> : null}
      </span>
      <input aria-label="Unit" className={cell} aria-invalid={!!e.unit} {...register("unit")} autoFocus />
      <input aria-label="Sample period (ms)" type="number" className={cell} aria-invalid={!!e.samplePeriodMs} {...register("samplePeriodMs", { valueAsNumber: true })} />
      <select aria-label="Kind" className={cell} {...register("kind")}>
        {TAG_KINDS.map((k) => (
          <option key={k}>{k}</option>
        ))}
      </select>
      <span className="flex gap-1">
        <input aria-label="Range low" type="number" step="any" className={`${cell} w-1/2`} aria-invalid={!!e.euLow} {...register("euLow", num)} />
        <input aria-label="Range high" type="number" step="any" className={`${cell} w-1/2`} aria-invalid={!!e.euHigh} {...register("euHigh", num)} />
      </span>
      <input aria-label="Area" className={cell} {...register("area")} />
      <input aria-label="Equipment" className={cell} {...register("equipment")} />
      <select aria-label="Gateway" className={cell} {...register("gateway")}>
        {gateways.map((g) => (
          <option key={g}>{g}</option>
        ))}
      </select>
      <span className="flex gap-1 px-1">
        <button type="submit" className="font-medium text-weir-700 hover:underline" disabled={formState.isSubmitting}>
          Save
        </button>
        <button type="button" className="text-ink-soft hover:underline" onClick={() => onDone(false)}>
          Cancel
        </button>
      </span>
    </form>
  );
}
