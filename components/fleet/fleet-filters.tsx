import { FilterForm, FilterSelect } from "@/components/ui/filter-form";
import { GATEWAY_STATES, STATE_LABELS, type FleetQuery } from "@/schemas/fleet";

type Props = { query: FleetQuery; sites: { slug: string; name: string }[] };

/** Site and state filters of the fleet, as a plain GET form (the URL keeps the view). */
export function FleetFilters({ query, sites }: Readonly<Props>) {
  return (
    <FilterForm action="/fleet" label="Filter gateways" columns="sm:grid-cols-[1fr_1fr_auto]" filtered={Boolean(query.site || query.state)}>
      <FilterSelect label="Site" name="site" value={query.site} anyLabel="all sites" options={sites.map((s) => ({ value: s.slug, label: s.name }))} />
      <FilterSelect label="State" name="state" value={query.state} anyLabel="any state" options={GATEWAY_STATES.map((s) => ({ value: s, label: STATE_LABELS[s] }))} />
    </FilterForm>
  );
}
