import Link from "next/link";
import { GatewayForm } from "@/components/sites/gateway-form";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { getSite, listGateways } from "@/lib/data/sites";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string }> };

export default async function SitePage({ params }: Readonly<Props>) {
  const { site: slug } = await params;
  const actor = await currentActor();
  const site = await orNotFound(getSite(actor, slug));
  const gateways = await listGateways(actor, slug);
  const admin = !!actor && can(actor.role, "fleet.admin");
  return (
    <>
      {admin ? (
        <div className="mb-4 flex justify-end">
          <Link href={`/sites/${site.slug}/settings`} className="rounded-panel border border-panel-line bg-panel px-3 py-1.5 text-label font-medium hover:bg-panel-sunk">
            Edit site settings
          </Link>
        </div>
      ) : null}
      <section aria-labelledby="site-settings" className="mb-8 rounded-panel border border-panel-line bg-panel p-4">
        <h2 id="site-settings" className="mb-3">
          Site settings
        </h2>
        <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-label sm:grid-cols-4">
          <dt className="text-ink-faint">Time zone</dt>
          <dd>{site.timeZone}</dd>
          <dt className="text-ink-faint">Uplink budget</dt>
          <dd>{site.uplinkBudgetKbps.toLocaleString("en")} kbit/s</dd>
          <dt className="text-ink-faint">Storage price</dt>
          <dd>{site.storagePricePerGbMonth.toFixed(4)} per GB-month</dd>
          <dt className="text-ink-faint">Retention</dt>
          <dd>{site.retentionMonths} months</dd>
          <dt className="text-ink-faint">Tags in no group</dt>
          <dd>{site.defaultHandling}</dd>
        </dl>
      </section>
      <section aria-labelledby="site-gateways">
        <h2 id="site-gateways" className="mb-3">
          Gateways
        </h2>
        {gateways.length === 0 ? (
          <EmptyState title="No gateways at this site">
            {admin ? "Add the site's first edge gateway with the form below." : "An administrator registers the site's edge gateways."}
          </EmptyState>
        ) : (
          <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
            <table>
              <thead>
                <tr>
                  <th scope="col">Gateway</th>
                  <th scope="col">Slug</th>
                  <th scope="col">Pulls every</th>
                  <th scope="col">Description</th>
                </tr>
              </thead>
              <tbody>
                {gateways.map((g) => (
                  <tr key={g.id}>
                    <td>
                      <Link href={`/sites/${site.slug}/gateways/${g.slug}`} className="font-medium text-weir-700 hover:underline">
                        {g.name}
                      </Link>
                    </td>
                    <td className="font-mono text-label">{g.slug}</td>
                    <td>{g.pollSeconds} s</td>
                    <td className="text-ink-soft">{g.description}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {admin ? (
          <div className="mt-4 rounded-panel border border-panel-line bg-panel p-4">
            <h3 className="mb-3 text-lead font-medium">Add a gateway</h3>
            <GatewayForm site={site.slug} />
          </div>
        ) : null}
      </section>
    </>
  );
}
