"use client";

import { useRouter } from "next/navigation";
import { toast } from "sonner";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { api } from "@/lib/client/api";

type Props = { profileId: number; name: string; archived: boolean; usage: number };

/** Archives a profile (no new assignments) or restores it; pinned assignments keep working either way. */
export function ArchiveButton({ profileId, name, archived, usage }: Readonly<Props>) {
  const router = useRouter();
  const action = archived ? "Restore profile" : "Archive profile";
  return (
    <ConfirmButton
      label={action}
      title={`${archived ? "Restore" : "Archive"} ${name}?`}
      confirmLabel={action}
      tone={archived ? "primary" : "danger"}
      onConfirm={async () => {
        try {
          await api(`/api/profiles/${profileId}`, { method: "PATCH", json: { archived: !archived } });
          toast.success(archived ? `${name} restored` : `${name} archived`);
          router.refresh();
          return true;
        } catch (e) {
          toast.error(`Not ${archived ? "restored" : "archived"}: ${e instanceof Error ? e.message : "the server did not answer"}`);
          return false;
        }
      }}
    >
      {archived
        ? "It appears in the library again and can be assigned to groups."
        : `It leaves the library's active list and is not offered for new assignments. ${
            usage > 0 ? `The ${usage === 1 ? "group" : `${usage} groups`} already pinned to it keep working.` : "No group uses it."
          }`}
    </ConfirmButton>
  );
}
