import Link from "next/link";
import type { SiteRollup } from "@/lib/data/fleet";
import { GATEWAY_STATES, STATE_LABELS } from "@/schemas/fleet";

const fleetHref = (site: string, state?: string) => `/fleet?site=${encodeURIComponent(site)}${state ? `&state=${state}` : ""}`;

/** Per site: how many gateways are in each state, each count a link to those gateways. */
export function SiteRollups({ sites }: Readonly<{ sites: SiteRollup[] }>) {
  return (
    <ul className="mb-6 grid gap-3 sm:grid-cols-2 lg:grid-cols-3" aria-label="Gateways per site">
      {sites.map((s) => (
        <li key={s.slug} className="rounded-panel border border-panel-line bg-panel p-3" data-testid={`rollup-${s.slug}`}>
          <div className="flex items-baseline justify-between gap-2">
            <Link href={fleetHref(s.slug)} className="font-medium text-weir-700 hover:underline">
              {s.name}
            </Link>
            <span className="text-label text-ink-faint">
              {s.gateways} {s.gateways === 1 ? "gateway" : "gateways"}
            </span>
          </div>
          {s.alerts > 0 ? (
            <p className="mt-1 text-label font-medium text-fault">{s.alerts} stale or failing</p>
          ) : (
            <p className="mt-1 text-label text-ink-faint">{s.gateways === 0 ? "No gateways" : "None stale or failing"}</p>
          )}
          <ul className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-label" aria-label={`States at ${s.name}`}>
            {GATEWAY_STATES.filter((state) => s.counts[state] > 0).map((state) => (
              <li key={state}>
                <Link href={fleetHref(s.slug, state)} className="hover:underline">
                  {STATE_LABELS[state]}: <span className="tabular-nums font-medium">{s.counts[state]}</span>
                </Link>
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ul>
  );
}
