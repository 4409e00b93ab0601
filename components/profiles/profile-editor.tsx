"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState } from "react";
import { FormProvider, useFieldArray, useForm, type FieldPath } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import type { Profile } from "@/lib/reduction/profile";
import { TAG_KINDS } from "@/lib/reduction/profile-names";
import { describedBy, errorAt, ErrorText, HelpText } from "./form-bits";
import { describeFieldPath, fieldId, flattenErrors, issueToFormPath } from "./form-paths";
import { OutputEditor } from "./output-editor";
import { emptyOutput, newProfileDraft, toDraft, type ProfileDraft } from "./profile-draft";
import { profileFormSchema } from "./profile-form-schema";
import { SaveProblems } from "./save-problems";

type Existing = { id: number; revision: number; document: Profile };
type Props = { existing: Existing | null };
type Saved = { id: number; revision: number };

/** Writes a profile: a new one (revision 1) or the next revision of an existing one. */
export function ProfileEditor({ existing }: Readonly<Props>) {
  const router = useRouter();
  const defaultValues = useMemo(() => (existing ? toDraft(existing.document) : newProfileDraft()), [existing]);
  const form = useForm<ProfileDraft, unknown, Profile>({ resolver: zodResolver(profileFormSchema), defaultValues, reValidateMode: "onChange" });
  const { control, register, handleSubmit, setError, getValues, trigger, watch, formState } = form;
  const outputs = useFieldArray({ control, name: "outputs" });
  const [conflict, setConflict] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const submitted = formState.submitCount > 0;

  // After the first save attempt, every edit re-checks the whole document, so a fixed problem clears wherever it was shown.
  useEffect(() => {
    const sub = watch(() => {
      if (submitted) void trigger();
    });
    return () => sub.unsubscribe();
  }, [watch, trigger, submitted]);

  const onSubmit = handleSubmit(
    async (document) => {
      setConflict(null);
      setProblem(null);
      const note = getValues("note").trim();
      try {
        const saved = existing
          ? await api<Saved>(`/api/profiles/${existing.id}/revisions`, { method: "POST", json: { document, note, baseRevision: existing.revision } })
          : await api<Saved>("/api/profiles", { method: "POST", json: { document, note } });
        toast.success(`Revision ${saved.revision} saved`);
        router.push(`/profiles/${saved.id}`);
        router.refresh();
      } catch (e) {
        if (!(e instanceof ApiFailure)) {
          toast.error("Not saved: the server did not answer.");
          return;
        }
        const d = e.detail;
        if (d.status === 409 && d.field === "baseRevision") {
          setConflict(e.message);
          toast.error("Not saved: someone saved a newer revision.");
          return;
        }
        const issues = d.issues ?? (d.field ? [{ field: d.field, message: d.error }] : []);
        const loose: string[] = [];
        for (const issue of issues) {
          const path = issueToFormPath(issue.field);
          if (path) setError(path as FieldPath<ProfileDraft>, { type: "server", message: issue.message });
          else loose.push(issue.message);
        }
        if (issues.length === 0) loose.push(d.error);
        setProblem(loose.length ? loose.map((m) => m.charAt(0).toUpperCase() + m.slice(1)).join(" ") : null);
        toast.error(loose.length ? `Not saved: ${loose[0]}` : "Not saved: check the highlighted fields.");
      }
    },
    () => toast.error("Not saved: check the highlighted fields."),
  );

  const errors = formState.errors;
  const flat = submitted ? flattenErrors(errors) : [];
  const outputNames = submitted ? (getValues("outputs") ?? []).map((o) => o?.name?.trim() ?? "") : [];
  const nameError = errorAt(errors, "name");
  const descError = errorAt(errors, "description");
  const kindsError = errorAt(errors, "kinds");
  const noteError = errorAt(errors, "note");
  const outputsError = errorAt(errors, "outputs");
  const cancelHref = existing ? `/profiles/${existing.id}` : "/profiles";

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate aria-label={existing ? "Edit profile" : "New profile"} className="flex flex-col gap-6">
        <SaveProblems
          conflict={conflict}
          problem={problem}
          reloadHref={existing ? `/profiles/${existing.id}/edit` : null}
          latestHref={existing ? `/profiles/${existing.id}` : null}
          problems={flat.map((f) => ({ where: describeFieldPath(f.path, outputNames), message: f.message }))}
        />
        <fieldset className="grid gap-4 rounded-panel border border-panel-line bg-panel p-4 sm:grid-cols-2">
          <legend className="px-1 text-label font-medium">Profile</legend>
          <div className="flex flex-col gap-1">
            <label htmlFor="pf-name" className="text-label font-medium text-ink-soft">
              Profile name
            </label>
            <input id="pf-name" autoComplete="off" className={inputClass} aria-invalid={!!nameError} aria-describedby={describedBy("pf-name", nameError, false)} {...register("name")} />
            <ErrorText id="pf-name" error={nameError} />
          </div>
          <fieldset className="flex flex-col gap-1" aria-describedby={describedBy("pf-kinds", kindsError)}>
            <legend className="text-label font-medium text-ink-soft">Tag kinds</legend>
            <div className="mt-1 flex flex-wrap gap-4">
              {TAG_KINDS.map((k) => (
                <label key={k} className="flex items-center gap-1.5 text-label">
                  <input type="checkbox" value={k} aria-invalid={!!kindsError} {...register("kinds")} /> {k}
                </label>
              ))}
            </div>
            <HelpText id="pf-kinds">New steps are offered only when they suit every ticked kind.</HelpText>
            <ErrorText id="pf-kinds" error={kindsError} />
          </fieldset>
          <div className="flex flex-col gap-1 sm:col-span-2">
            <label htmlFor="pf-description" className="text-label font-medium text-ink-soft">
              Description
            </label>
            <textarea id="pf-description" rows={2} className={inputClass} aria-invalid={!!descError} aria-describedby={describedBy("pf-description", descError)} {...register("description")} />
            <HelpText id="pf-description">What the profile is for, and for which signals.</HelpText>
            <ErrorText id="pf-description" error={descError} />
          </div>
        </fieldset>

        <section aria-labelledby="pf-outputs-heading" className="flex flex-col gap-3">
          <h2 id="pf-outputs-heading">Outputs</h2>
          <p className="text-label text-ink-soft">Each output is one series the cloud receives per tag, made by its steps in order.</p>
          {outputsError ? <p className="text-micro text-fault">{outputsError}</p> : null}
          {outputs.fields.map((f, i) => (
            <OutputEditor key={f.id} index={i} count={outputs.fields.length} onRemove={() => outputs.remove(i)} onMove={(to) => outputs.move(i, to)} />
          ))}
          <div>
            <Button tone="quiet" onClick={() => outputs.append(emptyOutput())}>
              Add output
            </Button>
          </div>
        </section>

        <div className="flex max-w-2xl flex-col gap-1">
          <label htmlFor="pf-note" className="text-label font-medium text-ink-soft">
            What changed
          </label>
          <textarea id="pf-note" rows={2} className={inputClass} aria-invalid={!!noteError} aria-describedby={describedBy("pf-note", noteError)} {...register("note")} />
          <HelpText id="pf-note">A note for the revision history{existing ? `, e.g. why revision ${existing.revision + 1} differs` : ""}.</HelpText>
          <ErrorText id="pf-note" error={noteError} />
        </div>

        <div className="flex flex-wrap items-center gap-2">
          <Button type="submit" disabled={formState.isSubmitting}>
            {formState.isSubmitting ? "Saving…" : existing ? "Save revision" : "Create profile"}
          </Button>
          <Link href={cancelHref} className="min-h-9 rounded-panel border border-panel-line bg-panel px-3 py-1.5 text-label">
            Cancel
          </Link>
          {existing ? <span className="text-micro text-ink-faint">Editing from revision {existing.revision}.</span> : null}
        </div>
      </form>
    </FormProvider>
  );
}
