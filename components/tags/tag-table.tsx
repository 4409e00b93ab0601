"use client";

import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type ColumnFiltersState, type SortingState } from "@tanstack/react-table";
import { useCallback, useDeferredValue, useMemo, useState } from "react";
import { toast } from "sonner";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import { TAG_KINDS } from "@/schemas/tag";
import { GRID, ROW_WIDTH, TagRows } from "./tag-rows";
import { filteredOrder, sortedOrder } from "./tag-store";
import { useSiteTags, type TagRow } from "./use-site-tags";

export { formatPeriod } from "./tag-rows";

type Props = { site: string; gateways: string[]; canEdit: boolean };

const col = createColumnHelper<TagRow>();
// TanStack Table keeps the columns, headers and sort state; it gets no rows. Sorting and
// filtering run over the columnar store (tag-store.ts), so that 50,000 tags do not become
// 50,000 row objects with their cells and closures. Text sorts up first, numbers down.
const columns = [
  col.display({ id: "select" }),
  col.accessor("name", { header: "Tag", sortDescFirst: false }),
  col.accessor("unit", { header: "Unit", sortDescFirst: false }),
  col.accessor("samplePeriodMs", { header: "Period", sortDescFirst: true }),
  col.accessor("kind", { header: "Kind", sortDescFirst: false }),
  col.accessor((t) => t.euLow, { id: "range", header: "Engineering range", sortDescFirst: true }),
  col.accessor((t) => t.area ?? "", { id: "area", header: "Area", sortDescFirst: false }),
  col.accessor((t) => t.equipment ?? "", { id: "equipment", header: "Equipment", sortDescFirst: false }),
  col.accessor("gateway", { header: "Gateway", sortDescFirst: false }),
  col.display({ id: "actions", header: () => <span className="sr-only">Actions</span> }),
];
const NO_ROWS: TagRow[] = [];
const NONE: ReadonlySet<number> = new Set();

/** The site's tag inventory: sort, filter, search, select, inline edit; virtual rows for large plants. */
export function TagTable({ site, gateways, canEdit }: Readonly<Props>) {
  const { store, total, complete, error, isLoading, mutate } = useSiteTags(site);
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [filters, setFilters] = useState<ColumnFiltersState>([]);
  const [search, setSearch] = useState("");
  const [selection, setSelection] = useState<ReadonlySet<number>>(NONE);
  const [editing, setEditing] = useState<number | null>(null);

  const table = useReactTable({
    data: NO_ROWS,
    columns,
    state: { sorting, columnFilters: filters },
    onSortingChange: setSorting,
    onColumnFiltersChange: setFilters,
    manualSorting: true,
    manualFiltering: true,
    getCoreRowModel: getCoreRowModel(),
  });

  const filterValue = (id: string) => (filters.find((f) => f.id === id)?.value as string | undefined) ?? "";
  const setFilter = (id: string, value: string) => setFilters((fs) => [...fs.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);
  const kind = filterValue("kind");
  const gateway = filterValue("gateway");
  // Typing stays responsive: the search box updates first, the 50,000-row filter after.
  const query = useDeferredValue(search);
  const sorted = useMemo(() => sortedOrder(store, sorting), [store, sorting]);
  const order = useMemo(() => filteredOrder(store, sorted, { kind, gateway, search: query }), [store, sorted, kind, gateway, query]);
  const allShownSelected = useMemo(() => order.length > 0 && order.every((i) => selection.has(store.id[i])), [order, selection, store]);
  const selected = selection.size;

  const startEdit = useCallback((id: number) => setEditing(id), []);
  const toggle = useCallback(
    (id: number) =>
      setSelection((sel) => {
        const next = new Set(sel);
        if (!next.delete(id)) next.add(id);
        return next;
      }),
    [],
  );
  // Adds every tag shown to the selection, or takes them all out of it; hidden tags keep theirs.
  const toggleAllShown = () =>
    setSelection((sel) => {
      const next = new Set(sel);
      for (const i of order) {
        if (allShownSelected) next.delete(store.id[i]);
        else next.add(store.id[i]);
      }
      return next;
    });
  const editDone = useCallback(
    async (saved: boolean) => {
      setEditing(null);
      if (saved) await mutate();
    },
    [mutate],
  );

  async function deleteSelected() {
    try {
      const res = await api<{ deleted: number }>(`/api/sites/${site}/tags`, { method: "DELETE", json: { ids: [...selection] } });
      toast.success(`${res.deleted} tag${res.deleted === 1 ? "" : "s"} deleted.`);
      setSelection(NONE);
      await mutate();
      return true;
    } catch (e) {
      toast.error(`Not deleted: ${e instanceof ApiFailure ? e.message : "the server did not answer"}`);
      return false;
    }
  }

  if (error) return <p role="alert" className="text-fault">The inventory could not be loaded. Reload the page to try again.</p>;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3" role="search">
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          Search
          <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="name, area, equipment, unit" className={`${inputClass} w-64`} />
        </label>
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          Kind
          <select value={filterValue("kind")} onChange={(e) => setFilter("kind", e.target.value)} className={inputClass}>
            <option value="">all kinds</option>
            {TAG_KINDS.map((k) => (
              <option key={k}>{k}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          Gateway
          <select value={filterValue("gateway")} onChange={(e) => setFilter("gateway", e.target.value)} className={inputClass}>
            <option value="">all gateways</option>
            {gateways.map((g) => (
              <option key={g}>{g}</option>
            ))}
          </select>
        </label>
        <p className="ml-auto text-label text-ink-soft" data-testid="tag-count" aria-live="polite">
          {isLoading ? "Loading…" : `${order.length.toLocaleString("en")} of ${total.toLocaleString("en")} tags${complete ? "" : " (loading…)"}`}
          {selected ? ` · ${selected} selected` : ""}
        </p>
        {canEdit && selected > 0 ? (
          <ConfirmButton label={`Delete ${selected} selected`} title="Delete the selected tags?" confirmLabel="Delete tags" onConfirm={deleteSelected}>
            {selected} tag{selected === 1 ? "" : "s"} leave the inventory at once. Gateways keep their current bundle until the next release.
          </ConfirmButton>
        ) : null}
      </div>

      <div role="table" aria-label="Tag inventory" aria-rowcount={order.length + 1} className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
        <div style={{ minWidth: ROW_WIDTH }}>
          <div role="row" className="grid border-b border-panel-line bg-panel-sunk" style={{ gridTemplateColumns: GRID }}>
            {table.getHeaderGroups()[0].headers.map((h) => {
              const sorted = h.column.getIsSorted();
              return (
                <div
                  key={h.id}
                  role="columnheader"
                  aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                  className="px-2 py-2 text-micro font-medium uppercase text-ink-faint"
                >
                  {h.id === "select" ? (
                    canEdit ? (
                      <input type="checkbox" aria-label="Select all shown tags" checked={allShownSelected} onChange={toggleAllShown} />
                    ) : null
                  ) : h.column.getCanSort() ? (
                    <button type="button" onClick={h.column.getToggleSortingHandler()} className="uppercase hover:text-ink">
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      {sorted === "asc" ? " ▲" : sorted === "desc" ? " ▼" : ""}
                    </button>
                  ) : (
                    flexRender(h.column.columnDef.header, h.getContext())
                  )}
                </div>
              );
            })}
          </div>
          <TagRows
            site={site}
            gateways={gateways}
            store={store}
            order={order}
            selection={selection}
            canEdit={canEdit}
            editing={editing}
            onEdit={startEdit}
            onToggle={toggle}
            onEditDone={editDone}
            empty={
              order.length === 0 && !isLoading ? (
                <p className="p-6 text-center text-ink-soft">
                  {total === 0 ? "No tags yet. Import the plant's tag list from a CSV file." : "No tag matches the search and filters."}
                </p>
              ) : null
            }
          />
        </div>
      </div>
    </div>
  );
}
