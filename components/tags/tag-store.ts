import type { TagKind, TagValues } from "@/schemas/tag";

export type TagRow = TagValues & { id: number };

/** A column of repeated text (unit, kind, area, …): per tag, a code into a short list of values. */
export type TextColumn = { codes: Int32Array; values: (string | null)[] };

/**
 * A site's tags by column: numbers in typed arrays, repeated text as codes. Tens of thousands
 * of tags then make a few dozen long-lived objects instead of one object (and its strings)
 * per tag, which keeps garbage collection short while the table scrolls.
 */
export type TagStore = {
  length: number;
  id: Float64Array;
  name: string[];
  samplePeriodMs: Float64Array;
  /** NaN where the tag has no engineering range. */
  euLow: Float64Array;
  euHigh: Float64Array;
  unit: TextColumn;
  kind: TextColumn;
  area: TextColumn;
  equipment: TextColumn;
  gateway: TextColumn;
};

type TextField = "unit" | "kind" | "area" | "equipment" | "gateway";
const TEXT_FIELDS: TextField[] = ["unit", "kind", "area", "equipment", "gateway"];

export const EMPTY_STORE: TagStore = toStore([]);

/** Turns one page of tags, as the route handler sends it, into columns. */
export function toStore(tags: readonly TagRow[]): TagStore {
  const n = tags.length;
  const store: TagStore = {
    length: n,
    id: new Float64Array(n),
    name: new Array<string>(n),
    samplePeriodMs: new Float64Array(n),
    euLow: new Float64Array(n),
    euHigh: new Float64Array(n),
    unit: { codes: new Int32Array(n), values: [] },
    kind: { codes: new Int32Array(n), values: [] },
    area: { codes: new Int32Array(n), values: [] },
    equipment: { codes: new Int32Array(n), values: [] },
    gateway: { codes: new Int32Array(n), values: [] },
  };
  const dicts = TEXT_FIELDS.map(() => new Map<string | null, number>());
  for (let i = 0; i < n; i++) {
    const t = tags[i];
    store.id[i] = t.id;
    store.name[i] = t.name;
    store.samplePeriodMs[i] = t.samplePeriodMs;
    store.euLow[i] = t.euLow ?? Number.NaN;
    store.euHigh[i] = t.euHigh ?? Number.NaN;
    TEXT_FIELDS.forEach((f, k) => {
      const col = store[f];
      const value = t[f] ?? null;
      let code = dicts[k].get(value);
      if (code === undefined) {
        code = col.values.push(value) - 1;
        dicts[k].set(value, code);
      }
      col.codes[i] = code;
    });
  }
  return store;
}

/** The pages of an inventory as one store, in page order. */
export function joinStores(parts: readonly TagStore[]): TagStore {
  if (parts.length === 0) return EMPTY_STORE;
  if (parts.length === 1) return parts[0];
  const n = parts.reduce((sum, p) => sum + p.length, 0);
  const numbers = (pick: (p: TagStore) => Float64Array) => {
    const out = new Float64Array(n);
    let at = 0;
    for (const p of parts) {
      out.set(pick(p), at);
      at += p.length;
    }
    return out;
  };
  const text = (f: TextField): TextColumn => {
    const codes = new Int32Array(n);
    const values: (string | null)[] = [];
    const index = new Map<string | null, number>();
    let at = 0;
    for (const p of parts) {
      const col = p[f];
      const remap = col.values.map((v) => {
        let code = index.get(v);
        if (code === undefined) {
          code = values.push(v) - 1;
          index.set(v, code);
        }
        return code;
      });
      for (let i = 0; i < p.length; i++) codes[at + i] = remap[col.codes[i]];
      at += p.length;
    }
    return { codes, values };
  };
  return {
    length: n,
    id: numbers((p) => p.id),
    name: parts.flatMap((p) => p.name),
    samplePeriodMs: numbers((p) => p.samplePeriodMs),
    euLow: numbers((p) => p.euLow),
    euHigh: numbers((p) => p.euHigh),
    unit: text("unit"),
    kind: text("kind"),
    area: text("area"),
    equipment: text("equipment"),
    gateway: text("gateway"),
  };
}

/** Tag `i`'s value in a text column. */
export const tagText = (col: TextColumn, i: number) => col.values[col.codes[i]];
const range = (x: number) => (Number.isNaN(x) ? null : x);

/** Tag `i` of the store as a plain object (for the row editor). */
export function tagAt(s: TagStore, i: number): TagRow {
  return {
    id: s.id[i],
    name: s.name[i],
    unit: tagText(s.unit, i) ?? "",
    samplePeriodMs: s.samplePeriodMs[i],
    kind: tagText(s.kind, i) as TagKind,
    euLow: range(s.euLow[i]),
    euHigh: range(s.euHigh[i]),
    area: tagText(s.area, i),
    equipment: tagText(s.equipment, i),
    gateway: tagText(s.gateway, i) ?? "",
  };
}

// Natural order, case-insensitive: digit runs compare by value ("TT-9" before "TT-10").
const naturalKey = (s: string | null) => (s ?? "").toLowerCase().replace(/\d+/g, (d) => (d.length >= 20 ? d : d.padStart(20, "0")));
const compareKeys = (keys: string[]) => (a: number, b: number) => (keys[a] < keys[b] ? -1 : keys[a] > keys[b] ? 1 : a - b);

/** Rank of each value of a text column in natural order. */
function valueRanks(values: readonly (string | null)[]): Int32Array {
  const keys = values.map(naturalKey);
  const byKey = Array.from(values, (_, i) => i).sort(compareKeys(keys));
  const rank = new Int32Array(values.length);
  // Equal keys (e.g. "PV" and "pv") share a rank, so that ties fall back to inventory order.
  byKey.forEach((v, r) => (rank[v] = r > 0 && keys[v] === keys[byKey[r - 1]] ? rank[byKey[r - 1]] : r));
  return rank;
}

const nameRanks = new WeakMap<TagStore, Float64Array>();
const lowerNames = new WeakMap<TagStore, string[]>();

/** Per tag, a number whose order is the column's sort order; NaN sorts last either way. */
function sortKey(s: TagStore, column: string): Float64Array {
  if (column === "name") {
    let rank = nameRanks.get(s);
    if (!rank) nameRanks.set(s, (rank = Float64Array.from(valueRanks(s.name))));
    return rank;
  }
  if (column === "samplePeriodMs") return s.samplePeriodMs;
  if (column === "range") return s.euLow;
  if ((TEXT_FIELDS as string[]).includes(column)) {
    const col = s[column as TextField];
    const rank = valueRanks(col.values);
    const out = new Float64Array(s.length);
    for (let i = 0; i < s.length; i++) out[i] = rank[col.codes[i]];
    return out;
  }
  throw new Error(`no sort order for column ${column}`);
}

export type SortSpec = readonly { id: string; desc: boolean }[];

/** Positions of all tags in the store, sorted; ties keep inventory order. */
export function sortedOrder(s: TagStore, sorting: SortSpec): Int32Array {
  const order = new Int32Array(s.length);
  for (let i = 0; i < s.length; i++) order[i] = i;
  if (sorting.length === 0) return order;
  const keys = sorting.map((c) => ({ key: sortKey(s, c.id), dir: c.desc ? -1 : 1 }));
  return order.sort((a, b) => {
    for (const { key, dir } of keys) {
      const x = key[a];
      const y = key[b];
      if (x === y) continue;
      const xNone = Number.isNaN(x);
      const yNone = Number.isNaN(y);
      if (xNone || yNone) {
        if (xNone && yNone) continue;
        return xNone ? 1 : -1;
      }
      return x < y ? -dir : dir;
    }
    return a - b;
  });
}

export type TagFilter = { kind: string; gateway: string; search: string };

/** The tags of `order` that pass the filters (kind, gateway: equal; search: in name, area, equipment or unit). */
export function filteredOrder(s: TagStore, order: Int32Array, { kind, gateway, search }: TagFilter): Int32Array {
  const q = search.trim().toLowerCase();
  if (!kind && !gateway && !q) return order;
  const kindCode = kind ? s.kind.values.indexOf(kind) : -1;
  const gatewayCode = gateway ? s.gateway.values.indexOf(gateway) : -1;
  if ((kind && kindCode < 0) || (gateway && gatewayCode < 0)) return new Int32Array(0);
  let names: string[] | undefined;
  const hit = (col: TextColumn) => Uint8Array.from(col.values, (v) => (v !== null && v.toLowerCase().includes(q) ? 1 : 0));
  const [unitHit, areaHit, equipmentHit] = q ? [hit(s.unit), hit(s.area), hit(s.equipment)] : [];
  if (q) {
    names = lowerNames.get(s);
    if (!names) lowerNames.set(s, (names = s.name.map((n) => n.toLowerCase())));
  }
  const out = new Int32Array(order.length);
  let n = 0;
  for (const i of order) {
    if (kind && s.kind.codes[i] !== kindCode) continue;
    if (gateway && s.gateway.codes[i] !== gatewayCode) continue;
    if (names && !(names[i].includes(q) || unitHit![s.unit.codes[i]] || areaHit![s.area.codes[i]] || equipmentHit![s.equipment.codes[i]])) continue;
    out[n++] = i;
  }
  return out.slice(0, n);
}
