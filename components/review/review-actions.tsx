"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { Field, inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";

const WHY: Record<number, string> = { 403: "Not allowed", 409: "Conflict", 422: "Not accepted", 404: "Not found" };

/** A server refusal in words: the status's meaning and the server's message. */
function describe(e: unknown): string {
  if (e instanceof ApiFailure) return `${WHY[e.detail.status] ?? `Refused (${e.detail.status})`}: ${e.detail.error}`;
  return "The server could not be reached; try again.";
}

export function ServerError({ message }: Readonly<{ message: string | null }>) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded-panel border border-fault bg-fault-soft px-3 py-2 text-label text-fault">
      {message}
    </p>
  );
}

type Base = { site: string; changeId: number };

/** Approve with an optional comment; a regulated change needs the caution acknowledged first. */
export function ApproveForm({ site, changeId, regulated, cautionId }: Readonly<Base & { regulated: string[]; cautionId: string }>) {
  const router = useRouter();
  const id = useId();
  const [comment, setComment] = useState("");
  const [ack, setAck] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const needsAck = regulated.length > 0;
  const approve = async () => {
    setBusy(true);
    setError(null);
    try {
      await api(`/api/sites/${site}/changes/${changeId}/approve`, { method: "POST", json: { comment, ...(ack ? { acknowledge: cautionId } : {}) } });
      toast.success(`Change ${changeId} approved`);
      router.refresh();
    } catch (e) {
      setError(describe(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <form
      aria-label="Approve"
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void approve();
      }}
    >
      <Field label="Comment for the authors (optional)" htmlFor={`${id}-comment`}>
        <textarea id={`${id}-comment`} className={inputClass} rows={2} maxLength={2000} value={comment} onChange={(e) => setComment(e.target.value)} />
      </Field>
      {needsAck ? (
        <label className="flex items-start gap-2 rounded-panel border border-caution bg-caution-soft p-2 text-label">
          <input type="checkbox" className="mt-0.5" checked={ack} onChange={(e) => setAck(e.target.checked)} required aria-describedby={`${id}-ack-hint`} />
          <span>
            I have read the regulated-record caution and acknowledge it for {regulated.join(", ")}
            <span id={`${id}-ack-hint`} className="block text-micro text-ink-soft">
              Required: this change touches regulated-record groups. Your acknowledgement is stored with the approval.
            </span>
          </span>
        </label>
      ) : null}
      <ServerError message={error} />
      <div>
        <Button type="submit" disabled={busy || (needsAck && !ack)}>
          {busy ? "Approving…" : "Approve change"}
        </Button>
      </div>
    </form>
  );
}

/** Reject with a reason the authors read; the change goes back to being editable. */
export function RejectForm({ site, changeId }: Readonly<Base>) {
  const router = useRouter();
  const id = useId();
  const [comment, setComment] = useState("");
  const [busy, setBusy] = useState(false);
  const [missing, setMissing] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const reject = async () => {
    if (!comment.trim()) return setMissing(true);
    setBusy(true);
    setError(null);
    try {
      await api(`/api/sites/${site}/changes/${changeId}/reject`, { method: "POST", json: { comment } });
      toast.success(`Change ${changeId} rejected; its authors are told why`);
      router.refresh();
    } catch (e) {
      setError(describe(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <form
      aria-label="Reject"
      className="flex flex-col gap-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        void reject();
      }}
    >
      <Field label="Why is it rejected?" htmlFor={`${id}-reason`} error={missing ? "Say why the change is rejected." : undefined}>
        <textarea
          id={`${id}-reason`}
          className={inputClass}
          rows={2}
          maxLength={2000}
          value={comment}
          aria-invalid={missing || undefined}
          aria-describedby={missing ? `${id}-reason-error` : undefined}
          onChange={(e) => {
            setComment(e.target.value);
            setMissing(false);
          }}
        />
      </Field>
      <ServerError message={error} />
      <div>
        <Button type="submit" tone="quiet" className="text-fault" disabled={busy}>
          {busy ? "Rejecting…" : "Reject change"}
        </Button>
      </div>
    </form>
  );
}

/** Releases an approved change after asking; a stale change (another release came first) goes back to draft. */
export function ReleaseButton({ site, changeId, release }: Readonly<Base & { release: number }>) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const publish = async () => {
    setError(null);
    try {
      const res = await api<{ release: number }>(`/api/sites/${site}/changes/${changeId}/release`, { method: "POST" });
      toast.success(`Release ${res.release} published; gateways pick it up on their next pull`);
      router.refresh();
      return true;
    } catch (e) {
      setError(describe(e));
      router.refresh();
      return true;
    }
  };
  return (
    <div className="flex flex-col gap-2">
      <div>
        <ConfirmButton label={`Release as release ${release}`} title={`Publish change ${changeId} as release ${release}?`} confirmLabel="Release" tone="primary" onConfirm={publish}>
          Every gateway of the site gets its signed bundle for release {release} on its next pull. A release cannot be changed afterwards; going back means a rollback under a
          new number.
        </ConfirmButton>
      </div>
      <ServerError message={error} />
    </div>
  );
}
