import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { getSite, listGateways } from "@/lib/data/sites";
import { HttpError } from "@/lib/http";

type Props = { params: Promise<{ site: string }> };

export default async function SitePage({ params }: Readonly<Props>) {
  const { site: slug } = await params;
  const actor = await currentActor();
  const site = await getSite(actor, slug).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const gateways = await listGateways(actor, slug);
  return (
    <>
      <PageHeader
        title={site.name}
        crumbs={[{ href: "/", label: "Overview" }, { href: "/sites", label: "Sites" }, { label: site.name }]}
      />
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
          <EmptyState title="No gateways at this site">An administrator registers the site's edge gateways.</EmptyState>
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
                    <td className="font-medium">{g.name}</td>
                    <td className="font-mono text-label">{g.slug}</td>
                    <td>{g.pollSeconds} s</td>
                    <td className="text-ink-soft">{g.description}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </>
  );
}
