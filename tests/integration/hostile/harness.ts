import { isDeepStrictEqual } from "node:util";
import fc from "fast-check";
import { NextRequest } from "next/server";
import { QueryTypes } from "sequelize";
import { expect } from "vitest";
import { ROUTE_ACCESS } from "@/lib/permissions";
import { sequelize, type User } from "@/models";
import { actAs, ctx, sessionCookie } from "../../factories";

// Hostile input against the write routes, uploads and server actions (issue #11 part 2):
// every case must answer 4xx with a JSON `error` (and the field at fault where there is
// one) and leave every table's row count as it was, or — where the input is legitimately
// valid — succeed and store exactly what was sent.

// ---------------------------------------------------------------- which file covers what

/** The write routes (POST/PUT/PATCH/DELETE of ROUTE_ACCESS, next-auth's own excluded), by the hostile file that covers them. */
export const AREAS: Record<string, string[]> = {
  admin: [
    "POST /api/users",
    "PATCH /api/users/[id]",
    "POST /api/users/[id]/password",
    "POST /api/sites",
    "PATCH /api/sites/[site]",
    "DELETE /api/sites/[site]",
    "POST /api/sites/[site]/gateways",
    "PATCH /api/sites/[site]/gateways/[gateway]",
    "DELETE /api/sites/[site]/gateways/[gateway]",
    "POST /api/sites/[site]/gateways/[gateway]/tokens",
    "DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId]",
  ],
  "tags-groups": [
    "POST /api/sites/[site]/tags",
    "DELETE /api/sites/[site]/tags",
    "PATCH /api/sites/[site]/tags/[tagId]",
    "DELETE /api/sites/[site]/tags/[tagId]",
    "POST /api/sites/[site]/tags/import",
    "POST /api/sites/[site]/groups",
    "PATCH /api/sites/[site]/groups/[groupId]",
    "DELETE /api/sites/[site]/groups/[groupId]",
    "PUT /api/sites/[site]/groups/order",
    "POST /api/sites/[site]/groups/preview",
    "POST /api/sites/[site]/draft/discard",
  ],
  profiles: [
    "POST /api/profiles",
    "POST /api/profiles/import",
    "PATCH /api/profiles/[profileId]",
    "POST /api/profiles/[profileId]/revisions",
    "POST /api/profiles/[profileId]/duplicate",
  ],
  changes: [
    "PUT /api/sites/[site]/groups/[groupId]/assignment",
    "DELETE /api/sites/[site]/groups/[groupId]/assignment",
    "POST /api/sites/[site]/changes",
    "POST /api/sites/[site]/changes/[changeId]/approve",
    "POST /api/sites/[site]/changes/[changeId]/reject",
    "POST /api/sites/[site]/changes/[changeId]/release",
    "POST /api/sites/[site]/rollbacks",
    "POST /api/sites/[site]/rollbacks/urgent",
  ],
  samples: ["POST /api/sites/[site]/groups/[groupId]/samples", "DELETE /api/sample-sets/[sampleSetId]"],
  "check-in": ["PUT /api/gateway/v1/check-in"],
};

/** Every write route of the permissions table (what AREAS must cover exactly). */
export function writeRoutes(): string[] {
  return Object.keys(ROUTE_ACCESS)
    .filter((k) => /^(POST|PUT|PATCH|DELETE) /.test(k) && !k.includes("/api/auth/"))
    .sort();
}

// ---------------------------------------------------------------- row counts

let tableNames: string[] | null = null;

/** COUNT(*) of every table of the schema (information_schema.tables), in one round trip. */
export async function countRows(): Promise<Record<string, number>> {
  tableNames ??= (
    await sequelize.query<{ t: string }>(
      "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' ORDER BY table_name",
      { type: QueryTypes.SELECT },
    )
  ).map((r) => r.t);
  const select = tableNames.map((t, i) => `(SELECT COUNT(*) FROM \`${t}\`) AS c${i}`).join(", ");
  const [row] = await sequelize.query<Record<string, number>>(`SELECT ${select}`, { type: QueryTypes.SELECT });
  return Object.fromEntries(tableNames.map((t, i) => [t, Number(row[`c${i}`])]));
}

/** One row as stored (every column), for checking that a refused update left it alone. */
export async function rowOf(table: string, id: number | string): Promise<Record<string, unknown> | null> {
  const rows = await sequelize.query<Record<string, unknown>>(`SELECT * FROM \`${table}\` WHERE id = ?`, { replacements: [id], type: QueryTypes.SELECT });
  return rows[0] ?? null;
}

// ---------------------------------------------------------------- the bad values

export type Category =
  | "not JSON"
  | "wrong root type"
  | "missing field"
  | "wrong type"
  | "huge number"
  | "non-finite"
  | "10 MB string"
  | "unicode"
  | "lone surrogate"
  | "control chars"
  | "formula"
  | "path-like"
  | "markup"
  | "malformed YAML"
  | "malformed CSV"
  | "binary"
  | "path param"
  | "stored data"
  | "database error"
  | "fast-check";

export const TEN_MB = "x".repeat(10 * 1024 * 1024);

export type Payload = { category: Category; label: string; value: string };

/** Text that is odd but legal in free text (a name may well hold it): stored as sent. */
export const ODD_TEXT: Payload[] = [
  { category: "unicode", label: "RTL override and mark", value: "\u202Eevil\u202C \u200Fname" },
  { category: "unicode", label: "zero-width joiner emoji", value: "plant 👩‍🔧👨‍👩‍👧‍👦" },
  { category: "unicode", label: "zero-width space inside", value: "pa\u200Bst\u200Deur" },
  { category: "unicode", label: "combining marks", value: "Z\u0334\u0321\u031Ba\u0338l\u0335g\u0337o\u0336" },
  { category: "unicode", label: "astral letters", value: "𝔖𝔩𝔲𝔦𝔠𝔢 🚰 🐄" },
  { category: "unicode", label: "CJK and Arabic", value: "東京工場 مصنع" },
  { category: "formula", label: "DDE command", value: "=cmd|' /C calc'!A0" },
  { category: "formula", label: "plus", value: "+1+1" },
  { category: "formula", label: "at-SUM", value: "@SUM(1)" },
  { category: "formula", label: "hyperlink", value: '=HYPERLINK("http://evil.invalid","x")' },
  { category: "path-like", label: "dot-dot", value: "../../etc/passwd" },
  { category: "path-like", label: "Windows", value: "C:\\Windows\\System32" },
  { category: "path-like", label: "encoded dot-dot", value: "%2e%2e%2f%2e%2e%2f" },
  { category: "path-like", label: "UNC", value: "\\\\server\\share\\x" },
  { category: "markup", label: "script", value: "<script>alert(1)</script>" },
  { category: "markup", label: "img onerror", value: '<img src=x onerror="alert(1)">' },
  { category: "markup", label: "template", value: "{{7*7}} ${7*7}" },
  { category: "markup", label: "SQL", value: "'; DROP TABLE users; --" },
];

/** Line breaks and tabs: legal in free text, not in a one-line name. */
export const LINE_TEXT: Payload[] = [
  { category: "control chars", label: "line feed", value: "line one\nline two" },
  { category: "control chars", label: "tab", value: "a\tb" },
  { category: "control chars", label: "CR LF", value: "a\r\nb" },
];

/** Control characters that are legal nowhere. */
export const CONTROL_TEXT: Payload[] = [
  { category: "control chars", label: "NUL", value: "a\u0000b" },
  { category: "control chars", label: "ESC sequence", value: "a\u001b[31mred" },
  { category: "control chars", label: "BEL", value: "bell\u0007" },
  { category: "control chars", label: "DEL", value: "a\u007fb" },
  { category: "control chars", label: "C1 NEL", value: "a\u0085b" },
];

/** Lone surrogates, only expressible as JSON escapes (so sent through rawBody). */
export const LONE_SURROGATES: { label: string; json: string }[] = [
  { label: "high surrogate alone", json: '"a\\ud800b"' },
  { label: "low surrogate alone", json: '"\\udfffz"' },
  { label: "pair reversed", json: '"\\udc00\\ud800"' },
];

export const HUGE_NUMBERS: { label: string; value: number }[] = [
  { label: "1e308", value: 1e308 },
  { label: "-1e308", value: -1e308 },
  { label: "2**53+1", value: 2 ** 53 + 1 },
  { label: "2**32", value: 2 ** 32 },
  { label: "-1", value: -1 },
  { label: "0.5", value: 0.5 },
  { label: "5e-324", value: 5e-324 },
];

export const NON_FINITE_STRINGS = ["NaN", "Infinity", "-Infinity"];
export const NON_FINITE_TOKENS = ["NaN", "Infinity", "-Infinity"];

export const NOT_JSON: { label: string; raw: string }[] = [
  { label: "prose", raw: "{not json" },
  { label: "truncated", raw: '{"a":' },
  { label: "trailing comma", raw: '{"a":1,}' },
  { label: "single quotes", raw: "{'a':1}" },
  { label: "NUL byte", raw: "\u0000" },
];

export const WRONG_ROOTS: { label: string; value: unknown }[] = [
  { label: "array", value: [] },
  { label: "null", value: null },
  { label: "number", value: 42 },
  { label: "string", value: "body" },
  { label: "boolean", value: true },
];

/** Path parameters that name nothing (ids and slugs alike). */
export const BAD_PARAMS = [
  "abc",
  "-1",
  "0",
  "1.5",
  "1e308",
  "9007199254740993",
  "4294967296",
  "NaN",
  "Infinity",
  "../../etc/passwd",
  "%2e%2e%2f",
  "C:\\Windows",
  "<script>alert(1)</script>",
  "' OR 1=1 --",
  "a\u0000b",
  "x".repeat(10_000),
];

/**
 * The field a refusal of a bad path parameter names: the record's word, as its 404 does
 * ("group" for groupId); a slug or other parameter by its own name.
 */
const PARAM_FIELDS: Record<string, string> = { profileId: "profile", changeId: "change", groupId: "group", tagId: "tag", sampleSetId: "sampleSet", number: "release" };

/** Path parameter cases: each parameter in turn names nothing, and the refusal names it. */
export function paramCases(names: string[]): Case[] {
  return names.flatMap((name) =>
    BAD_PARAMS.map((v): Case => ({
      category: "path param",
      label: `${name} = ${JSON.stringify(v.slice(0, 40))}`,
      build: (s) => ({ ...s, params: { ...s.params, [name]: v } }),
      field: PARAM_FIELDS[name] ?? name,
    })),
  );
}

// ---------------------------------------------------------------- legality of text

/** No unpaired UTF-16 surrogate (String.prototype.isWellFormed, which this TypeScript target does not declare). */
export const wellFormed = (s: string) => !/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(s);

const ANY_CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
const HARD_CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

/**
 * How a text field takes odd text: a one-line `name` takes any well-formed Unicode
 * without control characters; free `text` also takes line breaks and tabs; anything
 * else (slugs, e-mail, enums, ids, digests…) takes none of the catalogue.
 */
export type TextKind = "name" | "text" | "strict";

export function legalText(kind: TextKind, value: string, max: number): boolean {
  if (kind === "strict") return false;
  // Lengths count characters (code points), as zod and the database do, not UTF-16 units.
  if (!wellFormed(value) || [...value].length > max || value.trim() !== value) return false;
  if (kind === "name") return value.length > 0 && !ANY_CONTROL.test(value);
  return !HARD_CONTROL.test(value);
}

// ---------------------------------------------------------------- fields and cases

export type Field = {
  /** Path into the body, e.g. ["selector", "patterns"]. */
  path: (string | number)[];
  type: "text" | "number" | "boolean" | "list" | "enum";
  required?: boolean;
  nullable?: boolean;
  /** Text: how odd text is taken, and the most characters. */
  text?: TextKind;
  max?: number;
  /** A list whose items are text of this kind (the catalogue goes in as a one-item list). */
  items?: TextKind;
  /** Numbers: the legal range and whether only whole numbers are legal. */
  range?: [number, number];
  int?: boolean;
  /** Numbers stored in a DECIMAL column: kept to this many decimals. */
  decimals?: number;
  /** The field the error names, when not the path (e.g. "body" for a union). */
  reportedAs?: string | RegExp;
  /** Skip the round-trip check (the route does not give the value back). */
  noReadBack?: boolean;
  /** Legal text may still be refused (a glob pattern with odd syntax); when accepted it is stored exactly. */
  mayRefuse?: boolean;
  /** Appended to each catalogue text, where the value must be unique across the store (profile names). */
  affix?: string;
  /** Not replaced by fast-check: any legal value would act on a real record (another user's id). */
  noFuzz?: boolean;
};

export type Req = {
  path?: string;
  params?: Record<string, string>;
  body?: unknown;
  rawBody?: string;
  binaryBody?: ArrayBuffer;
  contentType?: string;
  headers?: Record<string, string>;
  /** Send no body at all. */
  noBody?: boolean;
};

export type Sample = Req & { path: string };

export type Case = {
  category: Category;
  label: string;
  build: (s: Sample) => Req;
  /** The field a refusal must name; null: no particular field. */
  field?: string | RegExp | null;
  /** never: must be refused; may: legal input, refused or stored exactly; must: legal input, stored exactly. */
  accept?: "never" | "may" | "must";
  /** For accepted cases: the value that must be stored at this path of readBack. */
  stored?: { path: (string | number)[]; value: unknown };
};

export type RouteSpec = {
  key: string;
  handler: (req: Request, c: never) => Promise<Response>;
  user: User;
  /** A valid request (fresh records where the route consumes them). */
  sample: () => Promise<Sample>;
  fields?: Field[];
  /** The stored entity after an accepted case, in the body's field names (given the request that was sent). */
  readBack?: (s: Sample, response: unknown, sent: Req) => Promise<unknown>;
  /** Rows the route would change in place; compared before and after a refusal. */
  watch?: (s: Sample) => Promise<unknown>;
  /** A new sample after each accepted case (default); false keeps the sample. */
  renew?: boolean;
};

export const getPath = (o: unknown, path: (string | number)[]): unknown => path.reduce<unknown>((v, k) => (v as Record<string | number, unknown> | undefined)?.[k], o);

export function setPath<T>(o: T, path: (string | number)[], value: unknown): T {
  const copy = structuredClone(o) as Record<string | number, unknown>;
  let cur = copy;
  for (const k of path.slice(0, -1)) {
    cur[k] = cur[k] && typeof cur[k] === "object" ? cur[k] : {};
    cur = cur[k] as Record<string | number, unknown>;
  }
  cur[path[path.length - 1]] = value;
  return copy as T;
}

export function deletePath<T>(o: T, path: (string | number)[]): T {
  const copy = structuredClone(o) as Record<string | number, unknown>;
  const parent = getPath(copy, path.slice(0, -1)) as Record<string | number, unknown> | undefined;
  if (parent) delete parent[path[path.length - 1]];
  return copy as T;
}

/** The body as JSON text with the field replaced by a raw token (NaN, Infinity, "\ud800"…). */
export function withRawToken(body: unknown, path: (string | number)[], token: string): string {
  const marker = "\u0001RAW\u0001";
  return JSON.stringify(setPath(body, path, marker)).replace(JSON.stringify(marker), token);
}

const dotted = (path: (string | number)[]) => path.join(".");

/** What a column keeps of a number: DECIMAL columns round to their scale. */
export function storedNumber(value: number, decimals?: number): number {
  if (decimals === undefined) return value;
  const scale = 10 ** decimals;
  return Math.round(value * scale) / scale + 0;
}

/** The field a refusal names for a path, written a.0.b or a[0].b, or a field inside it. */
export function fieldPattern(path: (string | number)[]): RegExp {
  const esc = (x: string) => x.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  const parts = path.map((seg, i) => (typeof seg === "number" ? `(?:\\.${seg}|\\[${seg}\\])` : `${i ? "\\." : ""}${esc(seg)}`));
  return new RegExp(`^${parts.join("")}(?:\\.|\\[|$)`);
}

/** Not JSON and JSON of the wrong root type. */
export function bodyCases(opts: { field?: string | RegExp | null } = {}): Case[] {
  const field = opts.field === undefined ? "body" : opts.field;
  return [
    ...NOT_JSON.map((n): Case => ({ category: "not JSON", label: n.label, build: (s) => ({ ...s, body: undefined, rawBody: n.raw }), field })),
    ...WRONG_ROOTS.map((w): Case => ({ category: "wrong root type", label: w.label, build: (s) => ({ ...s, body: w.value }), field })),
  ];
}

/** Every hand-picked case for each field of a JSON body. */
export function fieldCases(fields: Field[]): Case[] {
  const cases: Case[] = [];
  let tenMegabytes = false;
  for (const f of fields) {
    const name = dotted(f.path);
    const field = f.reportedAs ?? fieldPattern(f.path);
    const put = (value: unknown) => (s: Sample): Req => ({ ...s, body: setPath(s.body, f.path, value) });
    const raw = (token: string) => (s: Sample): Req => ({ ...s, body: undefined, rawBody: withRawToken(s.body, f.path, token) });
    const stored = (value: unknown) => (f.noReadBack ? undefined : { path: f.path, value });
    if (f.required) cases.push({ category: "missing field", label: name, build: (s) => ({ ...s, body: deletePath(s.body, f.path) }), field });

    const wrong: unknown[] =
      f.type === "text" ? [42, true, [], {}] : f.type === "number" ? ["abc", true, false, [], {}, ""] : f.type === "boolean" ? ["true", 1, 0, "yes", []] : f.type === "enum" ? [42, true, [], {}, "", "NOT-A-CHOICE"] : ["x", 42, true, {}];
    if (!f.nullable) wrong.push(null);
    for (const v of wrong) cases.push({ category: "wrong type", label: `${name} = ${JSON.stringify(v)}`, build: put(v), field });

    if (f.type === "number") {
      const [lo, hi] = f.range ?? [-Infinity, Infinity];
      const edges = [
        ...(Number.isFinite(hi) ? [{ label: "the largest legal", value: hi }, { label: "just past the largest", value: f.int ? hi + 1 : hi * 1.000001 + 1e-9 }] : []),
        ...(Number.isFinite(lo) && lo > Number.MIN_VALUE ? [{ label: "the smallest legal", value: lo }, { label: "just below the smallest", value: f.int ? lo - 1 : lo - Math.max(Math.abs(lo) * 1e-6, 1e-9) }] : []),
      ];
      for (const h of [...HUGE_NUMBERS, ...edges]) {
        const legal = h.value >= lo && h.value <= hi && (!f.int || Number.isSafeInteger(h.value));
        cases.push({ category: "huge number", label: `${name} = ${h.label}`, build: put(h.value), field: legal ? null : field, accept: legal ? "may" : "never", stored: stored(storedNumber(h.value, f.decimals)) });
      }
      for (const v of NON_FINITE_STRINGS) cases.push({ category: "non-finite", label: `${name} = "${v}"`, build: put(v), field });
      for (const t of NON_FINITE_TOKENS) cases.push({ category: "non-finite", label: `${name} = bare ${t}`, build: raw(t), field: "body" });
    }

    const textKind = f.type === "text" ? (f.text ?? "strict") : f.type === "list" && f.items ? f.items : null;
    if (textKind) {
      const wrap = (v: string) => (f.type === "list" ? [v] : v);
      const max = f.max ?? Infinity;
      for (const payload of [...ODD_TEXT, ...LINE_TEXT, ...CONTROL_TEXT]) {
        const p = { ...payload, value: payload.value + (f.affix ?? "") };
        const legal = legalText(textKind, p.value, max);
        const accept = legal ? (f.mayRefuse ? "may" : "must") : "never";
        cases.push({ category: p.category, label: `${name} = ${JSON.stringify(p.value)}`, build: put(wrap(p.value)), field: legal ? null : field, accept, stored: legal ? stored(wrap(p.value)) : undefined });
      }
      // Long text: the longest legal in astral letters (two UTF-16 units each, one character to
      // zod and the database) and one past it in combining marks; 10 MB in the first text field.
      if (Number.isFinite(max) && textKind !== "strict") {
        const longest = "𝔖".repeat(max - [...(f.affix ?? "")].length) + (f.affix ?? "");
        const legal = legalText(textKind, longest, max);
        cases.push({ category: "unicode", label: `${name} = ${max} astral letters`, build: put(wrap(longest)), field: legal ? null : field, accept: legal ? (f.mayRefuse ? "may" : "must") : "never", stored: legal ? stored(wrap(longest)) : undefined });
        cases.push({ category: "unicode", label: `${name} = ${max + 1} characters of combining marks`, build: put(wrap(`a${"\u0301".repeat(max)}`)), field });
      }
      if (!tenMegabytes) cases.push({ category: "10 MB string", label: name, build: put(wrap(TEN_MB)), field });
      tenMegabytes = true;
      for (const l of LONE_SURROGATES) {
        cases.push({ category: "lone surrogate", label: `${name}: ${l.label}`, build: raw(f.type === "list" ? `[${l.json}]` : l.json), field });
      }
    }
  }
  return cases;
}

// ---------------------------------------------------------------- running cases

type Tally = Record<string, { refused: number; accepted: number }>;

/** A request to a route handler as the user, with any body and content type. */
export async function send(method: string, user: User | null, r: Req): Promise<Request> {
  const headers = new Headers(r.headers);
  const cookie = await sessionCookie(user);
  if (cookie) headers.set("cookie", cookie);
  let body: string | ArrayBuffer | undefined;
  if (!r.noBody) {
    if (r.binaryBody !== undefined) body = r.binaryBody;
    else if (r.rawBody !== undefined) body = r.rawBody;
    else if (r.body !== undefined) body = JSON.stringify(r.body);
  }
  if (body !== undefined && !headers.has("content-type")) headers.set("content-type", r.contentType ?? (r.binaryBody !== undefined ? "application/octet-stream" : "application/json"));
  return new NextRequest(new URL(r.path ?? "/", "http://127.0.0.1"), { method, headers, body });
}

/** Runs cases and keeps the count per category; every check is soft so one run lists every defect. */
export class Hostile {
  readonly tally: Tally = {};
  readonly accepted: string[] = [];

  constructor(readonly area: string) {}

  private count(category: Category, outcome: "refused" | "accepted") {
    this.tally[category] ??= { refused: 0, accepted: 0 };
    this.tally[category][outcome]++;
  }

  get total(): number {
    return Object.values(this.tally).reduce((n, t) => n + t.refused + t.accepted, 0);
  }

  /** Runs the cases against one route, renewing the sample after each accepted case. */
  async route(spec: RouteSpec, cases: Case[]): Promise<void> {
    let sample = await spec.sample();
    for (const c of cases) {
      const outcome = await this.routeCase(spec, sample, c);
      if (outcome === "accepted" && spec.renew !== false) sample = await spec.sample();
    }
  }

  /** One case; returns whether it was refused or accepted. */
  async routeCase(spec: RouteSpec, sample: Sample, c: Case): Promise<"refused" | "accepted"> {
    const method = spec.key.split(" ")[0];
    const r = c.build(sample);
    const before = await countRows();
    const watched = spec.watch ? await spec.watch(sample) : undefined;
    const res = await spec.handler(await send(method, spec.user, r), ctx(r.params ?? {}) as never);
    const text = await res.text();
    const label = `${spec.key} · ${c.category} · ${c.label} → ${res.status} ${text.slice(0, 300)}`;
    expect.soft(res.status, label).toBeLessThan(500);
    if (res.status >= 400) {
      await this.checkRefusal(label, text, c, before);
      if (spec.watch) expect.soft(await spec.watch(sample), `${label}: the target rows changed`).toEqual(watched);
      this.count(c.category, "refused");
      return "refused";
    }
    expect.soft(c.accept ?? "never", `${label}: accepted bad input`).not.toBe("never");
    if (c.stored && spec.readBack) {
      const stored = await spec.readBack(sample, text ? JSON.parse(text) : null, r);
      expect.soft(getPath(stored, c.stored.path), `${label}: stored value differs`).toEqual(c.stored.value);
    }
    this.count(c.category, "accepted");
    this.accepted.push(label.split(" → ")[0]);
    return "accepted";
  }

  private async checkRefusal(label: string, text: string, c: Case, before: Record<string, number>) {
    let json: { error?: unknown; field?: unknown } | null = null;
    try {
      json = JSON.parse(text);
    } catch {
      /* checked below */
    }
    expect.soft(json, `${label}: not a JSON answer`).toBeTypeOf("object");
    expect.soft(json?.error, `${label}: no error message`).toEqual(expect.any(String));
    if (c.field) expect.soft(json?.field, `${label}: names the wrong field`).toEqual(c.field instanceof RegExp ? expect.stringMatching(c.field) : c.field);
    expect.soft(c.accept, `${label}: refused legal input`).not.toBe("must");
    const after = await countRows();
    expect.soft(changedTables(before, after), `${label}: rows written`).toEqual([]);
  }

  /** A server action case: the same rules on its { ok, status, error, field } result. */
  async action(label: string, category: Category, run: () => Promise<unknown>, c: Omit<Case, "build" | "category" | "label"> & { readBack?: () => Promise<unknown> } = {}): Promise<"refused" | "accepted"> {
    const before = await countRows();
    let result: { ok?: boolean; status?: number; error?: unknown; field?: unknown; data?: unknown };
    try {
      result = (await run()) as typeof result;
    } catch (e) {
      expect.soft(String(e), `${label}: the action threw`).toBe("no exception");
      this.count(category, "refused");
      return "refused";
    }
    const full = `${label} → ${JSON.stringify(result).slice(0, 300)}`;
    if (!result.ok) {
      expect.soft(result.status, `${full}: status`).toBeGreaterThanOrEqual(400);
      expect.soft(result.status, `${full}: status`).toBeLessThan(500);
      await this.checkRefusal(full, JSON.stringify(result), { category, label, build: (s) => s, ...c }, before);
      this.count(category, "refused");
      return "refused";
    }
    expect.soft(c.accept ?? "never", `${full}: accepted bad input`).not.toBe("never");
    if (c.stored && c.readBack) expect.soft(getPath(await c.readBack(), c.stored.path), `${full}: stored value differs`).toEqual(c.stored.value);
    this.count(category, "accepted");
    this.accepted.push(label);
    return "accepted";
  }

  /** fast-check: whole bodies from `bodies`, then the sample with one field replaced by an odd value. */
  async fuzzRoute(spec: RouteSpec, opts: { seed: number; runs: number; paths?: (string | number)[][]; bodies?: fc.Arbitrary<unknown>; raw?: boolean }): Promise<void> {
    let sample = await spec.sample();
    const method = spec.key.split(" ")[0];
    const one = async (r: Req, what: string, path?: (string | number)[], sent?: unknown) => {
      const before = await countRows();
      const watched = spec.watch ? await spec.watch(sample) : undefined;
      const res = await spec.handler(await send(method, spec.user, r), ctx(r.params ?? {}) as never);
      const text = await res.text();
      const label = `${spec.key} · fast-check · ${what} → ${res.status} ${text.slice(0, 200)}`;
      expect(res.status, label).toBeLessThan(500);
      if (res.status >= 400) {
        const json = JSON.parse(text);
        expect(json.error, label).toEqual(expect.any(String));
        expect(changedTables(before, await countRows()), `${label}: rows written`).toEqual([]);
        if (spec.watch) expect(await spec.watch(sample), `${label}: the target rows changed`).toEqual(watched);
        this.count("fast-check", "refused");
        return;
      }
      if (path && spec.readBack) {
        const stored = getPath(await spec.readBack(sample, text ? JSON.parse(text) : null, r), path);
        // Text is stored trimmed where the schema trims, numbers to the column's scale; anything else exactly.
        const field = spec.fields?.find((f) => dotted(f.path) === dotted(path));
        const expected = typeof sent === "string" ? [sent, sent.trim()] : typeof sent === "number" ? [storedNumber(sent, field?.decimals)] : [sent];
        // An optional text left blank is stored as none.
        if (field?.nullable && typeof sent === "string" && sent.trim() === "") expected.push(null);
        expect(expected, `${label}: stored ${JSON.stringify(stored)}`).toContainEqual(stored);
      }
      this.count("fast-check", "accepted");
      this.accepted.push(label.split(" → ")[0]);
      if (spec.renew !== false) sample = await spec.sample();
    };
    await fc.assert(
      fc.asyncProperty(opts.bodies ?? fc.oneof(fc.anything(), fc.object(), fc.jsonValue()), async (body) => {
        const raw = opts.raw ? String(body) : JSON.stringify(body);
        await one({ ...sample, body: undefined, rawBody: raw ?? "" }, `body ${JSON.stringify(String(raw).slice(0, 80))}`);
      }),
      { seed: opts.seed, numRuns: opts.runs, endOnFailure: true },
    );
    const paths = opts.paths ?? Object.keys((sample.body as object) ?? {}).map((k) => [k]);
    if (paths.length === 0) return;
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...paths), oddValue, async (path, value) => {
        const sent = JSON.parse(JSON.stringify({ v: value })).v;
        await one({ ...sample, body: setPath(sample.body, path, value) }, `${dotted(path)} = ${JSON.stringify(value)?.slice(0, 80)}`, path, sent);
      }),
      { seed: opts.seed + 1, numRuns: opts.runs, endOnFailure: true },
    );
  }

  /** Prints the counts and returns the total. */
  summary(): number {
    const rows = Object.entries(this.tally).map(([category, t]) => ({ category, refused: t.refused, accepted: t.accepted, total: t.refused + t.accepted }));
    console.log(`hostile input · ${this.area}: ${this.total} cases`);
    console.table(rows);
    if (this.accepted.length) console.log(`accepted as legal (${this.accepted.length}):\n  ${this.accepted.slice(0, 400).join("\n  ")}`);
    return this.total;
  }
}

export function changedTables(before: Record<string, number>, after: Record<string, number>): string[] {
  return Object.keys({ ...before, ...after })
    .filter((t) => before[t] !== after[t])
    .map((t) => `${t}: ${before[t]} → ${after[t]}`);
}

// ---------------------------------------------------------------- fast-check values

/** Strings of any UTF-16 code units, lone surrogates and controls included. */
export const utf16String = fc.string({ unit: fc.integer({ min: 0, max: 0xffff }).map((c) => String.fromCharCode(c)), maxLength: 40 });

/** An odd value for one field: wrong types, extreme numbers, odd text, nested junk. */
export const oddValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.double(),
  fc.integer(),
  fc.constantFrom(1e308, -1e308, 2 ** 53 + 1, -0, 5e-324, Number.MAX_SAFE_INTEGER),
  fc.string({ unit: "grapheme", maxLength: 40 }),
  utf16String,
  fc.constantFrom(...[...ODD_TEXT, ...CONTROL_TEXT].map((p) => p.value), "NaN", "Infinity", "", " ", "null", "true", "0x10", "1e3"),
  fc.array(fc.anything({ maxDepth: 1 }), { maxLength: 3 }),
  fc.object({ maxDepth: 1 }),
);

/** Signs in as the user for server actions. */
export const signIn = (user: User) => actAs(user);

export { isDeepStrictEqual };
