"use client";

import {
  type Row,
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type RowSelectionState,
  type SortingState,
} from "@tanstack/react-table";
import { useVirtualizer } from "@tanstack/react-virtual";
import { memo, useCallback, useMemo, useRef, useState } from "react";
import { toast } from "sonner";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import { TAG_KINDS } from "@/schemas/tag";
import { TagRowEditor } from "./tag-row-editor";
import { useSiteTags, type TagRow } from "./use-site-tags";

type Props = { site: string; gateways: string[]; canEdit: boolean };

const ROW_HEIGHT = 36;
// More slots than rows ever on screen (viewport plus overscan), so no two visible rows share a key.
const SLOTS = 128;
// Fixed column widths (rem): cheap to lay out when a whole screen of rows changes per frame.
const WIDTHS = [2.25, 17, 5, 6, 6, 9, 8, 8, 7, 4.5];
const ROW_WIDTH = `${WIDTHS.reduce((a, b) => a + b, 0)}rem`;
const GRID = WIDTHS.map((w) => `${w}rem`).join(" ");
const col = createColumnHelper<TagRow>();

export function formatPeriod(ms: number) {
  return ms >= 1000 && ms % 1000 === 0 ? `${ms / 1000} s` : `${ms} ms`;
}

// Stable across renders: a new function would make the virtualizer re-measure all rows.
const rowHeight = () => ROW_HEIGHT;

const includes = (v: unknown, q: string) => typeof v === "string" && v.toLowerCase().includes(q);

/** The site's tag inventory: sort, filter, search, select, inline edit; virtual rows for large plants. */
export function TagTable({ site, gateways, canEdit }: Readonly<Props>) {
  const { tags, total, complete, error, isLoading, mutate } = useSiteTags(site);
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [filters, setFilters] = useState<ColumnFiltersState>([]);
  const [search, setSearch] = useState("");
  const [selection, setSelection] = useState<RowSelectionState>({});
  const [editing, setEditing] = useState<number | null>(null);

  const columns = useMemo(
    () => [
      col.display({
        id: "select",
        header: ({ table }) =>
          canEdit ? (
            <input
              type="checkbox"
              aria-label="Select all shown tags"
              checked={table.getIsAllRowsSelected()}
              onChange={table.getToggleAllRowsSelectedHandler()}
            />
          ) : null,
        cell: ({ row }) =>
          canEdit ? (
            <input type="checkbox" aria-label={`Select ${row.original.name}`} checked={row.getIsSelected()} onChange={row.getToggleSelectedHandler()} />
          ) : null,
      }),
      col.accessor("name", { header: "Tag", cell: (c) => <span className="truncate font-mono">{c.getValue()}</span> }),
      col.accessor("unit", { header: "Unit" }),
      col.accessor("samplePeriodMs", { header: "Period", cell: (c) => formatPeriod(c.getValue()) }),
      col.accessor("kind", { header: "Kind", filterFn: "equals" }),
      col.accessor((t) => (t.euLow === null ? null : t.euLow), {
        id: "range",
        header: "Engineering range",
        cell: (c) => (c.row.original.euLow === null ? <span className="text-ink-faint">—</span> : `${c.row.original.euLow} … ${c.row.original.euHigh}`),
        sortUndefined: "last",
      }),
      col.accessor((t) => t.area ?? "", { id: "area", header: "Area" }),
      col.accessor((t) => t.equipment ?? "", { id: "equipment", header: "Equipment" }),
      col.accessor("gateway", { header: "Gateway", filterFn: "equals" }),
      col.display({ id: "actions", header: () => <span className="sr-only">Actions</span> }),
    ],
    [canEdit],
  );

  const table = useReactTable({
    data: tags,
    columns,
    state: { sorting, columnFilters: filters, globalFilter: search, rowSelection: selection },
    getRowId: (t) => String(t.id),
    onSortingChange: setSorting,
    onColumnFiltersChange: setFilters,
    onGlobalFilterChange: setSearch,
    onRowSelectionChange: setSelection,
    enableRowSelection: canEdit,
    globalFilterFn: (row, _id, value: string) => {
      const q = value.trim().toLowerCase();
      if (!q) return true;
      const t = row.original;
      return includes(t.name, q) || includes(t.area, q) || includes(t.equipment, q) || includes(t.unit, q);
    },
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  const rows = table.getRowModel().rows;
  const scroller = useRef<HTMLDivElement>(null);
  const virtual = useVirtualizer({ count: rows.length, getScrollElement: () => scroller.current, estimateSize: rowHeight, overscan: 6 });
  const selectedIds = Object.keys(selection).filter((k) => selection[k]).map(Number);
  const filterValue = (id: string) => (filters.find((f) => f.id === id)?.value as string | undefined) ?? "";
  const setFilter = (id: string, value: string) => setFilters((fs) => [...fs.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);

  const startEdit = useCallback((id: number) => setEditing(id), []);

  async function deleteSelected() {
    try {
      const res = await api<{ deleted: number }>(`/api/sites/${site}/tags`, { method: "DELETE", json: { ids: selectedIds } });
      toast.success(`${res.deleted} tag${res.deleted === 1 ? "" : "s"} deleted.`);
      setSelection({});
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
          {isLoading ? "Loading…" : `${rows.length.toLocaleString("en")} of ${total.toLocaleString("en")} tags${complete ? "" : " (loading…)"}`}
          {selectedIds.length ? ` · ${selectedIds.length} selected` : ""}
        </p>
        {canEdit && selectedIds.length > 0 ? (
          <ConfirmButton label={`Delete ${selectedIds.length} selected`} title="Delete the selected tags?" confirmLabel="Delete tags" onConfirm={deleteSelected}>
            {selectedIds.length} tag{selectedIds.length === 1 ? "" : "s"} leave the inventory at once. Gateways keep their current bundle until the next release.
          </ConfirmButton>
        ) : null}
      </div>

      <div role="table" aria-label="Tag inventory" aria-rowcount={rows.length + 1} className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
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
                  {h.column.getCanSort() ? (
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
          <div ref={scroller} data-testid="tag-scroller" className="relative h-[65vh] overflow-y-auto" tabIndex={0} aria-label="Tag rows">
            {rows.length === 0 && !isLoading ? (
              <p className="p-6 text-center text-ink-soft">
                {total === 0 ? "No tags yet. Import the plant's tag list from a CSV file." : "No tag matches the search and filters."}
              </p>
            ) : null}
            <div style={{ height: virtual.getTotalSize(), position: "relative" }}>
              {virtual.getVirtualItems().map((item) => {
                const row = rows[item.index];
                const t = row.original;
                const style = { position: "absolute" as const, top: 0, left: 0, right: 0, height: ROW_HEIGHT, transform: `translateY(${item.start}px)`, gridTemplateColumns: GRID };
                if (editing === t.id) {
                  return (
                    <TagRowEditor
                      key={t.id}
                      site={site}
                      tag={t}
                      gateways={gateways}
                      style={style}
                      onDone={async (saved) => {
                        setEditing(null);
                        if (saved) await mutate();
                      }}
                    />
                  );
                }
                // Keyed by slot, not by tag: scrolling reuses the same row elements and only
                // changes their text, instead of creating a screenful of new elements per frame.
                return <TagRowView key={`slot-${item.index % SLOTS}`} row={row} index={item.index} start={item.start} canEdit={canEdit} onEdit={startEdit} selected={row.getIsSelected()} />;
              })}
            </div>
          </div>
        </div>
      </div>
    </div>
  );
}

type RowProps = { row: Row<TagRow>; index: number; start: number; canEdit: boolean; selected: boolean; onEdit: (id: number) => void };

/** One visible row; memoised, and drawn without per-cell render contexts, so that scrolling allocates little. */
const TagRowView = memo(function TagRowView({ row, index, start, canEdit, selected, onEdit }: Readonly<RowProps>) {
  const t = row.original;
  const style = { position: "absolute" as const, top: 0, left: 0, width: ROW_WIDTH, height: ROW_HEIGHT, transform: `translateY(${start}px)`, contain: "strict" as const };
  const cells = [
    canEdit ? <input type="checkbox" aria-label={`Select ${t.name}`} checked={selected} onChange={() => row.toggleSelected()} /> : null,
    <span className="font-mono">{t.name}</span>,
    t.unit,
    formatPeriod(t.samplePeriodMs),
    t.kind,
    t.euLow === null ? <span className="text-ink-faint">—</span> : `${t.euLow} … ${t.euHigh}`,
    t.area ?? "",
    t.equipment ?? "",
    t.gateway,
    canEdit ? (
      <button type="button" className="text-weir-600 hover:underline" aria-label={`Edit ${t.name}`} onClick={() => onEdit(t.id)}>
        Edit
      </button>
    ) : null,
  ];
  return (
    <div role="row" aria-rowindex={index + 2} className="flex items-center border-b border-panel-line text-label hover:bg-weir-50" style={style}>
      {cells.map((content, i) => (
        <div key={i} role="cell" className="truncate px-2" style={{ width: `${WIDTHS[i]}rem`, flex: "none" }}>
          {content}
        </div>
      ))}
    </div>
  );
});
