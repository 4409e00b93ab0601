"use client";

import { useRouter } from "next/navigation";
import { toast } from "sonner";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { api, ApiFailure } from "@/lib/client/api";

type Props = { site: string; edit?: { key: string; text: string } };

/** Discards one edit of the site's draft change, or all of them, after asking. */
export function DiscardButton({ site, edit }: Readonly<Props>) {
  const router = useRouter();
  const discard = async () => {
    try {
      const res = await api<{ remaining: number }>(`/api/sites/${site}/draft/discard`, { method: "POST", json: edit ? { edits: [edit.key] } : { all: true } });
      toast.success(res.remaining === 0 ? "Draft discarded: nothing left to release" : `Edit discarded; ${res.remaining} left`);
      router.refresh();
      return true;
    } catch (e) {
      toast.error(e instanceof ApiFailure ? e.message : "Could not discard");
      return false;
    }
  };
  if (edit) {
    return (
      <ConfirmButton label={`Discard: ${edit.text}`} title="Discard this edit?" confirmLabel="Discard edit" onConfirm={discard}>
        Undo this edit and restore what the current release holds? <strong>{edit.text}</strong>
      </ConfirmButton>
    );
  }
  return (
    <ConfirmButton label="Discard all edits" title="Discard the whole draft?" confirmLabel="Discard all" onConfirm={discard}>
      Undo every edit of the draft change and restore the current release&apos;s groups and assignments? This cannot be undone.
    </ConfirmButton>
  );
}
