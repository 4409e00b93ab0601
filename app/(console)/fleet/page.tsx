import { FleetFilters } from "@/components/fleet/fleet-filters";
import { GatewayTable } from "@/components/fleet/gateway-table";
import { SiteRollups } from "@/components/fleet/site-rollup";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { FLEET_STATUS_CAUTION } from "@/lib/cautions";
import { MEASURE_WINDOW_MS, fleetStatus } from "@/lib/data/fleet";
import { listSites } from "@/lib/data/sites";
import { STALE_AFTER_POLLS } from "@/lib/fleet/state";
import { HttpError } from "@/lib/http";
import { STATE_LABELS, fleetQuerySchema, type FleetQuery } from "@/schemas/fleet";

export const metadata = { title: "Fleet" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) ?? "";

export default async function FleetPage({ searchParams }: Readonly<Props>) {
  const raw = await searchParams;
  const actor = await currentActor();
  const parsed = fleetQuerySchema.safeParse({ site: first(raw.site), state: first(raw.state) });
  let query: FleetQuery = parsed.success ? parsed.data : {};
  let problem = parsed.success ? null : `${parsed.error.issues[0].path.join(".")}: ${parsed.error.issues[0].message} Showing the whole fleet.`;
  let fleet;
  try {
    fleet = await fleetStatus(actor, query);
  } catch (err) {
    if (!(err instanceof HttpError && err.status === 422)) throw err;
    problem = `${err.message}. Showing the whole fleet.`;
    query = {};
    fleet = await fleetStatus(actor, query);
  }
  const sites = await listSites(actor);
  const total = fleet.sites.reduce((n, s) => n + s.gateways, 0);
  return (
    <>
      <PageHeader
        title="Fleet"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Fleet" }]}
        lead={`What each gateway should run and what it last said it runs. A gateway is stale after ${STALE_AFTER_POLLS} poll intervals without a check-in; the measured ratio sums its counters over the last ${MEASURE_WINDOW_MS / 3_600_000} h for the release it runs.`}
      />
      <div role="note" aria-label={FLEET_STATUS_CAUTION.title} className="mb-4 rounded-panel border border-caution bg-caution-soft p-3 text-label">
        <p className="font-medium">{FLEET_STATUS_CAUTION.title}</p>
        <p className="mt-1">{FLEET_STATUS_CAUTION.text}</p>
      </div>
      <FleetFilters query={query} sites={sites.map((s) => ({ slug: s.slug, name: s.name }))} />
      {problem ? (
        <p role="alert" className="mb-4 rounded-panel border border-fault bg-fault-soft p-3 text-label text-fault">
          {problem}
        </p>
      ) : null}
      {total === 0 ? (
        <EmptyState title="No gateways yet">An administrator adds gateways to a site; each then pulls its bundle with its own token.</EmptyState>
      ) : (
        <>
          <SiteRollups sites={fleet.sites} />
          {fleet.checkedIn === 0 ? (
            <div className="mb-4">
              <EmptyState title="No gateway has checked in yet">
                A gateway appears here as current, behind or failing once it has pulled its bundle with its token and sent its first check-in. Until then it waits for its first check-in, or for a first release of its site.
              </EmptyState>
            </div>
          ) : null}
          {fleet.gateways.length === 0 ? (
            <EmptyState title={query.state ? `No gateway is ${STATE_LABELS[query.state].toLowerCase()} right now` : "No gateways match"}>Choose another state or site.</EmptyState>
          ) : (
            <>
              <p className="mb-2 text-label text-ink-faint" data-testid="gateway-count">
                {fleet.gateways.length} {fleet.gateways.length === 1 ? "gateway" : "gateways"}
              </p>
              <GatewayTable gateways={fleet.gateways} now={fleet.now} showSite={!query.site} />
            </>
          )}
        </>
      )}
    </>
  );
}
