import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { listSites } from "@/lib/data/sites";
import { can } from "@/lib/permissions";

export const metadata = { title: "Sites" };

export default async function SitesPage() {
  const actor = await currentActor();
  const sites = await listSites(actor);
  const admin = !!actor && can(actor.role, "fleet.admin");
  return (
    <>
      <PageHeader
        title="Sites"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Sites" }]}
        actions={
          admin ? (
            <Link href="/sites/new" className="rounded-panel bg-weir-600 px-3 py-1.5 text-label font-medium text-white hover:bg-weir-700">
              New site
            </Link>
          ) : null
        }
      />
      {sites.length === 0 ? (
        <EmptyState title="No sites yet">{admin ? "Use New site to add the first plant." : "An administrator adds the first site."}</EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
          <table aria-label="Sites">
            <thead>
              <tr>
                <th scope="col">Site</th>
                <th scope="col">Slug</th>
                <th scope="col">Time zone</th>
                <th scope="col">Uplink budget</th>
                <th scope="col">Storage price</th>
                <th scope="col">Retention</th>
                <th scope="col">Tags in no group</th>
                <th scope="col">Gateways</th>
              </tr>
            </thead>
            <tbody>
              {sites.map((s) => (
                <tr key={s.id}>
                  <td>
                    <Link href={`/sites/${s.slug}`} className="font-medium text-weir-700 hover:underline">
                      {s.name}
                    </Link>
                  </td>
                  <td className="font-mono text-label">{s.slug}</td>
                  <td>{s.timeZone}</td>
                  <td>{s.uplinkBudgetKbps.toLocaleString("en")} kbit/s</td>
                  <td>{s.storagePricePerGbMonth.toFixed(4)} per GB-month</td>
                  <td>{s.retentionMonths} months</td>
                  <td>{s.defaultHandling}</td>
                  <td>{s.gatewayCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
