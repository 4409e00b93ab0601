"use client";

import { useVirtualizer } from "@tanstack/react-virtual";
import { memo, useRef, type CSSProperties, type ReactNode } from "react";
import { TagRowEditor } from "./tag-row-editor";
import { tagAt, tagText, type TagStore } from "./tag-store";

export const ROW_HEIGHT = 36;
// Fixed column widths (rem): cheap to lay out when a whole screen of rows changes per frame.
const WIDTHS = [2.25, 17, 5, 6, 6, 9, 8, 8, 7, 4.5];
export const ROW_WIDTH = `${WIDTHS.reduce((a, b) => a + b, 0)}rem`;
export const GRID = WIDTHS.map((w) => `${w}rem`).join(" ");
const CELL_STYLES: CSSProperties[] = WIDTHS.map((w) => ({ width: `${w}rem`, flex: "none" }));

export function formatPeriod(ms: number) {
  return ms >= 1000 && ms % 1000 === 0 ? `${ms / 1000} s` : `${ms} ms`;
}

// Stable across renders: a new function would make the virtualizer re-measure all rows.
const rowHeight = () => ROW_HEIGHT;

type Props = {
  site: string;
  gateways: string[];
  store: TagStore;
  /** Store positions of the tags shown, in display order. */
  order: Int32Array;
  selection: ReadonlySet<number>;
  canEdit: boolean;
  editing: number | null;
  onEdit: (id: number) => void;
  onToggle: (id: number) => void;
  onEditDone: (saved: boolean) => void;
  empty: ReactNode;
};

/**
 * The scrolling body of the tag table: only the rows in view are in the DOM. It re-renders
 * alone on scroll (the virtualizer's state lives here, not in the table with its toolbar).
 * Its text is shaped without kerning or ligatures (text-rendering: optimizeSpeed): a fast
 * scroll shapes a screen of new names every frame, and tag names gain nothing from either.
 */
export function TagRows({ site, gateways, store, order, selection, canEdit, editing, onEdit, onToggle, onEditDone, empty }: Readonly<Props>) {
  const scroller = useRef<HTMLDivElement>(null);
  const virtual = useVirtualizer({ count: order.length, getScrollElement: () => scroller.current, estimateSize: rowHeight, overscan: 2 });
  const slotOf = useRef(new Map<number, number>());
  const items = virtual.getVirtualItems();
  const slots = assignSlots(items.map((item) => item.index), slotOf.current);
  slotOf.current = slots;
  // Drawn in slot order, not row order: a slot's element stays where it is in the DOM and
  // only its text and offset change, however far the list scrolled since the last frame.
  const bySlot = new Array<number>(items.length);
  for (const [position, slot] of slots) bySlot[slot] = position;
  return (
    <div ref={scroller} data-testid="tag-scroller" className="relative h-[65vh] overflow-y-auto [contain:strict] [overflow-anchor:none] [text-rendering:optimizeSpeed]" tabIndex={0} role="rowgroup" aria-label="Tag rows">
      {empty ? (
        <div role="row">
          <div role="cell">{empty}</div>
        </div>
      ) : null}
      <div style={{ height: virtual.getTotalSize(), position: "relative", contain: "strict" }}>
        {bySlot.map((position, slot) => {
          const i = order[position];
          const id = store.id[i];
          if (editing === id) {
            const style = { position: "absolute" as const, top: 0, left: 0, right: 0, height: ROW_HEIGHT, transform: `translateY(${position * ROW_HEIGHT}px)`, gridTemplateColumns: GRID };
            return <TagRowEditor key={`edit-${id}`} site={site} tag={tagAt(store, i)} gateways={gateways} style={style} onDone={onEditDone} />;
          }
          return (
            <TagRowView
              key={slot}
              store={store}
              index={i}
              position={position}
              canEdit={canEdit}
              onEdit={onEdit}
              onToggle={onToggle}
              selected={selection.has(id)}
            />
          );
        })}
      </div>
    </div>
  );
}

/**
 * Row elements ("slots") for the rows in view: a row still in view keeps its slot, and rows
 * that come into view take the slots of rows that left. Scrolling then never creates or
 * removes row elements (which costs style, layout and garbage collection for a whole
 * screen of rows per frame when scrolling fast); it changes the contents of the slots.
 */
function assignSlots(positions: readonly number[], previous: ReadonlyMap<number, number>): Map<number, number> {
  const slots = new Map<number, number>();
  const taken = new Uint8Array(positions.length);
  for (const p of positions) {
    const slot = previous.get(p);
    if (slot !== undefined && slot < positions.length) {
      slots.set(p, slot);
      taken[slot] = 1;
    }
  }
  let free = 0;
  for (const p of positions) {
    if (slots.has(p)) continue;
    while (taken[free]) free++;
    slots.set(p, free);
    taken[free] = 1;
  }
  return slots;
}

const NAME_CELL = 1;
const RANGE_CELL = 5;
const ROW_BOX: CSSProperties = { position: "absolute", top: 0, left: 0, width: ROW_WIDTH, height: ROW_HEIGHT, contain: "strict" };

type RowProps = {
  store: TagStore;
  /** Position in the store. */
  index: number;
  /** Position on screen (row number in the shown order). */
  position: number;
  canEdit: boolean;
  selected: boolean;
  onEdit: (id: number) => void;
  onToggle: (id: number) => void;
};

/** One visible row, read straight from the columns; memoised, with no per-cell render contexts. */
const TagRowView = memo(function TagRowView({ store, index, position, canEdit, selected, onEdit, onToggle }: Readonly<RowProps>) {
  const id = store.id[index];
  const name = store.name[index];
  const low = store.euLow[index];
  const noRange = Number.isNaN(low);
  // Plain text in every cell but the two controls: a slot that takes another tag then only
  // changes text, with no element to create or remove (the name cell is monospace by class).
  const cells = [
    canEdit ? <input type="checkbox" aria-label={`Select ${name}`} checked={selected} onChange={() => onToggle(id)} /> : null,
    name,
    tagText(store.unit, index),
    formatPeriod(store.samplePeriodMs[index]),
    tagText(store.kind, index),
    noRange ? "—" : `${low} … ${store.euHigh[index]}`,
    tagText(store.area, index) ?? "",
    tagText(store.equipment, index) ?? "",
    tagText(store.gateway, index),
    canEdit ? (
      <button type="button" className="text-weir-600 hover:underline" aria-label={`Edit ${name}`} onClick={() => onEdit(id)}>
        Edit
      </button>
    ) : null,
  ];
  return (
    <div
      role="row"
      aria-rowindex={position + 2}
      className="flex items-center border-b border-panel-line text-label hover:bg-weir-50"
      style={{ ...ROW_BOX, transform: `translateY(${position * ROW_HEIGHT}px)` }}
    >
      {cells.map((content, k) => (
        <div key={k} role="cell" className={k === NAME_CELL ? "truncate px-2 font-mono" : k === RANGE_CELL && noRange ? "truncate px-2 text-ink-faint" : "truncate px-2"} style={CELL_STYLES[k]}>
          {content}
        </div>
      ))}
    </div>
  );
});
