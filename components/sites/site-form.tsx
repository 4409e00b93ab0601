"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { createSiteAction, updateSiteAction } from "@/app/(console)/sites/actions";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { showFailure } from "@/components/ui/form-error";
import { siteSchema, type SiteInput, type SiteValues } from "@/schemas/site";

type Props = { timeZones: string[]; existing?: SiteValues };

const FIELDS = [
  "name",
  "slug",
  "timeZone",
  "uplinkBudgetKbps",
  "storagePricePerGbMonth",
  "retentionMonths",
  "defaultHandling",
  "bytesPerSample",
  "transportOverheadPct",
  "uplinkHeadroomPct",
];

/** Create a site, or edit one when `existing` is given. */
export function SiteForm({ timeZones, existing }: Readonly<Props>) {
  const router = useRouter();
  const { register, handleSubmit, setError, formState } = useForm<SiteInput, unknown, SiteValues>({
    resolver: zodResolver(siteSchema),
    defaultValues: existing ?? {
      name: "",
      slug: "",
      timeZone: "Europe/London",
      uplinkBudgetKbps: 256,
      storagePricePerGbMonth: 0.023,
      retentionMonths: 24,
      defaultHandling: "pass-through",
      bytesPerSample: 16,
      transportOverheadPct: 10,
      uplinkHeadroomPct: 20,
    },
  });
  const e = formState.errors;
  const onSubmit = handleSubmit(async (values) => {
    const result = existing ? await updateSiteAction({ site: existing.slug, values }) : await createSiteAction(values);
    if (!result.ok) return showFailure(result, setError, FIELDS);
    toast.success(existing ? `Site ${result.data.name} saved.` : `Site ${result.data.name} created.`);
    router.push(`/sites/${result.data.slug}`);
    router.refresh();
  });
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-3xl gap-4 sm:grid-cols-2">
      <Field label="Name" htmlFor="site-name" error={e.name?.message}>
        <input id="site-name" className={inputClass} aria-invalid={!!e.name} {...register("name")} />
      </Field>
      <Field label="Slug" htmlFor="site-slug" error={e.slug?.message} hint="Used in URLs and bundles, e.g. fenwick-creamery.">
        <input id="site-slug" className={`${inputClass} font-mono`} aria-invalid={!!e.slug} {...register("slug")} />
      </Field>
      <Field label="Time zone" htmlFor="site-tz" error={e.timeZone?.message} hint="Local calendar for daily and longer windows.">
        <select id="site-tz" className={inputClass} aria-invalid={!!e.timeZone} {...register("timeZone")}>
          {timeZones.map((tz) => (
            <option key={tz} value={tz}>
              {tz}
            </option>
          ))}
        </select>
      </Field>
      <Field label="Uplink budget (kbit/s)" htmlFor="site-uplink" error={e.uplinkBudgetKbps?.message}>
        <input id="site-uplink" type="number" step="any" className={inputClass} aria-invalid={!!e.uplinkBudgetKbps} {...register("uplinkBudgetKbps")} />
      </Field>
      <Field label="Storage price (per GB-month)" htmlFor="site-price" error={e.storagePricePerGbMonth?.message} hint="Used for cost estimates only.">
        <input
          id="site-price"
          type="number"
          step="any"
          className={inputClass}
          aria-invalid={!!e.storagePricePerGbMonth}
          {...register("storagePricePerGbMonth")}
        />
      </Field>
      <Field label="Retention (months)" htmlFor="site-retention" error={e.retentionMonths?.message}>
        <input id="site-retention" type="number" step="1" className={inputClass} aria-invalid={!!e.retentionMonths} {...register("retentionMonths")} />
      </Field>
      <Field label="Bytes per sample" htmlFor="site-bytes" error={e.bytesPerSample?.message} hint="Plain byte model for estimates: timestamp, value and framing.">
        <input id="site-bytes" type="number" step="1" className={inputClass} aria-invalid={!!e.bytesPerSample} {...register("bytesPerSample")} />
      </Field>
      <Field label="Transport overhead (%)" htmlFor="site-overhead" error={e.transportOverheadPct?.message} hint="Added to the plain byte model (protocol headers, retries).">
        <input id="site-overhead" type="number" step="any" className={inputClass} aria-invalid={!!e.transportOverheadPct} {...register("transportOverheadPct")} />
      </Field>
      <Field label="Uplink headroom (%)" htmlFor="site-headroom" error={e.uplinkHeadroomPct?.message} hint="Share of the uplink budget kept free for catch-up and other traffic.">
        <input id="site-headroom" type="number" step="any" className={inputClass} aria-invalid={!!e.uplinkHeadroomPct} {...register("uplinkHeadroomPct")} />
      </Field>
      <Field label="Tags in no group" htmlFor="site-default" error={e.defaultHandling?.message} hint="What gateways do with tags no group selects.">
        <select id="site-default" className={inputClass} {...register("defaultHandling")}>
          <option value="pass-through">pass through unreduced</option>
          <option value="drop">drop (not sent)</option>
        </select>
      </Field>
      <div className="sm:col-span-2">
        <Button type="submit" disabled={formState.isSubmitting}>
          {existing ? "Save site" : "Create site"}
        </Button>
      </div>
    </form>
  );
}
