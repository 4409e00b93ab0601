"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";

type Props = { profileId: number; name: string };

/** Copies the latest revision into a new profile under a name the user gives. */
export function DuplicateButton({ profileId, name }: Readonly<Props>) {
  const router = useRouter();
  const dialog = useRef<HTMLDialogElement>(null);
  const [copyName, setCopyName] = useState(`${name} (copy)`.slice(0, 80));
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const created = await api<{ id: number; revision: number }>(`/api/profiles/${profileId}/duplicate`, { method: "POST", json: { name: copyName } });
      toast.success(`Copied to “${copyName.trim()}”`);
      dialog.current?.close();
      router.push(`/profiles/${created.id}`);
      router.refresh();
    } catch (err) {
      const message = err instanceof ApiFailure ? (err.detail.issues?.[0]?.message ?? err.message) : "the server did not answer";
      setError(message.charAt(0).toUpperCase() + message.slice(1));
    } finally {
      setBusy(false);
    }
  }

  return (
    <>
      <Button tone="quiet" onClick={() => dialog.current?.showModal()}>
        Duplicate
      </Button>
      <dialog ref={dialog} aria-labelledby="dup-title" className="m-auto w-full max-w-md rounded-panel bg-panel p-0 shadow-xl backdrop:bg-ink/40">
        <form onSubmit={submit} className="p-5" noValidate>
          <h2 id="dup-title" className="text-title">
            Duplicate {name}
          </h2>
          <p className="mt-1 text-label text-ink-soft">The copy starts at revision 1 with the latest revision&apos;s outputs and steps. Nothing is assigned to it.</p>
          <div className="mt-3 flex flex-col gap-1">
            <label htmlFor="dup-name" className="text-label font-medium text-ink-soft">
              Name of the copy
            </label>
            <input
              id="dup-name"
              value={copyName}
              onChange={(e) => setCopyName(e.target.value)}
              className={inputClass}
              aria-invalid={!!error}
              aria-describedby={error ? "dup-name-error" : undefined}
            />
            {error ? (
              <p id="dup-name-error" className="text-micro text-fault">
                {error}
              </p>
            ) : null}
          </div>
          <div className="mt-5 flex justify-end gap-2">
            <Button tone="quiet" onClick={() => dialog.current?.close()}>
              Cancel
            </Button>
            <Button type="submit" disabled={busy}>
              {busy ? "Copying…" : "Create copy"}
            </Button>
          </div>
        </form>
      </dialog>
    </>
  );
}
