"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { Field, inputClass } from "@/components/ui/field";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { api, ApiFailure } from "@/lib/client/api";
import { groupSchema, TAG_KINDS, type Selector } from "@/schemas/tag";
import { formField, fromGroup, toSelector, type GroupFormValues } from "./selector-fields";

type Existing = { id: number; name: string; description: string; regulated: boolean; selector: Selector };
type Props = { site: string; gateways: string[]; existing: Existing | null; canEdit: boolean };
type Preview = { count: number; sample: string[]; wonElsewhere: number; total: number };

/** Builds a group from rules, with a live count of the tags it selects. */
export function GroupEditor({ site, gateways, existing, canEdit }: Readonly<Props>) {
  const router = useRouter();
  const { register, handleSubmit, setError, watch, formState } = useForm<GroupFormValues>({ defaultValues: fromGroup(existing) });
  const [preview, setPreview] = useState<Preview | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const values = watch();
  const selectorKey = JSON.stringify(toSelector(values));

  useEffect(() => {
    const timer = setTimeout(async () => {
      try {
        const p = await api<Preview>(`/api/sites/${site}/groups/preview`, {
          method: "POST",
          json: { selector: JSON.parse(selectorKey), groupId: existing?.id ?? null },
        });
        setPreview(p);
        setPreviewError(null);
      } catch (e) {
        setPreviewError(e instanceof ApiFailure ? e.message : "preview unavailable");
      }
    }, 250);
    return () => clearTimeout(timer);
  }, [selectorKey, site, existing?.id]);

  const onSubmit = handleSubmit(async (v) => {
    const body = { name: v.name, description: v.description, regulated: v.regulated, selector: toSelector(v) };
    const parsed = groupSchema.safeParse(body);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) setError(formField(issue.path.join(".")), { message: issue.message });
      toast.error("Not saved: check the highlighted fields.");
      return;
    }
    try {
      const url = existing ? `/api/sites/${site}/groups/${existing.id}` : `/api/sites/${site}/groups`;
      await api(url, { method: existing ? "PATCH" : "POST", json: parsed.data });
      toast.success(`Group ${parsed.data.name} saved to the draft change.`);
      router.push(`/sites/${site}/groups`);
      router.refresh();
    } catch (e) {
      if (e instanceof ApiFailure) {
        for (const issue of e.detail.issues ?? (e.detail.field ? [{ field: e.detail.field, message: e.message }] : [])) {
          setError(formField(issue.field), { message: issue.message });
        }
      }
      toast.error(`Not saved: ${e instanceof Error ? e.message : "the server did not answer"}`);
    }
  });

  const err = (k: keyof GroupFormValues) => formState.errors[k]?.message as string | undefined;
  const disabled = !canEdit;
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Tag group">
        <fieldset disabled={disabled} className="grid gap-4 sm:grid-cols-2">
          <Field label="Group name" htmlFor="g-name" error={err("name")}>
            <input id="g-name" className={inputClass} aria-invalid={!!err("name")} {...register("name")} />
          </Field>
          <Field label="Description" htmlFor="g-desc" error={err("description")}>
            <input id="g-desc" className={inputClass} {...register("description")} />
          </Field>
          <div className="sm:col-span-2 rounded-panel border border-caution/50 bg-caution-soft p-3">
            <label className="flex items-center gap-2 font-medium">
              <input type="checkbox" {...register("regulated")} /> {REGULATED_RECORD_CAUTION.title}
            </label>
            <p className="mt-1 text-micro text-ink-soft">{REGULATED_RECORD_CAUTION.text}</p>
          </div>
        </fieldset>
        <fieldset disabled={disabled} className="grid gap-4 rounded-panel border border-panel-line bg-panel p-4 sm:grid-cols-2">
          <legend className="px-1 text-label font-medium">Selector rules</legend>
          <Field label="Tag name patterns" htmlFor="g-patterns" error={err("patterns")} hint={<>One per line. * stays within one / level, ** crosses levels: PAST1/TT-*/PV, CIP*/**/TOT</>}>
            <textarea id="g-patterns" rows={4} className={`${inputClass} font-mono`} aria-invalid={!!err("patterns")} {...register("patterns")} />
          </Field>
          <div className="grid gap-3">
            <Field label="Units" htmlFor="g-units" error={err("units")} hint="Comma-separated, e.g. degC, degF">
              <input id="g-units" className={inputClass} {...register("units")} />
            </Field>
            <fieldset>
              <legend className="text-label font-medium text-ink-soft">Kinds</legend>
              <div className="mt-1 flex gap-3">
                {TAG_KINDS.map((k) => (
                  <label key={k} className="flex items-center gap-1 text-label">
                    <input type="checkbox" value={k} {...register("kinds")} /> {k}
                  </label>
                ))}
              </div>
            </fieldset>
          </div>
          <Field label="Areas" htmlFor="g-areas" error={err("areas")} hint="Comma-separated">
            <input id="g-areas" className={inputClass} {...register("areas")} />
          </Field>
          <Field label="Equipment" htmlFor="g-equipment" error={err("equipment")} hint="Comma-separated">
            <input id="g-equipment" className={inputClass} {...register("equipment")} />
          </Field>
          <fieldset className="sm:col-span-2">
            <legend className="text-label font-medium text-ink-soft">Gateways</legend>
            <div className="mt-1 flex flex-wrap gap-3">
              {gateways.map((g) => (
                <label key={g} className="flex items-center gap-1 font-mono text-label">
                  <input type="checkbox" value={g} {...register("gateways")} /> {g}
                </label>
              ))}
            </div>
          </fieldset>
          <Field label="Sample period from (ms)" htmlFor="g-min" error={err("minPeriodMs")}>
            <input id="g-min" type="number" className={inputClass} {...register("minPeriodMs")} />
          </Field>
          <Field label="Sample period up to (ms)" htmlFor="g-max" error={err("maxPeriodMs")}>
            <input id="g-max" type="number" className={inputClass} {...register("maxPeriodMs")} />
          </Field>
          <Field label="Always include (tag names)" htmlFor="g-include" error={err("include")} hint="One per line; wins over the rules above.">
            <textarea id="g-include" rows={3} className={`${inputClass} font-mono`} {...register("include")} />
          </Field>
          <Field label="Never include (tag names)" htmlFor="g-exclude" error={err("exclude")} hint="One per line; wins over everything.">
            <textarea id="g-exclude" rows={3} className={`${inputClass} font-mono`} {...register("exclude")} />
          </Field>
        </fieldset>
        {canEdit ? (
          <div className="flex flex-wrap gap-2">
            <Button type="submit" disabled={formState.isSubmitting}>
              {existing ? "Save group" : "Create group"}
            </Button>
            {existing ? (
              <ConfirmButton
                label="Delete group"
                title={`Delete ${existing.name}?`}
                confirmLabel="Delete group"
                onConfirm={async () => {
                  try {
                    await api(`/api/sites/${site}/groups/${existing.id}`, { method: "DELETE" });
                    toast.success(`Group ${existing.name} removed in the draft change.`);
                    router.push(`/sites/${site}/groups`);
                    router.refresh();
                    return true;
                  } catch (e) {
                    toast.error(`Not deleted: ${e instanceof Error ? e.message : "the server did not answer"}`);
                    return false;
                  }
                }}
              >
                Its tags fall to the next group that matches them, or become tags in no group. The removal is part of the draft change until released.
              </ConfirmButton>
            ) : null}
          </div>
        ) : null}
      </form>
      <aside aria-labelledby="preview-heading" className="h-fit rounded-panel border border-panel-line bg-panel p-4 lg:sticky lg:top-4">
        <h2 id="preview-heading" className="text-lead font-medium">
          Live preview
        </h2>
        {previewError ? <p className="mt-2 text-label text-fault">{previewError}</p> : null}
        {preview ? (
          <div className="mt-2 text-label" aria-live="polite">
            <p data-testid="preview-count" className="text-title">
              {preview.count.toLocaleString("en")} tag{preview.count === 1 ? "" : "s"}
            </p>
            <p className="text-ink-faint">of {preview.total.toLocaleString("en")} at the site match these rules.</p>
            {preview.wonElsewhere > 0 ? (
              <p className="mt-1 text-caution">{preview.wonElsewhere.toLocaleString("en")} of them are already taken by higher-priority groups.</p>
            ) : null}
            <ul className="mt-3 max-h-80 overflow-y-auto font-mono text-micro" aria-label="Matched tags (sample)" tabIndex={0}>
              {preview.sample.map((n) => (
                <li key={n} className="truncate">
                  {n}
                </li>
              ))}
            </ul>
            {preview.count > preview.sample.length ? <p className="mt-1 text-micro text-ink-faint">… and {(preview.count - preview.sample.length).toLocaleString("en")} more</p> : null}
          </div>
        ) : (
          <p className="mt-2 text-label text-ink-faint">Counting…</p>
        )}
      </aside>
    </div>
  );
}
