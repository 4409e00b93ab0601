"use client";

import { useRouter } from "next/navigation";
import { toast } from "sonner";
import { deleteGatewayAction, deleteSiteAction } from "@/app/(console)/sites/actions";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { showFailure } from "@/components/ui/form-error";

export function DeleteSiteButton({ site, name, gatewayCount }: Readonly<{ site: string; name: string; gatewayCount: number }>) {
  const router = useRouter();
  return (
    <ConfirmButton
      label="Delete site"
      title={`Delete ${name}?`}
      confirmLabel="Delete site"
      onConfirm={async () => {
        const result = await deleteSiteAction({ site });
        if (!result.ok) {
          showFailure(result);
          return false;
        }
        toast.success(`Site ${name} deleted.`);
        router.push("/sites");
        router.refresh();
        return true;
      }}
    >
      This deletes the site and its {gatewayCount} gateway{gatewayCount === 1 ? "" : "s"}. It is refused while releases of the site exist.
      The audit log keeps the history.
    </ConfirmButton>
  );
}

export function DeleteGatewayButton({ site, gateway, name }: Readonly<{ site: string; gateway: string; name: string }>) {
  const router = useRouter();
  return (
    <ConfirmButton
      label="Delete gateway"
      title={`Delete ${name}?`}
      confirmLabel="Delete gateway"
      onConfirm={async () => {
        const result = await deleteGatewayAction({ site, gateway });
        if (!result.ok) {
          showFailure(result);
          return false;
        }
        toast.success(`Gateway ${name} deleted.`);
        router.push(`/sites/${site}`);
        router.refresh();
        return true;
      }}
    >
      The gateway can no longer pull bundles. It is refused while releases include this gateway.
    </ConfirmButton>
  );
}
