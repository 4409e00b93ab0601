import { describe, expect, it } from "vitest";
import { GET as listRoute, POST as createRoute } from "@/app/api/profiles/route";
import { POST as importRoute } from "@/app/api/profiles/import/route";
import { GET as getRoute, PATCH as patchRoute } from "@/app/api/profiles/[profileId]/route";
import { POST as reviseRoute } from "@/app/api/profiles/[profileId]/revisions/route";
import { GET as revisionRoute } from "@/app/api/profiles/[profileId]/revisions/[revision]/route";
import { GET as diffRoute } from "@/app/api/profiles/[profileId]/diff/route";
import { POST as duplicateRoute } from "@/app/api/profiles/[profileId]/duplicate/route";
import { GET as exportRoute } from "@/app/api/profiles/[profileId]/export/route";
import { AuditEvent, ProfileRevision } from "@/models";
import { createUser, ctx, profileDocument, request } from "../factories";

const json = async (res: Response) => ({ status: res.status, body: await res.json() });

describe("profile library API", () => {
  it("creates, revises, diffs, duplicates, archives and exports a profile; every write audited", async () => {
    const engineer = await createUser({ role: "engineer" });
    const doc = profileDocument({ name: `Shape ${Date.now()}` });
    const created = await json(await createRoute(await request("POST", "/api/profiles", { user: engineer, body: { document: doc, note: "first" } }), undefined));
    expect(created).toMatchObject({ status: 201, body: { revision: 1 } });
    const id = String(created.body.id);

    // Every save is a new revision with who, when and note.
    const changed = structuredClone(doc);
    (changed.outputs[0].steps[1] as { deviation: unknown }).deviation = { value: 0.2, unit: "degC" };
    const rev2 = await json(await reviseRoute(await request("POST", "/", { user: engineer, body: { document: changed, note: "tighter", baseRevision: 1 } }), ctx({ profileId: id })));
    expect(rev2).toMatchObject({ status: 201, body: { revision: 2 } });

    // A stale editor is refused instead of silently overwriting revision 2.
    const stale = await json(await reviseRoute(await request("POST", "/", { user: engineer, body: { document: doc, baseRevision: 1 } }), ctx({ profileId: id })));
    expect(stale).toMatchObject({ status: 409, body: { field: "baseRevision" } });
    // Saving the same document again is not a revision.
    const same = await json(await reviseRoute(await request("POST", "/", { user: engineer, body: { document: changed } }), ctx({ profileId: id })));
    expect(same).toMatchObject({ status: 422, body: { field: "document" } });

    const detail = await json(await getRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: id })));
    expect(detail.body).toMatchObject({ latestRevision: 2, outputs: ["shape"], lossy: true, kinds: ["analog"] });
    expect(detail.body.revisions.map((r: { number: number; note: string; createdBy: string }) => [r.number, r.note, r.createdBy])).toEqual([
      [2, "tighter", engineer.name],
      [1, "first", engineer.name],
    ]);

    const r1 = await json(await revisionRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: id, revision: "1" })));
    expect(r1.body.document).toEqual(doc);

    const diff = await json(await diffRoute(await request("GET", `/api/profiles/${id}/diff?from=1&to=2`, { user: engineer }), ctx({ profileId: id })));
    expect(diff.body.summary).toEqual(['Output "shape" step 2 (swinging-door): deviation 0.5 degC → 0.2 degC']);
    expect(diff.body.lines.filter((l: { added?: boolean }) => l.added).map((l: { value: string }) => l.value).join("")).toContain("0.2");
    expect(diff.body.lines.filter((l: { removed?: boolean }) => l.removed).map((l: { value: string }) => l.value).join("")).toContain("0.5");

    const dup = await json(await duplicateRoute(await request("POST", "/", { user: engineer, body: { name: `${doc.name} copy` } }), ctx({ profileId: id })));
    expect(dup.status).toBe(201);
    const dupRev = await ProfileRevision.findOne({ where: { profileId: dup.body.id, number: 1 } });
    expect(dupRev!.document).toEqual({ ...changed, name: `${doc.name} copy` });
    expect(dupRev!.note).toBe(`Copied from "${doc.name}" revision 2`);

    const archived = await json(await patchRoute(await request("PATCH", "/", { user: engineer, body: { archived: true } }), ctx({ profileId: id })));
    expect(archived.body).toEqual({ id: Number(id), archived: true });
    const active = await json(await listRoute(await request("GET", `/api/profiles?q=${encodeURIComponent(doc.name)}`, { user: engineer }), undefined));
    expect(active.body.profiles.map((p: { name: string }) => p.name)).toEqual([`${doc.name} copy`]);
    const all = await json(await listRoute(await request("GET", `/api/profiles?status=all&q=${encodeURIComponent(doc.name)}`, { user: engineer }), undefined));
    expect(all.body.profiles.map((p: { name: string; archived: boolean }) => [p.name, p.archived])).toEqual([
      [doc.name, true],
      [`${doc.name} copy`, false],
    ]);

    const exported = await exportRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: id }));
    expect(exported.headers.get("content-type")).toContain("application/yaml");
    expect(exported.headers.get("content-disposition")).toMatch(/\.r2\.profile\.yaml"$/);
    const text = await exported.text();
    expect(text).toMatch(/^sluice: profile\/1/m);

    const actions = (await AuditEvent.findAll({ where: { entityType: "profile", entityId: [Number(id), dup.body.id] }, order: [["id", "ASC"]] })).map((e) => e.action);
    expect(actions).toEqual(["profile.create", "profile.revise", "profile.create", "profile.archive"]);
  });

  it("imports YAML: new profile, new revision, unchanged; errors name the path and line", async () => {
    const engineer = await createUser({ role: "engineer" });
    const name = `Imported ${Date.now()}`;
    const yaml = (deviation: number) =>
      [
        "sluice: profile/1",
        `name: ${name}`,
        "kinds: [analog]",
        "outputs:",
        "  - name: shape",
        "    steps:",
        `      - { method: swinging-door, deviation: { value: ${deviation}, unit: degC } }`,
        "",
      ].join("\n");
    const post = async (text: string) => json(await importRoute(await request("POST", "/api/profiles/import", { user: engineer, rawBody: text }), undefined));
    const first = await post(yaml(0.5));
    expect(first).toMatchObject({ status: 201, body: { outcome: "created", revision: 1 } });
    expect(await post(yaml(0.5))).toMatchObject({ status: 200, body: { outcome: "unchanged", revision: 1 } });
    expect(await post(yaml(0.4))).toMatchObject({ status: 200, body: { outcome: "revised", revision: 2, id: first.body.id } });

    const bad = await post(yaml(0.5).replace("unit: degC", "unit: degC, extra: 1"));
    expect(bad.status).toBe(422);
    expect(bad.body.field).toMatch(/^outputs\[0\]\.steps\[0\]\.deviation/);
    expect(bad.body.error).toContain("line 7");
    const negative = await post(yaml(-1));
    expect(negative.status).toBe(422);
    expect(negative.body.field).toMatch(/^outputs\[0\]\.steps\[0\]\.deviation/);
    expect((await post("sluice: something-else\nname: x\n")).status).toBe(422);
    expect((await post("name: [unclosed\n")).body.error).toMatch(/line \d+/);
  });

  it("refuses bad documents with 422 naming the field, and unknown ids with 404", async () => {
    const engineer = await createUser({ role: "engineer" });
    const doc = profileDocument();
    const post = async (document: unknown) => json(await createRoute(await request("POST", "/api/profiles", { user: engineer, body: { document } }), undefined));
    const noUnit = structuredClone(doc) as unknown as { outputs: { steps: Record<string, unknown>[] }[] };
    noUnit.outputs[0].steps[1].deviation = { value: 0.5 };
    const r1 = await post(noUnit);
    expect(r1.status).toBe(422);
    expect(r1.body.field).toMatch(/^document\.outputs\.0\.steps\.1\.deviation/);
    const wrongKind = { ...doc, kinds: ["discrete"] };
    const r2 = await post(wrongKind);
    expect(r2.status).toBe(422);
    expect(r2.body.error).toMatch(/swinging-door does not suit discrete/i);
    const dupOutputs = { ...doc, outputs: [doc.outputs[0], doc.outputs[0]] };
    expect((await post(dupOutputs)).status).toBe(422);
    // The name is unique across the library.
    expect((await post(doc)).status).toBe(201);
    expect(await post(doc)).toMatchObject({ status: 409, body: { field: "name" } });
    expect((await getRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: "999999" }))).status).toBe(404);
    expect((await revisionRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: "999999", revision: "1" }))).status).toBe(404);
    expect((await createRoute(await request("POST", "/api/profiles", { user: engineer, rawBody: "{not json" }), undefined)).status).toBe(400);
    const viewer = await createUser({ role: "viewer" });
    expect((await createRoute(await request("POST", "/api/profiles", { user: viewer, body: { document: profileDocument() } }), undefined)).status).toBe(403);
    expect((await createRoute(await request("POST", "/api/profiles", { body: { document: profileDocument() } }), undefined)).status).toBe(401);
  });
});

describe("every profile and assignment route refuses bad input with a 4xx naming the field", () => {
  it("answers each route's bad input", async () => {
    const { createProfile, createSite, createGroup } = await import("../factories");
    const { GET: assignmentsRoute } = await import("@/app/api/sites/[site]/assignments/route");
    const { GET: groupAssignmentRoute, DELETE: removeRoute } = await import("@/app/api/sites/[site]/groups/[groupId]/assignment/route");
    const { POST: discardRoute } = await import("@/app/api/sites/[site]/draft/discard/route");
    const engineer = await createUser({ role: "engineer" });
    const { profile } = await createProfile();
    const id = String(profile.id);
    const site = await createSite();
    const group = await createGroup(site);
    const cases: [string, Promise<Response>, number, string][] = [
      ["list status", listRoute(await request("GET", "/api/profiles?status=gone", { user: engineer }), undefined), 422, "status"],
      ["list kind", listRoute(await request("GET", "/api/profiles?kind=liquid", { user: engineer }), undefined), 422, "kind"],
      ["get id", getRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: "abc" })), 422, ""],
      ["archive flag", patchRoute(await request("PATCH", "/", { user: engineer, body: { archived: "yes" } }), ctx({ profileId: id })), 422, "archived"],
      ["revise note", reviseRoute(await request("POST", "/", { user: engineer, body: { document: profileDocument(), note: "x".repeat(501) } }), ctx({ profileId: id })), 422, "note"],
      ["revise base", reviseRoute(await request("POST", "/", { user: engineer, body: { document: profileDocument(), baseRevision: 0 } }), ctx({ profileId: id })), 422, "baseRevision"],
      ["revision missing", revisionRoute(await request("GET", "/", { user: engineer }), ctx({ profileId: id, revision: "9" })), 404, "revision"],
      ["diff from", diffRoute(await request("GET", `/api/profiles/${id}/diff?to=1`, { user: engineer }), ctx({ profileId: id })), 422, "from"],
      ["diff missing", diffRoute(await request("GET", `/api/profiles/${id}/diff?from=1&to=3`, { user: engineer }), ctx({ profileId: id })), 404, "revision"],
      ["duplicate name", duplicateRoute(await request("POST", "/", { user: engineer, body: { name: " " } }), ctx({ profileId: id })), 422, "name"],
      ["duplicate taken", duplicateRoute(await request("POST", "/", { user: engineer, body: { name: profile.name } }), ctx({ profileId: id })), 409, "name"],
      ["export revision", exportRoute(await request("GET", `/api/profiles/${id}/export?revision=4`, { user: engineer }), ctx({ profileId: id })), 404, "revision"],
      ["import empty", importRoute(await request("POST", "/api/profiles/import", { user: engineer, rawBody: "  " }), undefined), 422, "file"],
      ["import too big", importRoute(await request("POST", "/api/profiles/import", { user: engineer, rawBody: "#".repeat(300 * 1024) }), undefined), 413, "file"],
      ["assignments site", assignmentsRoute(await request("GET", "/", { user: engineer }), ctx({ site: "no-such-site" })), 404, "site"],
      ["assignment group", groupAssignmentRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug, groupId: "999999" })), 404, "group"],
      ["remove unassigned", removeRoute(await request("DELETE", "/", { user: engineer }), ctx({ site: site.slug, groupId: String(group.id) })), 404, "group"],
      ["discard body", discardRoute(await request("POST", "/", { user: engineer, body: { edits: [] } }), ctx({ site: site.slug })), 422, "edits"],
    ];
    for (const [what, pending, status, field] of cases) {
      const res = await pending;
      const body = await res.json();
      expect([what, res.status], JSON.stringify(body)).toEqual([what, status]);
      expect(typeof body.error, what).toBe("string");
      if (field) expect(body.field, what).toBe(field);
    }
  });
});
