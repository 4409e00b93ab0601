import picomatch from "picomatch/posix";
import type { Selector, TagKind } from "@/schemas/tag";

/** The fields of a tag that a selector looks at. */
export type TagLike = {
  name: string;
  unit: string;
  kind: TagKind;
  samplePeriodMs: number;
  area: string | null;
  equipment: string | null;
  gateway: string;
};

/** A selector as stored (`Selector`, the output of `selectorSchema`); absent lists are empty. */
export type SelectorLike = Partial<Selector>;

/** A tag group as `assignGroups` needs it: lower `priority` wins. */
export type GroupRule = { name: string; priority: number; selector: SelectorLike };

/** Longest pattern accepted. */
export const MAX_PATTERN_LENGTH = 255;
/**
 * Most wildcards (`*` or `**`) in one pattern. picomatch compiles globs to backtracking
 * regular expressions; each extra wildcard multiplies the worst-case time on long names
 * (measured: 3 wildcards ≈ 20 ms, 4 ≈ 0.6 s, 5 ≈ 22 s on a 191-character name).
 */
export const MAX_PATTERN_WILDCARDS = 3;

/*
 * picomatch options (picomatch README, "Options"):
 * - the posix entry point, so `\` never acts as a path separator on any platform;
 * - `dot`: `*` and `**` also match a level that starts with "." (tag names may);
 * - `nonegate`: a leading "!" is literal, since patterns of a selector are OR-ed and a
 *   negated one would match almost everything (use the exclude list instead);
 * - `strictSlashes`: `PAST1/*` does not also match "PAST1/x/";
 * - `strictBrackets`: an unbalanced bracket, brace or parenthesis is an error, not a literal;
 * - `debug`: a glob that yields an invalid regular expression throws instead of silently
 *   matching nothing.
 * Without `globstar: false`, `**` as a whole level crosses levels and `*` stays inside one.
 * Matching is case-sensitive (`nocase` stays false).
 */
const GLOB_OPTIONS: picomatch.PicomatchOptions = {
  dot: true,
  nonegate: true,
  strictSlashes: true,
  strictBrackets: true,
  debug: true,
};

const CONTROL_CHARS = /[\u0000-\u001F\u007F-\u009F]/;
const BRACE_RANGE = /\{([^{},]*)\.\.([^{},]*)\}/g;

/** Counts wildcard runs outside bracket classes and reports `[!…]`, which picomatch reads as a set. */
function scanPattern(p: string): { wildcards: number; bangClass: boolean } {
  let wildcards = 0;
  let bangClass = false;
  for (let i = 0; i < p.length; i++) {
    const c = p[i];
    if (c === "\\") i++;
    else if (c === "[") {
      if (p[i + 1] === "!") bangClass = true;
      let j = i + 2; // "]" right after "[" is part of the class
      while (j < p.length && p[j] !== "]") j += p[j] === "\\" ? 2 : 1;
      i = j;
    } else if (c === "*") {
      wildcards++;
      while (p[i + 1] === "*") i++;
    }
  }
  return { wildcards, bangClass };
}

/**
 * Why a tag-name pattern cannot be used, or null when it can. The selector schema and
 * the rule editor both call this, so they refuse exactly what `compileSelector` would.
 */
export function patternProblem(pattern: string): string | null {
  if (pattern.trim() === "") return "Enter a pattern or remove the empty one.";
  if (pattern.length > MAX_PATTERN_LENGTH) return `A pattern has at most ${MAX_PATTERN_LENGTH} characters.`;
  if (CONTROL_CHARS.test(pattern)) return "A pattern cannot contain control characters.";
  const { wildcards, bangClass } = scanPattern(pattern);
  if (bangClass) return "Write a negated class as [^…]; [!…] would match the “!” itself.";
  if (wildcards > MAX_PATTERN_WILDCARDS) {
    return `Use at most ${MAX_PATTERN_WILDCARDS} wildcards (* or **) in one pattern; split it into several patterns.`;
  }
  for (const [, from, to] of pattern.matchAll(BRACE_RANGE)) {
    // picomatch turns {a..z} into a character class, so only one-character ends work.
    if (from.length !== 1 || to.length !== 1) {
      return `A range in braces works for single characters only ({1..9}, {a..f}); list longer values, e.g. {10,11,12}.`;
    }
  }
  try {
    picomatch.makeRe(pattern, GLOB_OPTIONS);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    // picomatch's own messages are readable; the RegExp engine's are not.
    if (message.startsWith("Invalid regular expression")) return "Not a valid pattern: check character ranges and a trailing “\\”.";
    return `Not a valid pattern: ${message}.`;
  }
  return null;
}

// Characters that may start glob syntax; everything else in a pattern is literal.
const GLOB_SYNTAX = /[*?[\]{}()!+@\\]/;

/**
 * A compiled glob: the regular expression (null for a pattern without glob syntax, which
 * matches by equality), guarded by the literal text every match must start and end with,
 * and the first level every match has when the pattern spells it out (lets `assignGroups`
 * look only at tags with that first level).
 */
type NameTest = { prefix: string; suffix: string; min: number; re: RegExp | null; level: string | null };

/** A name's first level: the text before its first "/", or the whole name. */
const firstLevel = (name: string) => {
  const slash = name.indexOf("/");
  return slash < 0 ? name : name.slice(0, slash);
};

/** Compiles one glob; throws on a pattern `patternProblem` refuses. */
function compileGlob(pattern: string): NameTest {
  const problem = patternProblem(pattern);
  if (problem) throw new Error(`Pattern "${pattern}": ${problem}`);
  const re = picomatch.makeRe(pattern, GLOB_OPTIONS);
  if (pattern.startsWith("./")) return { prefix: "", suffix: "", min: 0, re, level: null };
  const first = pattern.search(GLOB_SYNTAX);
  if (first < 0) return { prefix: pattern, suffix: "", min: pattern.length, re: null, level: firstLevel(pattern) };
  let last = first;
  for (let i = first; i < pattern.length; i++) if (GLOB_SYNTAX.test(pattern[i])) last = i;
  // `**/B` matches "B": a slash next to a wildcard may not be required, so it is left out.
  const prefix = pattern.slice(0, first).replace(/\/$/, "");
  const suffix = pattern.slice(last + 1).replace(/^\//, "");
  // Every match has the same first level when the pattern spells it out before any glob syntax.
  const level = pattern.slice(0, first).includes("/") ? firstLevel(pattern) : null;
  return { prefix, suffix, min: prefix.length + suffix.length, re, level };
}

function testName(t: NameTest, name: string): boolean {
  if (t.re === null) return name === t.prefix;
  return name.length >= t.min && name.startsWith(t.prefix) && name.endsWith(t.suffix) && t.re.test(name);
}

const toSet = <T>(list: readonly T[] | undefined): Set<T> | null => (list && list.length > 0 ? new Set(list) : null);

/**
 * Compiles a tag group's selector (DESIGN.md "Tag group") into a predicate. Patterns are
 * compiled once. A tag matches when
 *
 *   it is not in `exclude`, AND
 *   ( it is in `include`
 *     OR ( the selector has at least one pattern or filter
 *          AND (no patterns, or at least one pattern matches the name)
 *          AND every non-empty filter passes:
 *              unit ∈ units, kind ∈ kinds, area ∈ areas, equipment ∈ equipment,
 *              gateway ∈ gateways, minPeriodMs ≤ samplePeriodMs ≤ maxPeriodMs (each bound
 *              only where given) ) ).
 *
 * So exclude beats include and patterns, include beats filters, and an empty selector (or
 * one with only an exclude list) matches nothing. A tag with no area or equipment fails a
 * non-empty area or equipment filter. Names, units and other values compare exactly
 * (case-sensitive). Patterns are picomatch globs on the whole name: `*` stays within one
 * `/` level, `**` as a whole level stands for any number of levels, none included
 * (`A/**` matches every name below `A`, not `A` itself); `?`, `[…]`, `[^…]`, `{a,b}` and
 * extglobs work as in picomatch; `\` escapes a glob character. Throws on a pattern that
 * `patternProblem` refuses; values that passed `selectorSchema` never throw.
 */
export function compileSelector(selector: SelectorLike): (tag: TagLike) => boolean {
  const exclude = toSet(selector.exclude);
  const include = toSet(selector.include);
  const patterns = (selector.patterns ?? []).map(compileGlob);
  const units = toSet(selector.units);
  const kinds = toSet(selector.kinds);
  const areas = toSet(selector.areas);
  const equipment = toSet(selector.equipment);
  const gateways = toSet(selector.gateways);
  const min = selector.minPeriodMs ?? null;
  const max = selector.maxPeriodMs ?? null;
  const hasRule =
    patterns.length > 0 || !!(units || kinds || areas || equipment || gateways) || min !== null || max !== null;
  const n = patterns.length;

  return (tag) => {
    if (exclude !== null && exclude.has(tag.name)) return false;
    if (include !== null && include.has(tag.name)) return true;
    if (!hasRule) return false;
    if (min !== null && tag.samplePeriodMs < min) return false;
    if (max !== null && tag.samplePeriodMs > max) return false;
    if (kinds !== null && !kinds.has(tag.kind)) return false;
    if (units !== null && !units.has(tag.unit)) return false;
    if (gateways !== null && !gateways.has(tag.gateway)) return false;
    if (areas !== null && (tag.area === null || !areas.has(tag.area))) return false;
    if (equipment !== null && (tag.equipment === null || !equipment.has(tag.equipment))) return false;
    if (n === 0) return true;
    for (let i = 0; i < n; i++) if (testName(patterns[i], tag.name)) return true;
    return false;
  };
}

/** The coverage of a site's groups over its tags; arrays are indexed like the tags given. */
export type GroupAssignment = {
  /** The group each tag belongs to (the first match in priority order), or null. */
  winner: (string | null)[];
  /** Every group that matches each tag, in priority order (the winner first). */
  matches: string[][];
  /** Tags won per group, for every group given (0 when it wins none). */
  counts: Map<string, number>;
  /** Indices of tags in no group, ascending. */
  unassigned: number[];
  /** Indices of tags matched by two or more groups, ascending. */
  overlaps: number[];
};

/** Priority order: ascending `priority`, ties by name in code-unit order (locale-independent). */
export function byPriority(a: GroupRule, b: GroupRule): number {
  if (a.priority !== b.priority) return a.priority - b.priority;
  return a.name < b.name ? -1 : a.name > b.name ? 1 : 0;
}

type ColumnKey = "unit" | "kind" | "area" | "equipment" | "gateway";
const FILTERS = [
  ["kinds", "kind"],
  ["units", "unit"],
  ["gateways", "gateway"],
  ["areas", "area"],
  ["equipment", "equipment"],
] as const satisfies readonly (readonly [keyof Selector, ColumnKey])[];

/**
 * A columnar view of the tags for `assignGroups`: attribute values interned to small
 * integers (0 = none), so a filter is one typed-array lookup per tag; built lazily.
 */
class TagTable {
  readonly size: number;
  readonly names: string[];
  readonly work: Int32Array;
  private readonly columns = new Map<ColumnKey, { ids: Int32Array; dict: Map<string, number> }>();
  private periods: Float64Array | null = null;
  private byName: Map<string, number[]> | null = null;
  private byLevel: Map<string, number[]> | null = null;

  constructor(private readonly tags: readonly TagLike[]) {
    this.size = tags.length;
    this.names = tags.map((t) => t.name);
    this.work = new Int32Array(tags.length);
  }

  /** A lookup table over the interned values of `key`: 1 where the value is in `values`. */
  allowed(key: ColumnKey, values: readonly string[]): { ids: Int32Array; allowed: Uint8Array } {
    let col = this.columns.get(key);
    if (!col) {
      const dict = new Map<string, number>();
      const ids = new Int32Array(this.size);
      for (let t = 0; t < this.size; t++) {
        const v = this.tags[t][key];
        if (v === null) continue;
        let id = dict.get(v);
        if (id === undefined) dict.set(v, (id = dict.size + 1));
        ids[t] = id;
      }
      this.columns.set(key, (col = { ids, dict }));
    }
    const allowed = new Uint8Array(col.dict.size + 1);
    for (const v of values) {
      const id = col.dict.get(v);
      if (id !== undefined) allowed[id] = 1;
    }
    return { ids: col.ids, allowed };
  }

  period(): Float64Array {
    return (this.periods ??= Float64Array.from(this.tags, (t) => t.samplePeriodMs));
  }

  /** Indices of the tags with this name. */
  indicesOf(name: string): readonly number[] {
    this.byName ??= groupIndices(this.names, (n) => n);
    return this.byName.get(name) ?? [];
  }

  /** Indices of the tags whose name has this first level, ascending. */
  withFirstLevel(level: string): readonly number[] {
    this.byLevel ??= groupIndices(this.names, firstLevel);
    return this.byLevel.get(level) ?? [];
  }
}

function groupIndices(names: readonly string[], key: (name: string) => string): Map<string, number[]> {
  const map = new Map<string, number[]>();
  names.forEach((name, t) => {
    const k = key(name);
    const list = map.get(k);
    if (list) list.push(t);
    else map.set(k, [t]);
  });
  return map;
}

/** A compiled pattern with, when several groups use it, a per-tag cache (0 unknown, 1 no, 2 yes). */
type SharedGlob = { test: NameTest; cache: Uint8Array | null };

/**
 * Marks the tags `selector` matches (same rule as `compileSelector`) in `hit`, listing
 * newly marked indices in `marked`. Filters narrow a candidate list first; patterns run
 * only on the candidates that remain.
 */
function markMatches(table: TagTable, selector: SelectorLike, globs: SharedGlob[], hit: Uint8Array, marked: number[]) {
  const mark = (t: number) => {
    if (hit[t] === 0) {
      hit[t] = 1;
      marked.push(t);
    }
  };
  const { work, names } = table;
  const min = selector.minPeriodMs ?? null;
  const max = selector.maxPeriodMs ?? null;
  let all = true; // candidates are every tag until a filter narrows them into `work`
  let n = table.size;
  let hasRule = globs.length > 0;

  // When every pattern spells out the first level, only tags with one of those levels can match.
  if (hasRule && globs.every((g) => g.test.level !== null)) {
    n = 0;
    for (const level of new Set(globs.map((g) => g.test.level!))) {
      for (const t of table.withFirstLevel(level)) work[n++] = t;
    }
    all = false;
  }

  if (min !== null || max !== null) {
    hasRule = true;
    const periods = table.period();
    const lo = min ?? -Infinity;
    const hi = max ?? Infinity;
    let m = 0;
    for (let i = 0; i < n; i++) {
      const t = all ? i : work[i];
      if (periods[t] >= lo && periods[t] <= hi) work[m++] = t;
    }
    all = false;
    n = m;
  }
  for (const [listKey, column] of FILTERS) {
    const values = selector[listKey];
    if (!values || values.length === 0) continue;
    hasRule = true;
    const { ids, allowed } = table.allowed(column, values);
    let m = 0;
    for (let i = 0; i < n; i++) {
      const t = all ? i : work[i];
      if (allowed[ids[t]] === 1) work[m++] = t;
    }
    all = false;
    n = m;
  }
  if (hasRule) {
    const k = globs.length;
    for (let i = 0; i < n; i++) {
      const t = all ? i : work[i];
      let ok = k === 0;
      for (let j = 0; j < k && !ok; j++) ok = globMatches(globs[j], t, names[t]);
      if (ok) mark(t);
    }
  }
  for (const name of selector.include ?? []) for (const t of table.indicesOf(name)) mark(t);
  for (const name of selector.exclude ?? []) for (const t of table.indicesOf(name)) hit[t] = 0;
}

function globMatches(g: SharedGlob, t: number, name: string): boolean {
  if (g.cache === null) return testName(g.test, name);
  if (g.cache[t] === 0) g.cache[t] = testName(g.test, name) ? 2 : 1;
  return g.cache[t] === 2;
}

/**
 * Assigns every tag to the first group that matches it (DESIGN.md "Tag group"): groups are
 * tried by ascending priority (lower number first), ties broken by name; and lists every
 * matching group so the coverage view can show overlaps and tags in no group. A tag
 * matches a group exactly when `compileSelector(group.selector)` returns true for it; the
 * work is done group by group on interned columns, each distinct pattern compiled once.
 * Group names are expected to be unique on a site (counts are keyed by name).
 */
export function assignGroups(tags: readonly TagLike[], groups: readonly GroupRule[]): GroupAssignment {
  const ordered = [...groups].sort(byPriority);
  const table = new TagTable(tags);
  const uses = new Map<string, number>();
  for (const g of ordered) for (const p of new Set(g.selector.patterns ?? [])) uses.set(p, (uses.get(p) ?? 0) + 1);
  const shared = new Map<string, SharedGlob>();
  const globFor = (p: string): SharedGlob => {
    let g = shared.get(p);
    if (!g) shared.set(p, (g = { test: compileGlob(p), cache: uses.get(p)! > 1 ? new Uint8Array(tags.length) : null }));
    return g;
  };
  const compiled = ordered.map((g) => [...new Set(g.selector.patterns ?? [])].map(globFor));

  const first = new Int32Array(tags.length).fill(-1);
  const lists: (string[] | undefined)[] = new Array(tags.length);
  const won = new Array<number>(ordered.length).fill(0);
  const hit = new Uint8Array(tags.length);
  const marked: number[] = [];
  ordered.forEach((group, g) => {
    marked.length = 0;
    markMatches(table, group.selector, compiled[g], hit, marked);
    for (const t of marked) {
      if (hit[t] === 0) continue;
      hit[t] = 0;
      if (first[t] < 0) {
        first[t] = g;
        won[g]++;
      }
      (lists[t] ??= []).push(group.name);
    }
  });

  const winner: (string | null)[] = new Array(tags.length);
  const matches: string[][] = new Array(tags.length);
  const unassigned: number[] = [];
  const overlaps: number[] = [];
  for (let t = 0; t < tags.length; t++) {
    winner[t] = first[t] < 0 ? null : ordered[first[t]].name;
    matches[t] = lists[t] ?? [];
    if (first[t] < 0) unassigned.push(t);
    else if (matches[t].length > 1) overlaps.push(t);
  }
  const counts = new Map<string, number>();
  ordered.forEach((group, g) => counts.set(group.name, (counts.get(group.name) ?? 0) + won[g]));
  return { winner, matches, counts, unassigned, overlaps };
}

/**
 * Live preview of one selector while it is edited: how many tags it matches and the first
 * `sampleSize` matching names in the order given. Ignores other groups (see `assignGroups`).
 */
export function previewSelector(
  tags: readonly TagLike[],
  selector: SelectorLike,
  sampleSize = 20,
): { count: number; sample: string[] } {
  const matches = compileSelector(selector);
  const sample: string[] = [];
  let count = 0;
  for (const tag of tags) {
    if (!matches(tag)) continue;
    if (count < sampleSize) sample.push(tag.name);
    count++;
  }
  return { count, sample };
}
