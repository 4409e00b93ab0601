import fc from "fast-check";
import picomatch from "picomatch/posix";
import { describe, expect, it } from "vitest";
import {
  assignGroups,
  compileSelector,
  patternProblem,
  previewSelector,
  type GroupRule,
  type SelectorLike,
  type TagLike,
} from "@/lib/tags/selector";
import { TAG_KINDS } from "@/schemas/tag";

const base: Omit<TagLike, "name"> = { unit: "degC", kind: "analog", samplePeriodMs: 1000, area: null, equipment: null, gateway: "fw-gw-01" };
const tag = (name: string, extra: Partial<TagLike> = {}): TagLike => ({ ...base, name, ...extra });
const names = (tags: TagLike[], selector: SelectorLike) => tags.filter(compileSelector(selector)).map((t) => t.name);

describe("glob patterns on tag names", () => {
  const inventory = ["PAST1/TT-101/PV", "PAST1/A/B/PV", "PAST1/PV", "PAST1", "PAST1/TT-101/SP", "PAST2/TT-101/PV", "past1/tt-101/pv"].map((n) => tag(n));

  it("keeps * within one level", () => {
    expect(names(inventory, { patterns: ["PAST1/*/PV"] })).toEqual(["PAST1/TT-101/PV"]);
    expect(names(inventory, { patterns: ["PAST1/*"] })).toEqual(["PAST1/PV"]);
    expect(names(inventory, { patterns: ["*/TT-101/*"] })).toEqual(["PAST1/TT-101/PV", "PAST1/TT-101/SP", "PAST2/TT-101/PV"]);
  });

  it("lets ** cross levels, including none, but A/** stays below A", () => {
    expect(names(inventory, { patterns: ["PAST1/**/PV"] })).toEqual(["PAST1/TT-101/PV", "PAST1/A/B/PV", "PAST1/PV"]);
    expect(names(inventory, { patterns: ["PAST1/**"] })).toEqual(["PAST1/TT-101/PV", "PAST1/A/B/PV", "PAST1/PV", "PAST1/TT-101/SP"]);
    expect(names(inventory, { patterns: ["**/PV"] })).toEqual(["PAST1/TT-101/PV", "PAST1/A/B/PV", "PAST1/PV", "PAST2/TT-101/PV"]);
    expect(names([tag("PV"), tag("XPV"), tag("X/PV")], { patterns: ["**/PV"] })).toEqual(["PV", "X/PV"]);
  });

  it("is case-sensitive", () => {
    expect(names(inventory, { patterns: ["past1/**"] })).toEqual(["past1/tt-101/pv"]);
    expect(names(inventory, { patterns: ["PAST1/TT-101/PV"] })).toEqual(["PAST1/TT-101/PV"]);
  });

  it("matches names with dots, dashes, underscores and hashes, also a level starting with a dot", () => {
    const odd = ["CIP2/FT-204/TOT", "CIP2/.cfg/x", "CIP2/FT_204.A#2/TOT", "CIP2/FT-204/TOT.1"].map((n) => tag(n));
    expect(names(odd, { patterns: ["CIP2/*/*"] })).toEqual(["CIP2/FT-204/TOT", "CIP2/.cfg/x", "CIP2/FT_204.A#2/TOT", "CIP2/FT-204/TOT.1"]);
    expect(names(odd, { patterns: ["CIP2/FT_204.A#?/TOT"] })).toEqual(["CIP2/FT_204.A#2/TOT"]);
    expect(names(odd, { patterns: ["CIP2/*.*/TOT"] })).toEqual(["CIP2/FT_204.A#2/TOT"]);
    expect(names(odd, { patterns: ["CIP2/FT-204/TOT"] })).toEqual(["CIP2/FT-204/TOT"]);
  });

  it("supports ?, classes and braces as picomatch does, and reads a leading ! literally", () => {
    const inv = ["A/TT-101/PV", "A/TT-102/SP", "A/TT-10x/PV", "!A/1"].map((n) => tag(n));
    expect(names(inv, { patterns: ["A/TT-10[0-9]/{PV,SP}"] })).toEqual(["A/TT-101/PV", "A/TT-102/SP"]);
    expect(names(inv, { patterns: ["A/TT-10[^0-9]/*"] })).toEqual(["A/TT-10x/PV"]);
    expect(names(inv, { patterns: ["A/TT-1??/PV"] })).toEqual(["A/TT-101/PV", "A/TT-10x/PV"]);
    expect(names(inv, { patterns: ["!A/*"] })).toEqual(["!A/1"]);
  });

  it("matches when any one of several patterns matches", () => {
    expect(names(inventory, { patterns: ["PAST2/**", "PAST1/*/SP"] })).toEqual(["PAST1/TT-101/SP", "PAST2/TT-101/PV"]);
  });

  it("agrees with picomatch's own regular expression (the literal prefix and suffix shortcuts lose nothing)", () => {
    const options = { dot: true, nonegate: true, strictSlashes: true, strictBrackets: true };
    const level = fc.constantFrom("**", "*", "A", "B", "A*", "*1", "?", "A?", "[AB]", "[^A]", "{A,B}", "{,A/}", ".h", "\\*", "-", "");
    const pattern = fc
      .tuple(fc.constantFrom("", "./", "/"), fc.array(level, { minLength: 1, maxLength: 4 }))
      .map(([lead, levels]) => lead + levels.join("/"));
    const nameLevel = fc.constantFrom("A", "B", "1", "A1", "AB", ".h", "*", "{A,B}", "a", "");
    const name = fc.array(nameLevel, { minLength: 1, maxLength: 5 }).map((l) => l.join("/"));
    fc.assert(
      fc.property(
        pattern,
        fc.array(name, { maxLength: 12 }),
        (pattern, randomNames) => {
          fc.pre(patternProblem(pattern) === null);
          // Names spelled from the pattern's literal text probe the edges of the shortcuts.
          const literal = pattern.replace(/[*?[\]{}()^,\\]/g, "");
          const tagNames = [...randomNames, literal, literal.replace(/^\/+|\/+$/g, ""), literal.replace(/\/+/g, "/")].filter(Boolean);
          const re = picomatch.makeRe(pattern, options);
          const matches = compileSelector({ patterns: [pattern] });
          for (const name of tagNames) expect(matches(tag(name)), `${pattern} ~ ${name}`).toBe(re.test(name));
          const { matches: lists } = assignGroups(tagNames.map((n) => tag(n)), [{ name: "g", priority: 1, selector: { patterns: [pattern] } }]);
          expect(lists.map((l) => l.length === 1)).toEqual(tagNames.map((n) => re.test(n)));
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("throws on a pattern the schema refuses", () => {
    expect(() => compileSelector({ patterns: ["A/[1"] })).toThrow(/Pattern "A\/\[1": Not a valid pattern/);
  });
});

describe("filters, include and exclude", () => {
  const inventory = [
    tag("A/TT-1/PV", { unit: "degC", kind: "analog", samplePeriodMs: 100, area: "Past", equipment: "HTST", gateway: "gw-1" }),
    tag("A/XV-2/ST", { unit: "state", kind: "discrete", samplePeriodMs: 1000, area: "Past", equipment: null, gateway: "gw-1" }),
    tag("A/FQ-3/TOT", { unit: "m3", kind: "counter", samplePeriodMs: 60000, area: null, equipment: "Meter", gateway: "gw-2" }),
    tag("B/PT-4/PV", { unit: "kPa", kind: "analog", samplePeriodMs: 500, area: "CIP", equipment: "HTST", gateway: "gw-2" }),
  ];

  it("applies each filter alone", () => {
    expect(names(inventory, { units: ["degC", "kPa"] })).toEqual(["A/TT-1/PV", "B/PT-4/PV"]);
    expect(names(inventory, { kinds: ["discrete", "counter"] })).toEqual(["A/XV-2/ST", "A/FQ-3/TOT"]);
    expect(names(inventory, { areas: ["Past"] })).toEqual(["A/TT-1/PV", "A/XV-2/ST"]);
    expect(names(inventory, { equipment: ["HTST"] })).toEqual(["A/TT-1/PV", "B/PT-4/PV"]);
    expect(names(inventory, { gateways: ["gw-2"] })).toEqual(["A/FQ-3/TOT", "B/PT-4/PV"]);
    expect(names(inventory, { minPeriodMs: 500 })).toEqual(["A/XV-2/ST", "A/FQ-3/TOT", "B/PT-4/PV"]);
    expect(names(inventory, { maxPeriodMs: 500 })).toEqual(["A/TT-1/PV", "B/PT-4/PV"]);
    expect(names(inventory, { minPeriodMs: 500, maxPeriodMs: 1000 })).toEqual(["A/XV-2/ST", "B/PT-4/PV"]);
  });

  it("never lets a tag without area or equipment through an area or equipment filter", () => {
    expect(names(inventory, { areas: ["Past", "CIP"] })).not.toContain("A/FQ-3/TOT");
    expect(names(inventory, { equipment: ["HTST", "Meter"] })).not.toContain("A/XV-2/ST");
  });

  it("requires every filter and a pattern when combined", () => {
    expect(names(inventory, { kinds: ["analog"], gateways: ["gw-2"] })).toEqual(["B/PT-4/PV"]);
    expect(names(inventory, { patterns: ["A/**"], equipment: ["HTST", "Meter"] })).toEqual(["A/TT-1/PV", "A/FQ-3/TOT"]);
    expect(names(inventory, { patterns: ["A/**"], kinds: ["analog"], maxPeriodMs: 50 })).toEqual([]);
  });

  it("lets include beat filters and patterns", () => {
    expect(names(inventory, { patterns: ["B/**"], include: ["A/XV-2/ST"] })).toEqual(["A/XV-2/ST", "B/PT-4/PV"]);
    expect(names(inventory, { kinds: ["counter"], include: ["A/TT-1/PV"] })).toEqual(["A/TT-1/PV", "A/FQ-3/TOT"]);
    expect(names(inventory, { include: ["A/TT-1/PV", "Z/not/there"] })).toEqual(["A/TT-1/PV"]);
  });

  it("lets exclude beat include and patterns", () => {
    expect(names(inventory, { patterns: ["A/**"], exclude: ["A/XV-2/ST"] })).toEqual(["A/TT-1/PV", "A/FQ-3/TOT"]);
    expect(names(inventory, { include: ["A/TT-1/PV"], exclude: ["A/TT-1/PV"] })).toEqual([]);
  });

  it("matches nothing with an empty selector or one with only an exclude list", () => {
    expect(names(inventory, {})).toEqual([]);
    expect(names(inventory, { patterns: [], units: [], minPeriodMs: null, maxPeriodMs: null })).toEqual([]);
    expect(names(inventory, { exclude: ["A/TT-1/PV"] })).toEqual([]);
  });
});

describe("assignGroups", () => {
  const tags = ["P/TT-1/PV", "P/TT-2/PV", "P/FT-3/PV", "C/FT-4/TOT", "C/XV-5/ST"].map((n) => tag(n));
  const group = (name: string, priority: number, selector: SelectorLike): GroupRule => ({ name, priority, selector });

  it("gives each tag to the matching group with the lowest priority number and lists every match", () => {
    const result = assignGroups(tags, [
      group("all P", 20, { patterns: ["P/**"] }),
      group("temperatures", 10, { patterns: ["**/TT-*/PV"] }),
      group("totals", 30, { patterns: ["C/*/TOT"] }),
      group("unused", 40, { patterns: ["Z/**"] }),
    ]);
    expect(result.winner).toEqual(["temperatures", "temperatures", "all P", "totals", null]);
    expect(result.matches).toEqual([["temperatures", "all P"], ["temperatures", "all P"], ["all P"], ["totals"], []]);
    expect(result.counts).toEqual(new Map([["temperatures", 2], ["all P", 1], ["totals", 1], ["unused", 0]]));
    expect(result.overlaps).toEqual([0, 1]);
    expect(result.unassigned).toEqual([4]);
  });

  it("breaks priority ties by name", () => {
    const result = assignGroups(tags, [group("b", 5, { patterns: ["P/**"] }), group("a", 5, { patterns: ["**/PV"] }), group("c", 1, { include: ["P/FT-3/PV"] })]);
    expect(result.winner.slice(0, 3)).toEqual(["a", "a", "c"]);
    expect(result.matches[2]).toEqual(["c", "a", "b"]);
  });

  it("handles no groups and no tags", () => {
    expect(assignGroups(tags, [])).toEqual({ winner: [null, null, null, null, null], matches: [[], [], [], [], []], counts: new Map(), unassigned: [0, 1, 2, 3, 4], overlaps: [] });
    expect(assignGroups([], [group("g", 1, { patterns: ["**"] })])).toEqual({ winner: [], matches: [], counts: new Map([["g", 0]]), unassigned: [], overlaps: [] });
  });

  it("agrees with compileSelector applied tag by tag in priority order", () => {
    const pool = { names: ["A/1/PV", "A/2/PV", "A/2/SP", "B/1/PV", "B/x/y/PV", "C", ".h/1"], units: ["degC", "kPa", "state"], areas: ["P", "Q"], gateways: ["g1", "g2"] };
    const tagArb = fc.record({
      name: fc.constantFrom(...pool.names),
      unit: fc.constantFrom(...pool.units),
      kind: fc.constantFrom(...TAG_KINDS),
      samplePeriodMs: fc.constantFrom(100, 1000, 60000),
      area: fc.option(fc.constantFrom(...pool.areas), { nil: null }),
      equipment: fc.option(fc.constantFrom("E1", "E2"), { nil: null }),
      gateway: fc.constantFrom(...pool.gateways),
    });
    const sub = <T>(xs: readonly T[]) => fc.subarray([...xs]);
    const selectorArb = fc.record(
      {
        patterns: sub(["A/**", "*/1/*", "**/PV", "B/*/*/PV", "C", "**", "*/2/{PV,SP}", ".h/*"]),
        units: sub(pool.units),
        kinds: sub(TAG_KINDS),
        areas: sub(pool.areas),
        equipment: sub(["E1", "E2"]),
        gateways: sub(pool.gateways),
        minPeriodMs: fc.option(fc.constantFrom(100, 1000), { nil: null }),
        maxPeriodMs: fc.option(fc.constantFrom(1000, 60000), { nil: null }),
        include: sub(pool.names),
        exclude: sub(pool.names),
      },
      { requiredKeys: [] },
    );
    const groupArb = fc.record({ name: fc.constantFrom("g1", "g2", "g3", "g4", "g5", "g6"), priority: fc.integer({ min: 0, max: 3 }), selector: selectorArb });
    fc.assert(
      fc.property(fc.array(tagArb, { maxLength: 25 }), fc.uniqueArray(groupArb, { maxLength: 6, selector: (g) => g.name }), (tagList, groups) => {
        const ordered = [...groups].sort((a, b) => a.priority - b.priority || (a.name < b.name ? -1 : 1));
        const predicates = ordered.map((g) => compileSelector(g.selector));
        const expected = tagList.map((t) => ordered.filter((_, i) => predicates[i](t)).map((g) => g.name));
        const result = assignGroups(tagList, groups);
        expect(result.matches).toEqual(expected);
        expect(result.winner).toEqual(expected.map((m) => m[0] ?? null));
        expect(result.unassigned).toEqual(expected.flatMap((m, i) => (m.length === 0 ? [i] : [])));
        expect(result.overlaps).toEqual(expected.flatMap((m, i) => (m.length > 1 ? [i] : [])));
        expect(result.counts).toEqual(new Map(ordered.map((g) => [g.name, expected.filter((m) => m[0] === g.name).length])));
      }),
      { numRuns: 400 },
    );
  });
});

describe("previewSelector", () => {
  const tags = Array.from({ length: 50 }, (_, i) => tag(`P/TT-${100 + i}/${i % 2 ? "SP" : "PV"}`));

  it("counts matches and samples the first names in the given order", () => {
    const preview = previewSelector(tags, { patterns: ["P/*/PV"] }, 3);
    expect(preview).toEqual({ count: 25, sample: ["P/TT-100/PV", "P/TT-102/PV", "P/TT-104/PV"] });
    expect(previewSelector(tags, { patterns: ["P/**"] }).sample).toHaveLength(20);
    expect(previewSelector(tags, {})).toEqual({ count: 0, sample: [] });
  });
});
