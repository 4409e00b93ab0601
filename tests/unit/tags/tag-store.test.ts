import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { filteredOrder, joinStores, sortedOrder, tagAt, toStore, type TagRow } from "@/components/tags/tag-store";

const row = (id: number, over: Partial<TagRow>): TagRow => ({
  id,
  name: `A/TT-${id}/PV`,
  unit: "degC",
  samplePeriodMs: 1000,
  kind: "analog",
  euLow: 0,
  euHigh: 100,
  area: "A",
  equipment: null,
  gateway: "gw-1",
  ...over,
});

const arbitraryRows = fc
  .array(
    fc.record({
      name: fc.stringMatching(/^[A-Za-z]{1,3}\/[A-Za-z]{1,2}-\d{1,3}\/(PV|pv|STATE)$/),
      unit: fc.constantFrom("degC", "kPa", "m3/h", "%"),
      samplePeriodMs: fc.constantFrom(100, 500, 1000, 60_000),
      kind: fc.constantFrom("analog" as const, "discrete" as const, "counter" as const),
      ranged: fc.boolean(),
      area: fc.option(fc.constantFrom("PAST1", "CIP1", "SEP"), { nil: null }),
      gateway: fc.constantFrom("gw-1", "gw-2"),
    }),
    { maxLength: 60 },
  )
  .map((rs) => rs.map(({ ranged, ...r }, i) => row(i + 1, { ...r, euLow: ranged ? 0 : null, euHigh: ranged ? 100 : null })));

// The store's natural order, written out plainly: case-insensitive, digit runs by value, ties by inventory order.
function naturalCompare(a: string, b: string): number {
  const split = (s: string) => s.toLowerCase().match(/\d+|\D+/g) ?? [];
  const x = split(a);
  const y = split(b);
  for (let i = 0; i < Math.min(x.length, y.length); i++) {
    if (x[i] === y[i]) continue;
    const nx = /^\d/.test(x[i]) && /^\d/.test(y[i]);
    if (nx && Number(x[i]) !== Number(y[i])) return Number(x[i]) - Number(y[i]);
    return x[i] < y[i] ? -1 : 1;
  }
  return x.length - y.length;
}

describe("tag store (columns for the virtual tag table)", () => {
  it("gives every tag back as it came, also when pages are joined", () => {
    fc.assert(
      fc.property(arbitraryRows, fc.integer({ min: 1, max: 7 }), (rows, page) => {
        const parts = [];
        for (let i = 0; i < rows.length; i += page) parts.push(toStore(rows.slice(i, i + page)));
        const store = joinStores(parts);
        expect(store.length).toBe(rows.length);
        rows.forEach((r, i) => expect(tagAt(store, i)).toEqual(r));
      }),
      { seed: 6, numRuns: 100 },
    );
  });

  it("sorts names naturally and case-insensitively, ties in inventory order", () => {
    const store = toStore([row(1, { name: "TT-10" }), row(2, { name: "tt-9" }), row(3, { name: "TT-9" }), row(4, { name: "TT-100" })]);
    expect(Array.from(sortedOrder(store, [{ id: "name", desc: false }]))).toEqual([1, 2, 0, 3]);
    // Descending reverses the values but keeps equal ones in inventory order.
    expect(Array.from(sortedOrder(store, [{ id: "name", desc: true }]))).toEqual([3, 0, 1, 2]);
  });

  it("puts tags without a range last in both directions", () => {
    const store = toStore([row(1, { euLow: null, euHigh: null }), row(2, { euLow: 5 }), row(3, { euLow: -5 })]);
    expect(Array.from(sortedOrder(store, [{ id: "range", desc: false }]))).toEqual([2, 1, 0]);
    expect(Array.from(sortedOrder(store, [{ id: "range", desc: true }]))).toEqual([1, 2, 0]);
  });

  it("sorts and filters like a plain sort and filter over the rows (random inventories)", () => {
    fc.assert(
      fc.property(arbitraryRows, fc.constantFrom("name", "unit", "samplePeriodMs", "area", "gateway"), fc.boolean(), fc.constantFrom("", "pv", "sep", "kpa", "tt-1"), (rows, column, desc, search) => {
        const store = toStore(rows);
        const dir = desc ? -1 : 1;
        const value = (r: TagRow) => (column === "samplePeriodMs" ? r.samplePeriodMs : (r[column as "name"] as string | null));
        const expected = rows
          .map((r, i) => ({ r, i }))
          .sort((a, b) => {
            const x = value(a.r);
            const y = value(b.r);
            const c = typeof x === "number" && typeof y === "number" ? x - y : naturalCompare((x as string | null) ?? "", (y as string | null) ?? "");
            return c !== 0 ? dir * Math.sign(c) : a.i - b.i;
          })
          .map((x) => x.i);
        const order = sortedOrder(store, [{ id: column, desc }]);
        expect(Array.from(order)).toEqual(expected);
        const q = search.toLowerCase();
        const hit = (r: TagRow) => [r.name, r.unit, r.area, r.equipment].some((v) => v !== null && v.toLowerCase().includes(q));
        const kept = expected.filter((i) => rows[i].kind === "analog" && rows[i].gateway === "gw-2" && (q === "" || hit(rows[i])));
        const filtered = filteredOrder(store, order, { kind: "analog", gateway: "gw-2", search });
        expect(Array.from(filtered)).toEqual(kept);
      }),
      { seed: 7, numRuns: 200 },
    );
  });

  it("returns nothing for a kind or gateway no tag has", () => {
    const store = toStore([row(1, {})]);
    expect(filteredOrder(store, sortedOrder(store, []), { kind: "counter", gateway: "", search: "" }).length).toBe(0);
    expect(filteredOrder(store, sortedOrder(store, []), { kind: "", gateway: "gw-9", search: "" }).length).toBe(0);
  });
});
