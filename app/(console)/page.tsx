import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { listSites } from "@/lib/data/sites";
import { can } from "@/lib/permissions";

export default async function OverviewPage() {
  const actor = await currentActor();
  const sites = await listSites(actor);
  return (
    <>
      <PageHeader
        title="Overview"
        lead="Each site reduces its tags at the edge before they leave the plant. Pick a site to see its gateways and configuration."
      />
      {sites.length === 0 ? (
        <EmptyState title="No sites yet">
          {actor && can(actor.role, "fleet.admin") ? (
            <Link href="/sites" className="text-weir-600 underline">
              Add the first site
            </Link>
          ) : (
            "An administrator adds sites and their gateways."
          )}
        </EmptyState>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" aria-label="Sites">
          {sites.map((s) => (
            <li key={s.id} className="rounded-panel border border-panel-line bg-panel p-4">
              <Link href={`/sites/${s.slug}`} className="text-lead font-medium text-weir-700 hover:underline">
                {s.name}
              </Link>
              <dl className="mt-2 grid grid-cols-2 gap-x-3 gap-y-1 text-label">
                <dt className="text-ink-faint">Gateways</dt>
                <dd>{s.gatewayCount}</dd>
                <dt className="text-ink-faint">Uplink budget</dt>
                <dd>{s.uplinkBudgetKbps.toLocaleString("en")} kbit/s</dd>
                <dt className="text-ink-faint">Time zone</dt>
                <dd>{s.timeZone}</dd>
              </dl>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
