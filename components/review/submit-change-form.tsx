"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import { ServerError } from "./review-actions";

/** Submits the site's draft change for review and opens its review page. */
export function SubmitChangeForm({ site }: Readonly<{ site: string }>) {
  const router = useRouter();
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      const { changeId } = await api<{ changeId: number }>(`/api/sites/${site}/changes`, { method: "POST", json: { note } });
      toast.success(`Change ${changeId} submitted; reviewers have been e-mailed`);
      router.push(`/sites/${site}/changes/${changeId}`);
    } catch (e) {
      setError(e instanceof ApiFailure ? `Not submitted: ${e.message}` : "The server could not be reached; try again.");
      setBusy(false);
    }
  };
  return (
    <form
      aria-label="Submit for review"
      className="mt-4 flex flex-col gap-2 border-t border-panel-line pt-3"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      <Field label="Note for reviewers" htmlFor="submit-note" hint="What the change is for and anything reviewers should check. Submitting renders every gateway's bundle and its diff.">
        <textarea id="submit-note" rows={2} maxLength={1000} className={inputClass} value={note} onChange={(e) => setNote(e.target.value)} />
      </Field>
      <ServerError message={error} />
      <div>
        <Button type="submit" disabled={busy}>
          {busy ? "Submitting…" : "Submit for review"}
        </Button>
      </div>
    </form>
  );
}
