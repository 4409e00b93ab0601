import { Forbidden } from "@/components/shell/forbidden";
import { DeleteSiteButton } from "@/components/sites/delete-controls";
import { SiteForm } from "@/components/sites/site-form";
import { currentActor } from "@/lib/auth/guard";
import { getSite } from "@/lib/data/sites";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";
import { timeZones, type SiteValues } from "@/schemas/site";

type Props = { params: Promise<{ site: string }> };

export default async function SiteSettingsPage({ params }: Readonly<Props>) {
  const { site: slug } = await params;
  const actor = await currentActor();
  if (!actor || !can(actor.role, "fleet.admin")) return <Forbidden what="site settings" level={2} />;
  const site = await orNotFound(getSite(actor, slug));
  const existing: SiteValues = {
    name: site.name,
    slug: site.slug,
    timeZone: site.timeZone,
    uplinkBudgetKbps: site.uplinkBudgetKbps,
    storagePricePerGbMonth: site.storagePricePerGbMonth,
    retentionMonths: site.retentionMonths,
    defaultHandling: site.defaultHandling === "drop" ? "drop" : "pass-through",
    bytesPerSample: site.bytesPerSample,
    transportOverheadPct: site.transportOverheadPct,
    uplinkHeadroomPct: site.uplinkHeadroomPct,
  };
  return (
    <>
      <h2 className="mb-4">Site settings</h2>
      <SiteForm timeZones={timeZones()} existing={existing} />
      <section aria-labelledby="danger" className="mt-10 max-w-3xl rounded-panel border border-fault/40 bg-panel p-4">
        <h2 id="danger" className="text-lead font-medium text-fault">
          Delete this site
        </h2>
        <p className="my-2 text-ink-soft">Deleting removes the site and its gateways from the registry.</p>
        <DeleteSiteButton site={site.slug} name={site.name} gatewayCount={site.gatewayCount} />
      </section>
    </>
  );
}
