"use client";

import { useState } from "react";
import { toast } from "sonner";
import { resetPasswordAction, updateUserAction } from "@/app/(console)/admin/users/actions";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { inputClass } from "@/components/ui/field";
import { showFailure } from "@/components/ui/form-error";
import { SecretReveal } from "@/components/ui/secret-reveal";
import { ROLES, type Role } from "@/lib/permissions";

type Props = { user: { id: number; email: string; name: string; role: Role; active: boolean } };

/** Role, active flag and password reset for one account. */
export function UserRowControls({ user }: Readonly<Props>) {
  const [role, setRole] = useState<Role>(user.role);
  const [password, setPassword] = useState<string | null>(null);

  async function save(patch: { role?: Role; active?: boolean }, done: string) {
    const result = await updateUserAction({ id: user.id, patch });
    if (!result.ok) {
      showFailure(result);
      setRole(user.role);
      return false;
    }
    toast.success(done);
    return true;
  }

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <label className="sr-only" htmlFor={`role-${user.id}`}>
          Role of {user.email}
        </label>
        <select id={`role-${user.id}`} className={inputClass} value={role} onChange={(e) => setRole(e.target.value as Role)}>
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </select>
        <Button tone="quiet" disabled={role === user.role} onClick={() => save({ role }, `${user.email} is now ${role}.`)}>
          Save role
        </Button>
        {user.active ? (
          <ConfirmButton
            label="Deactivate"
            title={`Deactivate ${user.email}?`}
            confirmLabel="Deactivate"
            onConfirm={() => save({ active: false }, `${user.email} deactivated.`)}
          >
            They are signed out on their next request and cannot sign in until reactivated. Their history stays in the audit log.
          </ConfirmButton>
        ) : (
          <Button tone="quiet" onClick={() => save({ active: true }, `${user.email} reactivated.`)}>
            Reactivate
          </Button>
        )}
        <ConfirmButton
          label="Reset password"
          title={`Reset the password of ${user.email}?`}
          confirmLabel="Reset password"
          tone="primary"
          onConfirm={async () => {
            const result = await resetPasswordAction({ id: user.id });
            if (!result.ok) {
              showFailure(result);
              return false;
            }
            setPassword(result.data.password);
            toast.success(`New password issued for ${user.email}.`);
            return true;
          }}
        >
          The old password stops working at once. The new one is shown a single time.
        </ConfirmButton>
      </div>
      {password ? <SecretReveal label={`New password for ${user.email}`} secret={password} onDone={() => setPassword(null)} /> : null}
    </div>
  );
}
