"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { toast } from "sonner";
import { ServerError } from "@/components/review/review-actions";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { Field, inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";

type Props = { site: string; current: number; earlier: { number: number; label: string }[]; blockedBy: string | null };

const MIN_REASON = 10;
const message = (e: unknown) => (e instanceof ApiFailure ? e.message : "The server could not be reached; try again.");

/** Roll back to an earlier release: as a change for review, or (urgent) released at once with a written reason. */
export function RollbackPanel({ site, current, earlier, blockedBy }: Readonly<Props>) {
  const router = useRouter();
  const [target, setTarget] = useState(earlier[0]?.number ?? 0);
  const [note, setNote] = useState("");
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [urgentError, setUrgentError] = useState<string | null>(null);

  const startReview = async () => {
    setBusy(true);
    setError(null);
    try {
      const { changeId } = await api<{ changeId: number }>(`/api/sites/${site}/rollbacks`, { method: "POST", json: { release: target, note } });
      toast.success(`Rollback to release ${target} submitted for review`);
      router.push(`/sites/${site}/changes/${changeId}`);
    } catch (e) {
      setError(message(e));
      setBusy(false);
    }
  };
  const releaseNow = async () => {
    setUrgentError(null);
    try {
      const res = await api<{ release: number }>(`/api/sites/${site}/rollbacks/urgent`, { method: "POST", json: { release: target, reason } });
      toast.success(`Release ${res.release} published: rollback to release ${target}. Every reviewer has been e-mailed.`);
      setReason("");
      router.refresh();
    } catch (e) {
      setUrgentError(message(e));
    }
    return true;
  };
  const reasonOk = reason.trim().length >= MIN_REASON;

  return (
    <section aria-labelledby="rollback-heading" className="flex flex-col gap-4 rounded-panel border border-panel-line bg-panel p-4">
      <div>
        <h3 id="rollback-heading" className="text-lead font-medium">
          Roll back
        </h3>
        <p className="text-label text-ink-soft">
          Restores an earlier release&apos;s groups and assignments (with their pinned profile revisions), rendered against today&apos;s tags and gateways, and publishes it under
          a new number after release {current}.
        </p>
        {blockedBy ? <p className="mt-1 text-label font-medium text-caution">{blockedBy}</p> : null}
      </div>
      <Field label="Release to go back to" htmlFor="rollback-target">
        <select id="rollback-target" className={`${inputClass} max-w-md`} value={target} onChange={(e) => setTarget(Number(e.target.value))}>
          {earlier.map((r) => (
            <option key={r.number} value={r.number}>
              {r.label}
            </option>
          ))}
        </select>
      </Field>

      <div className="flex flex-col gap-2">
        <Field label="Note for reviewers" htmlFor="rollback-note" hint="Optional. Another reviewer approves the rollback before it is released.">
          <textarea id="rollback-note" rows={2} maxLength={1000} className={inputClass} value={note} onChange={(e) => setNote(e.target.value)} />
        </Field>
        <ServerError message={error} />
        <div>
          <Button onClick={startReview} disabled={busy || !target}>
            {busy ? "Starting…" : "Start rollback for review"}
          </Button>
        </div>
      </div>

      <div className="flex flex-col gap-2 rounded-panel border-2 border-fault p-3" role="group" aria-labelledby="urgent-heading">
        <h4 id="urgent-heading" className="text-label font-medium text-fault">
          Urgent: release the rollback without a second reviewer
        </h4>
        <p role="note" className="text-label">
          <strong>Warning:</strong> this bypasses the four-eyes rule. The rollback is released at once on your decision alone, flagged as urgent in the release history with your
          reason, and every reviewer is e-mailed. Use it only when waiting for a second reviewer would do harm.
        </p>
        <Field label="Reason for releasing without a second reviewer" htmlFor="urgent-reason" hint={`At least ${MIN_REASON} characters; shown in the history and in the e-mail.`}>
          <textarea id="urgent-reason" rows={3} maxLength={1000} className={inputClass} value={reason} onChange={(e) => setReason(e.target.value)} />
        </Field>
        <ServerError message={urgentError} />
        <div>
          {reasonOk && target ? (
            <ConfirmButton label="Release rollback now" title={`Release a rollback to release ${target} now?`} confirmLabel="Release without a second reviewer" onConfirm={releaseNow}>
              Release {current + 1} will restore release {target} on every gateway at its next pull, without a second reviewer. Your reason goes to every reviewer:{" "}
              <q>{reason.trim()}</q>
            </ConfirmButton>
          ) : (
            <Button tone="quiet" disabled aria-describedby="urgent-reason-why">
              Release rollback now
            </Button>
          )}
          {!reasonOk ? (
            <span id="urgent-reason-why" className="ml-2 text-micro text-ink-faint">
              Write the reason first.
            </span>
          ) : null}
        </div>
      </div>
    </section>
  );
}
