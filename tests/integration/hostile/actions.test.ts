import path from "node:path";
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { presentGateway, presentSite } from "@/lib/data/sites";
import { ACTION_ACCESS } from "@/lib/permissions";
import { Gateway, GatewayToken, Site, User } from "@/models";
import { actAs, createUser } from "../../factories";
import { ACTION_SAMPLES, makeFixture, type Fixture } from "../matrix/samples";
import { BAD_PARAMS, Hostile, bodyCases, fieldCases, fieldPattern, type Case, type Field } from "./harness";

// Hostile input against every server action (ACTION_ACCESS). A server action receives
// whatever the client serialises (React's wire format carries null, undefined, NaN,
// Infinity, -0, BigInt, Date, Map, Set, typed arrays and lone surrogates in text), so
// each gets the hand-picked cases of the JSON routes plus those values, and fast-check's
// fc.anything().

const h = new Hostile("server actions");
const MIN_CASES = 700;
const SLOW = 240_000;

type Result = { ok: boolean; status?: number; error?: string; field?: string; data?: unknown };
type Action = (input: unknown) => Promise<Result>;

let admin: User;
let before: User[];
let fx: Fixture;
const actions: Record<string, Action> = {};

const siteFields = (prefix: string[] = []): Field[] => [
  { path: [...prefix, "name"], type: "text", text: "name", max: 120, required: true },
  { path: [...prefix, "slug"], type: "text", required: true },
  { path: [...prefix, "timeZone"], type: "text", required: true },
  { path: [...prefix, "uplinkBudgetKbps"], type: "number", range: [0.001, 999_999_999], decimals: 3, required: true },
  { path: [...prefix, "storagePricePerGbMonth"], type: "number", range: [0, 1e6], decimals: 4, required: true },
  { path: [...prefix, "retentionMonths"], type: "number", range: [1, 1200], int: true, required: true },
  { path: [...prefix, "defaultHandling"], type: "enum", required: true },
];
const gatewayFields = (prefix: string[] = ["values"]): Field[] => [
  { path: [...prefix, "name"], type: "text", text: "name", max: 120, required: true },
  { path: [...prefix, "slug"], type: "text", required: true },
  { path: [...prefix, "description"], type: "text", text: "text", max: 500 },
  { path: [...prefix, "pollSeconds"], type: "number", range: [5, 86_400], int: true, required: true },
];
/** `values` as a whole is checked by the form's schema: a wrong one is named as its body, an empty object by its first missing field. */
const VALUES = /^values$|^body$|^[a-zA-Z]+$/;
const slugFields = (...names: string[]): Field[] => names.map((n) => ({ path: [n], type: "text", required: true }));

/** What each action stores, in its input's shape, for the round trip of accepted cases. */
const READ_BACK: Record<string, (input: Record<string, unknown>, data: Record<string, unknown>) => Promise<unknown>> = {
  createUserAction: async (_i, d) => (await User.findByPk((d.user as { id: number }).id))?.get({ plain: true }),
  updateUserAction: async (i) => ({ patch: (await User.findByPk(i.id as number))?.get({ plain: true }) }),
  createSiteAction: async (_i, d) => presentSite((await Site.findByPk(d.id as number))!),
  updateSiteAction: async (_i, d) => ({ values: presentSite((await Site.findByPk(d.id as number))!) }),
  createGatewayAction: async (_i, d) => ({ values: presentGateway((await Gateway.findByPk(d.id as number))!) }),
  updateGatewayAction: async (_i, d) => ({ values: presentGateway((await Gateway.findByPk(d.id as number))!) }),
  issueGatewayTokenAction: async (_i, d) => ({ values: (await GatewayToken.findByPk(d.id as number))?.get({ plain: true }) }),
};

/**
 * A user id: every whole number from 1 up is legal, but a legal id names a real user (the
 * demo administrator is 1) whom the case would change. So the legal values tried are ids no
 * user has, and fast-check never replaces one.
 */
const OTHER_USER = { type: "number", range: [2 ** 40, Number.MAX_SAFE_INTEGER], int: true, required: true, noReadBack: true, noFuzz: true } as const satisfies Omit<Field, "path">;

const FIELDS: Record<string, Field[]> = {
  createUserAction: [
    { path: ["email"], type: "text", required: true },
    { path: ["name"], type: "text", text: "name", max: 120, required: true },
    { path: ["role"], type: "enum", required: true },
  ],
  updateUserAction: [
    { path: ["id"], ...OTHER_USER },
    { path: ["patch"], type: "text", required: true },
    { path: ["patch", "name"], type: "text", text: "name", max: 120 },
    { path: ["patch", "role"], type: "enum" },
    { path: ["patch", "active"], type: "boolean" },
  ],
  resetPasswordAction: [{ path: ["id"], ...OTHER_USER }],
  createSiteAction: siteFields(),
  updateSiteAction: [...slugFields("site"), { path: ["values"], type: "text", required: true, reportedAs: VALUES }, ...siteFields(["values"])],
  deleteSiteAction: slugFields("site"),
  createGatewayAction: [...slugFields("site"), { path: ["values"], type: "text", required: true, reportedAs: VALUES }, ...gatewayFields()],
  updateGatewayAction: [...slugFields("site", "gateway"), { path: ["values"], type: "text", required: true, reportedAs: VALUES }, ...gatewayFields()],
  deleteGatewayAction: slugFields("site", "gateway"),
  issueGatewayTokenAction: [
    ...slugFields("site", "gateway"),
    { path: ["values", "label"], type: "text", text: "name", max: 120 },
    { path: ["values", "expiresInDays"], type: "number", range: [1, 3650], int: true, nullable: true, noReadBack: true },
  ],
  revokeGatewayTokenAction: [...slugFields("site", "gateway"), { path: ["tokenId"], type: "number", range: [1, Number.MAX_SAFE_INTEGER], int: true, required: true, noReadBack: true }],
};

/** Values only a server action can receive (React's wire format, not JSON). */
const FLIGHT_VALUES: [string, () => unknown][] = [
  ["undefined", () => undefined],
  ["NaN", () => NaN],
  ["Infinity", () => Infinity],
  ["-0", () => -0],
  ["BigInt 2**64", () => 2n ** 64n],
  ["an invalid Date", () => new Date(NaN)],
  ["a Date", () => new Date(0)],
  ["a Map", () => new Map([["name", "x"]])],
  ["a Set", () => new Set(["x"])],
  ["a Uint8Array", () => new Uint8Array([0, 255])],
  ["a null-prototype object", () => Object.create(null)],
];

/** A case's input: its JSON body, or its raw text read as a JavaScript literal (bare NaN, "\ud800"); null when it has none. */
function inputOf(c: Case, sample: unknown): { input: unknown } | null {
  const r = c.build({ path: "/", body: sample });
  if (r.rawBody === undefined) return { input: r.body };
  try {
    return { input: new Function(`return (${r.rawBody});`)() };
  } catch {
    return null; // prose that is no value at all: nothing an action could receive
  }
}

/**
 * The field an action names: the update actions check `values` (or `patch`) with the form's
 * own schema, so a field there is named as the form names it ("name", not "values.name");
 * a bare NaN reaches an action as a number, so it is refused at its field, not as the body.
 */
function asAction(c: Case): Case {
  if (c.field === "body" && c.category === "non-finite") return { ...c, field: null };
  if (c.field instanceof RegExp) return { ...c, field: new RegExp(c.field.source.replace(/^\^(values|patch)\\\./, "^(?:$1\\.)?")) };
  return c;
}

describe("hostile input: server actions", () => {
  beforeAll(async () => {
    admin = await createUser({ role: "admin" });
    fx = await makeFixture();
    for (const key of Object.keys(ACTION_ACCESS)) {
      const [file, name] = key.split("#");
      const mod = await import(path.resolve("app", file));
      actions[name] = mod[name];
    }
    await actAs(admin);
    // The accounts that were there before (the demo administrator among them) must come out untouched.
    before = await User.findAll({ attributes: ["id", "email", "name", "role", "active", "passwordHash"], order: [["id", "ASC"]], raw: true });
  });

  for (const key of Object.keys(ACTION_ACCESS)) {
    const name = key.split("#")[1];
    it(name, async () => {
      await actAs(admin);
      const fresh = () => ACTION_SAMPLES[key](fx) as Promise<Record<string, unknown>>;
      let sample = await fresh();
      const fields = FIELDS[name];
      expect(fields, `no fields for ${name}`).toBeDefined();
      const run = async (c: Case, input: unknown) => {
        let result: Result | null = null;
        const outcome = await h.action(`${name} · ${c.category} · ${c.label}`, c.category, async () => (result = await actions[name](input)), {
          accept: c.accept,
          field: c.field,
          stored: c.stored,
          readBack: READ_BACK[name] && (async () => READ_BACK[name](input as Record<string, unknown>, ((result as Result | null)?.data ?? {}) as Record<string, unknown>)),
        });
        if (outcome === "accepted") sample = await fresh();
      };

      const hand: Case[] = [
        ...bodyCases().filter((c) => c.category === "wrong root type"),
        // An object of another kind (a Date, a Map) is an object without the fields: any field may be named.
        ...FLIGHT_VALUES.map(([label, v]): Case => ({ category: "wrong root type", label, build: (s) => ({ ...s, body: v() }), field: ["undefined", "NaN", "Infinity", "-0", "BigInt 2**64"].includes(label) ? "body" : null })),
        ...fieldCases(fields),
        ...fields
          .filter((f) => f.type === "number" || f.type === "text")
          .flatMap((f) =>
            FLIGHT_VALUES.filter(([l]) => l !== "undefined" || f.required).map(([label, v]): Case => {
              // -0 is a number like 0: legal where 0 is.
              const legal = label === "-0" && f.type === "number" && (f.range ?? [0, 0])[0] <= 0;
              return {
                category: label === "NaN" || label === "Infinity" ? "non-finite" : "wrong type",
                label: `${f.path.join(".")} = ${label}`,
                build: (s) => ({ ...s, body: setIn(s.body, f.path, v()) }),
                field: legal ? null : (f.reportedAs ?? fieldPattern(f.path)),
                accept: legal ? "may" : "never",
              };
            }),
          ),
        ...fields
          .filter((f) => f.type === "text" && !f.text && ["site", "gateway"].includes(String(f.path[0])))
          .flatMap((f) => BAD_PARAMS.map((v): Case => ({ category: "path param", label: `${f.path.join(".")} = ${JSON.stringify(v.slice(0, 40))}`, build: (s) => ({ ...s, body: setIn(s.body, f.path, v) }), field: null }))),
      ];
      for (const c of hand.map(asAction)) {
        const made = inputOf(c, sample);
        if (made) await run(c, made.input);
      }

      // fast-check: anything at all as the input, then the sample with one field replaced.
      await fc.assert(
        fc.asyncProperty(fc.anything({ withBigInt: true, withDate: true, withMap: true, withSet: true, withTypedArray: true, withNullPrototype: true, withSparseArray: true }).filter(noUserId), async (v) => {
          await run({ category: "fast-check", label: `input ${safe(v)}`, build: (s) => s, accept: "may" }, v);
        }),
        { seed: 700 + Object.keys(ACTION_ACCESS).indexOf(key), numRuns: 25 },
      );
      const fuzzed = fields.filter((f) => !f.noFuzz).map((f) => f.path);
      if (fuzzed.length === 0) return;
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...fuzzed), fc.anything({ withBigInt: true, withDate: true, withMap: true, withSet: true }), async (p, v) => {
          await run({ category: "fast-check", label: `${p.join(".")} = ${safe(v)}`, build: (s) => s, accept: "may" }, setIn(sample, p, v));
        }),
        { seed: 750 + Object.keys(ACTION_ACCESS).indexOf(key), numRuns: 25 },
      );
    }, SLOW);
  }

  it("leaves the accounts that were there before untouched", async () => {
    const now = await User.findAll({ where: { id: before.map((u) => u.id) }, attributes: ["id", "email", "name", "role", "active", "passwordHash"], order: [["id", "ASC"]], raw: true });
    expect(now).toEqual(before);
  });

  it("counts its cases", async () => {
    await actAs(null);
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});

function setIn(o: unknown, p: (string | number)[], v: unknown): unknown {
  const copy: Record<string | number, unknown> = o && typeof o === "object" && !Array.isArray(o) ? { ...(o as object) } : {};
  if (p.length === 1) copy[p[0]] = v;
  else copy[p[0]] = setIn(copy[p[0]], p.slice(1), v);
  return copy;
}

function safe(v: unknown): string {
  try {
    return String(JSON.stringify(v, (_k, x) => (typeof x === "bigint" ? `${x}n` : x))).slice(0, 80);
  } catch {
    return Object.prototype.toString.call(v);
  }
}

/** Nothing that could name a real user: an object with an `id` key is left out. */
function noUserId(v: unknown): boolean {
  return !(v !== null && typeof v === "object" && "id" in v);
}
