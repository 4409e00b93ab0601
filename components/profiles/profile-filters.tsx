import { FilterForm, FilterInput, FilterSelect } from "@/components/ui/filter-form";
import { TAG_KINDS } from "@/lib/reduction/profile-names";

export type LibraryQuery = { q: string; status: "active" | "archived" | "all"; kind: string };

/** Search and filters of the profile library, as a plain GET form (the URL keeps the view). */
export function ProfileFilters({ query }: Readonly<{ query: LibraryQuery }>) {
  const filtered = query.q !== "" || query.status !== "active" || query.kind !== "";
  return (
    <FilterForm action="/profiles" label="Find profiles" columns="sm:grid-cols-[2fr_1fr_1fr_auto]" filtered={filtered}>
      <FilterInput label="Search" name="q" type="search" value={query.q} placeholder="Name or description" />
      <FilterSelect label="Status" name="status" value={query.status} options={["active", "archived", "all"]} />
      <FilterSelect label="Kind" name="kind" value={query.kind} anyLabel="any kind" options={TAG_KINDS} />
    </FilterForm>
  );
}
