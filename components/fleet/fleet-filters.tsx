import Link from "next/link";
import { inputClass } from "@/components/ui/field";
import { GATEWAY_STATES, STATE_LABELS, type FleetQuery } from "@/schemas/fleet";

type Props = { query: FleetQuery; sites: { slug: string; name: string }[] };

/** Site and state filters of the fleet, as a plain GET form (the URL keeps the view). */
export function FleetFilters({ query, sites }: Readonly<Props>) {
  const filtered = Boolean(query.site || query.state);
  return (
    <form method="get" action="/fleet" role="search" aria-label="Filter gateways" className="mb-4 grid gap-3 rounded-panel border border-panel-line bg-panel p-4 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        Site
        <select name="site" defaultValue={query.site ?? ""} className={inputClass}>
          <option value="">all sites</option>
          {sites.map((s) => (
            <option key={s.slug} value={s.slug}>
              {s.name}
            </option>
          ))}
        </select>
      </label>
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        State
        <select name="state" defaultValue={query.state ?? ""} className={inputClass}>
          <option value="">any state</option>
          {GATEWAY_STATES.map((s) => (
            <option key={s} value={s}>
              {STATE_LABELS[s]}
            </option>
          ))}
        </select>
      </label>
      <div className="flex gap-2">
        <button type="submit" className="min-h-9 rounded-panel bg-weir-600 px-3 text-label font-medium text-white hover:bg-weir-700">
          Filter
        </button>
        {filtered ? (
          <Link href="/fleet" className="min-h-9 rounded-panel border border-panel-line px-3 py-2 text-label">
            Clear
          </Link>
        ) : null}
      </div>
    </form>
  );
}
