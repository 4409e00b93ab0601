"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { createGatewayAction, updateGatewayAction } from "@/app/(console)/sites/actions";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { showFailure } from "@/components/ui/form-error";
import { gatewaySchema, type GatewayInput, type GatewayValues } from "@/schemas/site";

type Props = { site: string; existing?: GatewayValues };

const FIELDS = ["name", "slug", "description", "pollSeconds"];

/** Register a gateway at a site, or edit one when `existing` is given. */
export function GatewayForm({ site, existing }: Readonly<Props>) {
  const router = useRouter();
  const { register, handleSubmit, setError, reset, formState } = useForm<GatewayInput, unknown, GatewayValues>({
    resolver: zodResolver(gatewaySchema),
    defaultValues: existing ?? { name: "", slug: "", description: "", pollSeconds: 60 },
  });
  const e = formState.errors;
  const onSubmit = handleSubmit(async (values) => {
    const result = existing
      ? await updateGatewayAction({ site, gateway: existing.slug, values })
      : await createGatewayAction({ site, values });
    if (!result.ok) return showFailure(result, setError, FIELDS);
    toast.success(existing ? `Gateway ${result.data.name} saved.` : `Gateway ${result.data.name} added.`);
    if (existing) router.push(`/sites/${site}/gateways/${result.data.slug}`);
    else reset();
    router.refresh();
  });
  const id = existing ? "edit-gw" : "new-gw";
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4 lg:items-start">
      <Field label="Gateway name" htmlFor={`${id}-name`} error={e.name?.message}>
        <input id={`${id}-name`} className={inputClass} aria-invalid={!!e.name} {...register("name")} />
      </Field>
      <Field label="Gateway slug" htmlFor={`${id}-slug`} error={e.slug?.message} hint="Unique in the fleet, e.g. fw-gw-03.">
        <input id={`${id}-slug`} className={`${inputClass} font-mono`} aria-invalid={!!e.slug} {...register("slug")} />
      </Field>
      <Field label="Poll interval (s)" htmlFor={`${id}-poll`} error={e.pollSeconds?.message} hint="Seconds between bundle pulls.">
        <input id={`${id}-poll`} type="number" step="1" className={inputClass} aria-invalid={!!e.pollSeconds} {...register("pollSeconds")} />
      </Field>
      <Field label="Description" htmlFor={`${id}-desc`} error={e.description?.message}>
        <input id={`${id}-desc`} className={inputClass} aria-invalid={!!e.description} {...register("description")} />
      </Field>
      <div className="sm:col-span-2 lg:col-span-4">
        <Button type="submit" disabled={formState.isSubmitting}>
          {existing ? "Save gateway" : "Add gateway"}
        </Button>
      </div>
    </form>
  );
}
