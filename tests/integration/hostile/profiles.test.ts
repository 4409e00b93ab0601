import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as createProfileRoute } from "@/app/api/profiles/route";
import { POST as importRoute } from "@/app/api/profiles/import/route";
import { PATCH as archiveRoute } from "@/app/api/profiles/[profileId]/route";
import { POST as revisionRoute } from "@/app/api/profiles/[profileId]/revisions/route";
import { POST as duplicateRoute } from "@/app/api/profiles/[profileId]/duplicate/route";
import { profileToYaml } from "@/lib/profiles/yaml";
import { ProfileRevision, ReductionProfile, type User } from "@/models";
import { createProfile, createUser, profileDocument } from "../../factories";
import { AREAS, Hostile, TEN_MB, bodyCases, fieldCases, paramCases, rowOf, utf16String, type Case, type Field, type RouteSpec, type Sample } from "./harness";

// Hostile input against the profile library: create, new revision, archive, duplicate
// (JSON documents) and the YAML import.

const h = new Hostile("profiles and YAML import");
const MIN_CASES = 700;
const SLOW = 180_000;

let engineer: User;

const step = ["document", "outputs", 0, "steps", 1];
const docFields: Field[] = [
  { path: ["document"], type: "text", required: true, reportedAs: /^document/ },
  { path: ["document", "name"], type: "text", text: "name", max: 80, required: true },
  { path: ["document", "description"], type: "text", text: "text", max: 2000 },
  { path: ["document", "kinds"], type: "list", required: true },
  { path: ["document", "outputs"], type: "list", required: true },
  { path: ["document", "outputs", 0, "name"], type: "text", required: true },
  { path: ["document", "outputs", 0, "steps"], type: "list", required: true },
  { path: [...step, "method"], type: "enum", required: true, reportedAs: /^document\.outputs\.0\.steps\.1/ },
  { path: [...step, "deviation"], type: "text", required: true, reportedAs: /^document\.outputs\.0\.steps\.1\.deviation/ },
  { path: [...step, "deviation", "value"], type: "number", range: [0, Number.MAX_VALUE], required: true, reportedAs: /^document\.outputs\.0\.steps\.1\.deviation/ },
  // A unit is free text here; whether it converts is checked when the profile is assigned.
  { path: [...step, "deviation", "unit"], type: "text", text: "name", max: 32, required: true, mayRefuse: true, reportedAs: /^document\.outputs\.0\.steps\.1\.deviation/ },
  { path: [...step, "max-interval"], type: "number", range: [Number.MIN_VALUE, Number.MAX_VALUE] },
  { path: ["note"], type: "text", text: "text", max: 500 },
];

const latest = async (profileId: number) => {
  const p = await ReductionProfile.findByPk(profileId);
  const r = p && (await ProfileRevision.findOne({ where: { profileId, number: p.latestRevision } }));
  return r && { document: r.document, note: r.note };
};

const fresh = async (body: (doc: ReturnType<typeof profileDocument>) => unknown): Promise<Sample> => {
  const { profile, revision } = await createProfile();
  return { path: "/", params: { profileId: String(profile.id) }, body: body(revision.document as ReturnType<typeof profileDocument>) };
};

describe("hostile input: profiles and the YAML import", () => {
  beforeAll(async () => {
    engineer = await createUser({ role: "engineer" });
  });

  it("covers its share of the write routes", () => {
    expect(AREAS.profiles).toHaveLength(5);
  });

  it("POST /api/profiles", async () => {
    const spec: RouteSpec = {
      key: "POST /api/profiles",
      handler: createProfileRoute,
      user: engineer,
      sample: async () => ({ path: "/api/profiles", body: { document: profileDocument(), note: "hostile" } }),
      readBack: async (_s, res) => latest((res as { id: number }).id),
      fields: docFields,
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases(docFields),
      { category: "wrong type", label: "a step with an unknown parameter", build: (s) => ({ ...s, body: { document: { ...profileDocument(), outputs: [{ name: "x", steps: [{ method: "drop", extra: 1 }] }] } } }), field: /^document\.outputs\.0\.steps\.0/ },
      { category: "wrong type", label: "17 outputs", build: (s) => ({ ...s, body: { document: { ...profileDocument(), outputs: Array.from({ length: 17 }, (_, i) => ({ name: `o${i}`, steps: [{ method: "pass-through" }] })) } } }), field: "document.outputs" },
      { category: "wrong type", label: "an output name twice", build: (s) => ({ ...s, body: { document: { ...profileDocument(), outputs: [0, 1].map(() => ({ name: "same", steps: [{ method: "pass-through" }] })) } } }), field: /^document\.outputs/ },
      { category: "wrong type", label: "a kind twice", build: (s) => ({ ...s, body: { document: { ...profileDocument(), kinds: ["analog", "analog"] } } }), field: /^document\.kinds/ },
      { category: "wrong type", label: "__proto__ key in the document", build: (s) => ({ ...s, body: undefined, rawBody: JSON.stringify(s.body).replace('"name":', '"__proto__":{"polluted":true},"name":') }), field: /^document/ },
      { category: "huge number", label: "percent 1e308", build: (s) => ({ ...s, body: { document: { ...profileDocument(), outputs: [{ name: "s", steps: [{ method: "deadband", deadband: { percent: 1e308 } }] }] } } }), field: /^document\.outputs\.0\.steps\.0\.deadband/ },
      { category: "huge number", label: "lttb points 2**53+1", build: (s) => ({ ...s, body: { document: { ...profileDocument(), outputs: [{ name: "s", steps: [{ method: "lttb", points: 2 ** 53 + 1 }] }] } } }), field: /^document\.outputs\.0\.steps\.0\.points/ },
      { category: "non-finite", label: "aggregate window bare Infinity", build: (s) => ({ ...s, body: undefined, rawBody: JSON.stringify({ document: { ...profileDocument(), outputs: [{ name: "s", steps: [{ method: "aggregate", fn: "mean", window: "__W__" }] }] } }).replace('"__W__"', "Infinity") }), field: "body" },
    ]);
    await h.fuzzRoute(spec, { seed: 301, runs: 40, paths: docFields.map((f) => f.path) });
  }, SLOW);

  it("POST /api/profiles/[profileId]/revisions", async () => {
    // Profile names are unique: the names POST /api/profiles took get a suffix here.
    const fields: Field[] = [
      ...docFields.map((f) => (f.path.join(".") === "document.name" ? { ...f, affix: " (revised)" } : f)),
      { path: ["baseRevision"], type: "number", range: [1, 1], int: true, noReadBack: true },
    ];
    const spec: RouteSpec = {
      key: "POST /api/profiles/[profileId]/revisions",
      handler: revisionRoute,
      user: engineer,
      sample: () => fresh((doc) => ({ document: { ...doc, description: "changed" }, note: "hostile", baseRevision: 1 })),
      readBack: async (s) => latest(Number(s.params!.profileId)),
      watch: async (s) => rowOf("profiles", Number(s.params!.profileId)),
      fields,
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases(fields),
      { category: "wrong type", label: "the latest document unchanged", build: (s) => ({ ...s, body: { ...(s.body as object), document: { ...(s.body as { document: object }).document, description: undefined } } }), field: "document" },
      ...paramCases(["profileId"]),
    ]);
    await h.fuzzRoute(spec, { seed: 302, runs: 40, paths: fields.map((f) => f.path) });
  }, SLOW);

  it("PATCH /api/profiles/[profileId]", async () => {
    const spec: RouteSpec = {
      key: "PATCH /api/profiles/[profileId]",
      handler: archiveRoute,
      user: engineer,
      sample: () => fresh(() => ({ archived: true })),
      watch: async (s) => rowOf("profiles", Number(s.params!.profileId)),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases([{ path: ["archived"], type: "boolean", required: true }]), ...paramCases(["profileId"])]);
    await h.fuzzRoute(spec, { seed: 303, runs: 30 });
  }, SLOW);

  it("POST /api/profiles/[profileId]/duplicate", async () => {
    const spec: RouteSpec = {
      key: "POST /api/profiles/[profileId]/duplicate",
      handler: duplicateRoute,
      user: engineer,
      sample: () => fresh(() => ({ name: `Copy ${Math.random().toString(36).slice(2, 10)}` })),
      readBack: async (_s, res) => ({ name: (await latest((res as { id: number }).id))?.document.name }),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases([{ path: ["name"], type: "text", text: "name", max: 80, required: true, affix: " (copy)", reportedAs: /^name$|^document\.name$/ }]), ...paramCases(["profileId"])]);
    await h.fuzzRoute(spec, { seed: 304, runs: 30 });
  }, SLOW);

  it("POST /api/profiles/import (YAML)", async () => {
    let n = 0;
    const name = () => `Imported ${Date.now().toString(36)}-${++n}`;
    const spec: RouteSpec = {
      key: "POST /api/profiles/import",
      handler: importRoute,
      user: engineer,
      sample: async () => ({ path: "/api/profiles/import", rawBody: profileToYaml(profileDocument({ name: name() })) }),
      readBack: async (_s, res) => latest((res as { id: number }).id),
      renew: false,
    };
    type Doc = ReturnType<typeof profileDocument>;
    /** A file made from a fresh profile's YAML; legal files must store `expected` (default: the profile itself). */
    const yaml = (label: string, text: (y: string, doc: Doc) => string, accept: Case["accept"] = "never", field: Case["field"] = null, expected?: (doc: Doc) => Doc): Case => {
      const doc = profileDocument({ name: name() });
      const body = text(profileToYaml(doc), doc);
      return {
        category: "malformed YAML",
        label,
        build: (s) => ({ ...s, rawBody: body, contentType: "application/yaml" }),
        accept,
        field,
        stored: accept === "never" ? undefined : { path: ["document"], value: expected ? expected(doc) : doc },
      };
    };
    const rename = (to: (doc: Doc) => string) => (y: string, doc: Doc) => y.replace(/^name: .*$/m, `name: ${JSON.stringify(to(doc))}`);
    const renamed = (to: (doc: Doc) => string) => (doc: Doc) => ({ ...doc, name: to(doc) });
    const letter = (i: number) => String.fromCharCode(97 + i);
    const laughs = ['a: &a ["lol","lol","lol","lol","lol","lol","lol","lol","lol"]', ...Array.from({ length: 8 }, (_, i) => `${letter(i + 1)}: &${letter(i + 1)} [${Array(9).fill(`*${letter(i)}`).join(",")}]`)].join("\n");
    const markup = (d: Doc) => `<script>alert(1)</script> ${d.name}`;
    const formula = (d: Doc) => `=cmd|' /C calc'!A0 ${d.name}`;
    const path = (d: Doc) => `../../etc/passwd ${d.name}`;
    const emoji = (d: Doc) => `👨‍👩‍👧‍👦 ${d.name}`;
    await h.route(spec, [
      yaml("an empty file", () => "", "never", "file"),
      yaml("only whitespace", () => "   \n\t\n", "never", "file"),
      yaml("tabs for indentation", (y) => y.replace(/\n  /g, "\n\t")),
      yaml("an unclosed double quote", (y) => y.replace(/^name: (.*)$/m, 'name: "$1')),
      yaml("an unclosed single quote", (y) => y.replace(/^name: (.*)$/m, "name: '$1")),
      yaml("a duplicate key", (y) => `${y}name: twice\n`),
      yaml("a billion laughs (aliases)", () => `sluice: profile/1\n${laughs}\nname: *i\nkinds: [analog]\noutputs: []\n`),
      yaml("a merge key", () => "sluice: profile/1\nbase: &b { name: merged }\n<<: *b\nkinds: [analog]\noutputs: []\n"),
      yaml("a !!js/function tag", (y) => y.replace(/^name: .*$/m, "name: !!js/function 'function () { return 1 }'")),
      yaml("a !!binary tag", (y) => y.replace(/^name: .*$/m, "name: !!binary aGVsbG8=")),
      yaml("a js/undefined tag", (y) => y.replace(/^name: .*$/m, "name: !<tag:yaml.org,2002:js/undefined> ''")),
      yaml("two documents", (y) => `${y}---\n${y}`),
      yaml("a list at the top", (y) => `- ${y.split("\n").join("\n  ")}`),
      yaml("a scalar at the top", () => "just a string", "never", "sluice"),
      yaml("another format version", (y) => y.replace("sluice: profile/1", "sluice: profile/2"), "never", "sluice"),
      yaml("no header", (y) => y.replace("sluice: profile/1\n", ""), "never", "sluice"),
      yaml("deviation .nan", (y) => y.replace(/value: [0-9.]+/, "value: .nan"), "never", /deviation/),
      yaml("deviation .inf", (y) => y.replace(/value: [0-9.]+/, "value: .inf"), "never", /deviation/),
      yaml("deviation 1e400", (y) => y.replace(/value: [0-9.]+/, "value: 1e400"), "never", /deviation/),
      yaml("deviation as a string", (y) => y.replace(/value: [0-9.]+/, 'value: "0.5"'), "never", /deviation/),
      yaml("deviation in hex (YAML 1.2 reads 31)", (y) => y.replace(/value: [0-9.]+/, "value: 0x1F"), "may", null, (d) => JSON.parse(JSON.stringify(d).replace('"value":0.5', '"value":31'))),
      yaml("a lone surrogate escape in a name", (y) => y.replace(/^name: .*$/m, 'name: "a\\ud800b"'), "never", /name|file/),
      yaml("a NUL escape in a name", (y) => y.replace(/^name: .*$/m, 'name: "a\\0b"'), "never", /name|file/),
      yaml("an ESC escape in a name", (y) => y.replace(/^name: .*$/m, 'name: "a\\x1b[31mred"'), "never", /name|file/),
      yaml("a line break escape in a name", (y) => y.replace(/^name: .*$/m, 'name: "a\\nb"'), "never", /name|file/),
      yaml("a raw NUL in a name", (y) => y.replace(/^name: .*$/m, "name: a\u0000b"), "never", /name|file/),
      yaml("an 81-character name", (y) => y.replace(/^name: .*$/m, `name: ${"x".repeat(81)}`), "never", "name"),
      yaml("markup in the name", rename(markup), "must", null, renamed(markup)),
      yaml("a formula as the name", rename(formula), "must", null, renamed(formula)),
      yaml("a path as the name", rename(path), "must", null, renamed(path)),
      yaml("emoji in the name", rename(emoji), "must", null, renamed(emoji)),
      yaml("a BOM", (y) => `\uFEFF${y}`, "must"),
      yaml("CRLF line ends", (y) => y.replace(/\n/g, "\r\n"), "must"),
      yaml("comments", (y) => `# exported by hand\n${y}# trailing comment\n`, "must"),
      yaml("a kind twice", (y) => y.replace(/^kinds: .*$/m, "kinds: [analog, analog]"), "never", /kinds/),
      yaml("deep nesting", () => `${"[".repeat(50_000)}${"]".repeat(50_000)}`),
      yaml("deep nesting in the description", (y) => `${y}description: ${"[".repeat(50_000)}${"]".repeat(50_000)}\n`),
      yaml("an unknown local tag", (y) => y.replace(/^name: (.*)$/m, "name: !custom $1")),
      yaml("17 outputs", (_y, d) => `sluice: profile/1\nname: ${d.name}\nkinds: [analog]\noutputs:\n${"  - { name: o, steps: [{ method: drop }] }\n".repeat(17)}`, "never", /outputs/),
      yaml("a 300 KB file", () => `#${"x".repeat(300 * 1024)}`, "never", "file"),
      yaml("an unknown method", (y) => y.replace("swinging-door", "rm -rf /")),
      yaml("a parameter the method does not take", (y) => y.replace("method: quality-filter, keep: good", "method: pass-through, keep: good")),
      yaml("binary junk", () => "\u0000\u0001\u0002\u00ff\u00fe binary"),
      { category: "10 MB string", label: "a 10 MB file", build: (s) => ({ ...s, rawBody: `${s.rawBody}description: ${TEN_MB}\n` }), field: "file" },
    ]);

    // fast-check: the exported form of a profile with characters inserted or removed anywhere.
    const base = profileToYaml(profileDocument({ name: name() }));
    const mutated = fc
      .tuple(fc.nat(base.length), fc.oneof(utf16String, fc.constantFrom(":", "- ", "&a", "*a", "!!", "{", "[", '"', "'", "\t", "\n", "#", "|", ">", "%YAML 1.1\n")), fc.nat(8))
      .map(([at, insert, cut]) => base.slice(0, at) + insert + base.slice(at + cut));
    await h.fuzzRoute(spec, { seed: 305, runs: 60, paths: [], bodies: mutated, raw: true });
  }, SLOW);

  it("counts its cases", () => {
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});
