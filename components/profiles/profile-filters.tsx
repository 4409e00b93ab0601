import Link from "next/link";
import { inputClass } from "@/components/ui/field";
import { TAG_KINDS } from "@/lib/reduction/profile-names";

export type LibraryQuery = { q: string; status: "active" | "archived" | "all"; kind: string };

/** Search and filters of the profile library, as a plain GET form (the URL keeps the view). */
export function ProfileFilters({ query }: Readonly<{ query: LibraryQuery }>) {
  const filtered = query.q !== "" || query.status !== "active" || query.kind !== "";
  return (
    <form method="get" action="/profiles" role="search" aria-label="Find profiles" className="mb-4 grid gap-3 rounded-panel border border-panel-line bg-panel p-4 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end">
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        Search
        <input type="search" name="q" defaultValue={query.q} placeholder="Name or description" className={inputClass} />
      </label>
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        Status
        <select name="status" defaultValue={query.status} className={inputClass}>
          <option value="active">active</option>
          <option value="archived">archived</option>
          <option value="all">all</option>
        </select>
      </label>
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        Kind
        <select name="kind" defaultValue={query.kind} className={inputClass}>
          <option value="">any kind</option>
          {TAG_KINDS.map((k) => (
            <option key={k} value={k}>
              {k}
            </option>
          ))}
        </select>
      </label>
      <div className="flex gap-2">
        <button type="submit" className="min-h-9 rounded-panel bg-weir-600 px-3 text-label font-medium text-white hover:bg-weir-700">
          Filter
        </button>
        {filtered ? (
          <Link href="/profiles" className="min-h-9 rounded-panel border border-panel-line px-3 py-2 text-label">
            Clear
          </Link>
        ) : null}
      </div>
    </form>
  );
}
