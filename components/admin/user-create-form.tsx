"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { createUserAction } from "@/app/(console)/admin/users/actions";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { showFailure } from "@/components/ui/form-error";
import { SecretReveal } from "@/components/ui/secret-reveal";
import { ROLES } from "@/lib/permissions";
import { createUserSchema, type CreateUserInput } from "@/schemas/user";

export function UserCreateForm() {
  const [issued, setIssued] = useState<{ email: string; password: string } | null>(null);
  const { register, handleSubmit, reset, setError, formState } = useForm<CreateUserInput>({
    resolver: zodResolver(createUserSchema),
    defaultValues: { email: "", name: "", role: "viewer" },
  });
  const onSubmit = handleSubmit(async (values) => {
    const result = await createUserAction(values);
    if (!result.ok) return showFailure(result, setError, ["email", "name", "role"]);
    toast.success(`Account for ${result.data.user.email} created.`);
    setIssued({ email: result.data.user.email, password: result.data.password });
    reset();
  });
  return (
    <section aria-labelledby="new-user" className="rounded-panel border border-panel-line bg-panel p-4">
      <h2 id="new-user" className="mb-3">
        New account
      </h2>
      {issued ? (
        <div className="mb-4">
          <SecretReveal label={`Initial password for ${issued.email}`} secret={issued.password} onDone={() => setIssued(null)} />
        </div>
      ) : null}
      <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-[1fr_1fr_10rem_auto] sm:items-end">
        <Field label="Name" htmlFor="new-name" error={formState.errors.name?.message}>
          <input id="new-name" className={inputClass} aria-invalid={!!formState.errors.name} {...register("name")} />
        </Field>
        <Field label="E-mail" htmlFor="new-email" error={formState.errors.email?.message}>
          <input id="new-email" type="email" className={inputClass} aria-invalid={!!formState.errors.email} {...register("email")} />
        </Field>
        <Field label="Role" htmlFor="new-role" error={formState.errors.role?.message}>
          <select id="new-role" className={inputClass} {...register("role")}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </select>
        </Field>
        <Button type="submit" disabled={formState.isSubmitting}>
          Create account
        </Button>
      </form>
    </section>
  );
}
