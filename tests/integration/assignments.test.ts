import { describe, expect, it } from "vitest";
import { GET as listRoute } from "@/app/api/sites/[site]/assignments/route";
import { DELETE as removeRoute, GET as getRoute, PUT as putRoute } from "@/app/api/sites/[site]/groups/[groupId]/assignment/route";
import { GET as draftRoute } from "@/app/api/sites/[site]/draft/route";
import { POST as discardRoute } from "@/app/api/sites/[site]/draft/discard/route";
import { POST as reviseRoute } from "@/app/api/profiles/[profileId]/revisions/route";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { loadWorkingConfig } from "@/lib/data/groups";
import { AuditEvent, CautionAcknowledgement, Change, ReductionProfile, Release, Tag } from "@/models";
import { createGateway, createGroup, createProfile, createSite, createTag, createUser, ctx, request } from "../factories";

const json = async (res: Response) => ({ status: res.status, body: await res.json() });

async function plant() {
  const site = await createSite();
  const gw = await createGateway(site);
  const engineer = await createUser({ role: "engineer" });
  return { site, gw, engineer };
}

const deviation = (value: number, unit: string) => ({
  outputs: [{ name: "shape", steps: [{ method: "swinging-door" as const, deviation: { value, unit } }] }],
});

async function put(site: string, groupId: number, user: Awaited<ReturnType<typeof createUser>>, body: unknown) {
  return json(await putRoute(await request("PUT", "/", { user, body }), ctx({ site, groupId: String(groupId) })));
}

describe("assignments API", () => {
  it("pins a revision: editing the profile changes no site until the upgrade, which joins the draft", async () => {
    const { site, gw, engineer } = await plant();
    await createTag(site, gw, { name: "PAST1/TT-101/PV" });
    const group = await createGroup(site, { name: "temps", patterns: ["PAST1/*/PV"] });
    const { profile, revision } = await createProfile();
    expect(await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1 })).toMatchObject({ status: 200, body: { revision: 1 } });
    const before = await loadWorkingConfig(site.id);

    const doc2 = { ...revision.document, description: "revised" };
    expect((await reviseRoute(await request("POST", "/", { user: engineer, body: { document: doc2 } }), ctx({ profileId: String(profile.id) }))).status).toBe(201);
    expect(await loadWorkingConfig(site.id)).toEqual(before);
    const rows = (await json(await listRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug })))).body.groups;
    expect(rows[0]).toMatchObject({ group: "temps", tagCount: 1, assignment: { profile: profile.name, revision: 1, latestRevision: 2, lossy: true, outputs: ["shape"] } });

    expect(await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 2 })).toMatchObject({ status: 200, body: { revision: 2 } });
    const draft = (await json(await draftRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug })))).body;
    expect(draft.edits.map((e: { kind: string }) => e.kind)).toEqual(["group-added"]);
    expect(draft.edits[0].assignment).toEqual({ profile: profile.name, revision: 2 });
    expect(await AuditEvent.count({ where: { action: "assignment.set", entityId: group.id } })).toBe(2);
  });

  it("converts °C parameters for °F tags, refuses them on kPa tags, and refuses percent without a range", async () => {
    const { site, gw, engineer } = await plant();
    const f = await createTag(site, gw, { name: "OVEN/TT-1/PV", unit: "degF" });
    await createTag(site, gw, { name: "LINE/PT-1/PV", unit: "kPa" });
    const noRange = await createTag(site, gw, { name: "LINE/XT-1/PV", unit: "degC" });
    await Tag.update({ euLow: null, euHigh: null }, { where: { id: noRange.id } });
    const fahrenheit = await createGroup(site, { name: "oven", patterns: ["OVEN/*/PV"], priority: 10 });
    const kpa = await createGroup(site, { name: "pressures", patterns: ["LINE/PT-*/PV"], priority: 20 });
    const bare = await createGroup(site, { name: "bare", patterns: ["LINE/XT-*/PV"], priority: 30 });
    const { profile } = await createProfile(deviation(1, "degC"));

    expect((await put(site.slug, fahrenheit.id, engineer, { profileId: profile.id, revision: 1 })).status).toBe(200);
    const detail = await json(await getRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug, groupId: String(fahrenheit.id) })));
    expect(detail.body.tags.map((t: { name: string }) => t.name)).toEqual([f.name]);

    const refused = await put(site.slug, kpa.id, engineer, { profileId: profile.id, revision: 1 });
    expect(refused.status).toBe(422);
    expect(refused.body.field).toBe("profile");
    expect(refused.body.error).toMatch(/degC.*kPa|°C.*kPa/);

    const { profile: pct } = await createProfile(deviation(1, "degC") && { outputs: [{ name: "shape", steps: [{ method: "swinging-door", deviation: { percent: 1 } }] }] });
    const noEu = await put(site.slug, bare.id, engineer, { profileId: pct.id, revision: 1 });
    expect(noEu.status).toBe(422);
    expect(noEu.body.error).toMatch(/no engineering range/);

    // A group override in the wrong unit names the override, not the profile.
    const override = await put(site.slug, fahrenheit.id, engineer, {
      profileId: profile.id,
      revision: 1,
      overrides: [{ output: "shape", step: 0, parameter: "deviation", value: { value: 2, unit: "kPa" } }],
    });
    expect(override).toMatchObject({ status: 422, body: { field: "overrides[0].value" } });
    const noStep = await put(site.slug, fahrenheit.id, engineer, { profileId: profile.id, revision: 1, overrides: [{ output: "shape", step: 4, parameter: "deviation", value: 1 }] });
    expect(noStep).toMatchObject({ status: 422, body: { field: "overrides[0]" } });
  });

  it("stores per-tag overrides and refuses a tag outside the group", async () => {
    const { site, gw, engineer } = await plant();
    await createTag(site, gw, { name: "SEP/PT-1/PV", unit: "degC" });
    await createTag(site, gw, { name: "SEP/PT-2/PV", unit: "degC" });
    await createTag(site, gw, { name: "ELSE/PT-3/PV", unit: "degC" });
    const group = await createGroup(site, { name: "sep", patterns: ["SEP/*/PV"] });
    const { profile } = await createProfile(deviation(0.5, "degC"));
    const noisy = { tag: "SEP/PT-2/PV", overrides: [{ output: "shape", step: 0, parameter: "deviation", value: { percent: 2 } }] };
    expect((await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1, tagOverrides: [noisy] })).status).toBe(200);
    const config = await loadWorkingConfig(site.id);
    expect(config.groups[0].assignment!.tags).toEqual([noisy]);
    const outside = await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1, tagOverrides: [{ ...noisy, tag: "ELSE/PT-3/PV" }] });
    expect(outside).toMatchObject({ status: 422, body: { field: "tagOverrides[0].tag" } });
    const twice = await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1, tagOverrides: [noisy, noisy] });
    expect(twice).toMatchObject({ status: 422, body: { field: "tagOverrides" } });
  });

  it("needs the regulated-record caution acknowledged before a lossy step, and stores who, when and which text", async () => {
    const { site, gw, engineer } = await plant();
    await createTag(site, gw, { name: "PAST1/TT-1/PV" });
    const group = await createGroup(site, { name: "past", patterns: ["PAST1/*/PV"] });
    await group.update({ regulated: true });
    const { profile } = await createProfile();
    const { profile: lossless } = await createProfile({ outputs: [{ name: "raw", steps: [{ method: "pass-through" }] }] });

    // Pass-through loses nothing: no acknowledgement needed.
    expect((await put(site.slug, group.id, engineer, { profileId: lossless.id, revision: 1 })).status).toBe(200);
    const missing = await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1 });
    expect(missing).toMatchObject({ status: 422, body: { field: "acknowledge" } });
    expect(missing.body.error).toMatch(/regulated record/);
    const outdated = await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1, acknowledge: "regulated-record/0" });
    expect(outdated).toMatchObject({ status: 422, body: { field: "acknowledge" } });
    expect(await CautionAcknowledgement.count({ where: { groupId: group.id } })).toBe(0);

    expect((await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1, acknowledge: REGULATED_RECORD_CAUTION.id })).status).toBe(200);
    const acks = await CautionAcknowledgement.findAll({ where: { groupId: group.id } });
    expect(acks).toHaveLength(1);
    expect(acks[0]).toMatchObject({ userId: engineer.id, userEmail: engineer.email, cautionId: REGULATED_RECORD_CAUTION.id, cautionText: REGULATED_RECORD_CAUTION.text });
    expect(Date.now() - acks[0].acknowledgedAt.getTime()).toBeLessThan(60_000);
    const row = (await json(await listRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug })))).body.groups[0];
    expect(row.acknowledgement).toMatchObject({ by: engineer.email, cautionId: REGULATED_RECORD_CAUTION.id, profile: `${profile.name} revision 1` });
    // Changing only overrides of the acknowledged pin needs no new acknowledgement.
    const tweak = await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1, overrides: [{ output: "shape", step: 1, parameter: "max-interval", value: 300 }] });
    expect(tweak.status).toBe(200);
  });

  it("refuses archived profiles, unknown revisions, bad bodies and other roles", async () => {
    const { site, engineer } = await plant();
    const group = await createGroup(site, { patterns: ["NONE/*"] });
    const { profile } = await createProfile();
    await ReductionProfile.update({ archivedAt: new Date() }, { where: { id: profile.id } });
    expect(await put(site.slug, group.id, engineer, { profileId: profile.id, revision: 1 })).toMatchObject({ status: 422, body: { field: "profileId" } });
    const { profile: ok } = await createProfile();
    expect(await put(site.slug, group.id, engineer, { profileId: ok.id, revision: 7 })).toMatchObject({ status: 422, body: { field: "revision" } });
    expect(await put(site.slug, group.id, engineer, { profileId: "x", revision: 1 })).toMatchObject({ status: 422, body: { field: "profileId" } });
    expect(await put(site.slug, group.id, engineer, { profileId: ok.id, revision: 1, surprise: 1 })).toMatchObject({ status: 422 });
    expect((await put(site.slug, 999999, engineer, { profileId: ok.id, revision: 1 })).status).toBe(404);
    expect((await put(site.slug, group.id, await createUser({ role: "reviewer" }), { profileId: ok.id, revision: 1 })).status).toBe(403);
    expect((await putRoute(await request("PUT", "/", { body: { profileId: ok.id, revision: 1 } }), ctx({ site: site.slug, groupId: String(group.id) }))).status).toBe(401);
    const del = await removeRoute(await request("DELETE", "/", { user: engineer }), ctx({ site: site.slug, groupId: String(group.id) }));
    expect(del.status).toBe(404);
  });
});

describe("draft change: counting and discarding edits", () => {
  it("discards one edit, then all, restoring the current release and closing the change", async () => {
    const { site, gw, engineer } = await plant();
    await createTag(site, gw, { name: "A/TT-1/PV" });
    await createTag(site, gw, { name: "B/TT-1/PV" });
    const a = await createGroup(site, { name: "a", patterns: ["A/*/PV"], priority: 10 });
    const b = await createGroup(site, { name: "b", patterns: ["B/*/PV"], priority: 20 });
    const { profile } = await createProfile();
    const { profile: other } = await createProfile();
    await put(site.slug, a.id, engineer, { profileId: profile.id, revision: 1 });
    // Release 1 holds a → profile, b unassigned.
    await Release.create({ siteId: site.id, number: 1, config: await loadWorkingConfig(site.id), changeId: null, releasedBy: null, releasedAt: new Date() });
    await Change.destroy({ where: { siteId: site.id } });

    const draft = async () => (await json(await draftRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug })))).body;
    expect((await draft()).edits).toEqual([]);
    await put(site.slug, a.id, engineer, { profileId: other.id, revision: 1 });
    await put(site.slug, b.id, engineer, { profileId: profile.id, revision: 1 });
    const d = await draft();
    expect(d.baseRelease).toBe(1);
    expect(d.edits.map((e: { key: string }) => e.key)).toEqual(["assignment-set:a", "assignment-set:b"]);

    const discard = async (body: unknown) => json(await discardRoute(await request("POST", "/", { user: engineer, body }), ctx({ site: site.slug })));
    expect(await discard({ edits: ["assignment-set:a"] })).toMatchObject({ status: 200, body: { discarded: ["assignment-set:a"], remaining: 1 } });
    const config = await loadWorkingConfig(site.id);
    expect(config.groups.find((g) => g.name === "a")!.assignment).toMatchObject({ profile: profile.name, revision: 1 });
    expect(await discard({ edits: ["assignment-set:a"] })).toMatchObject({ status: 422, body: { field: "edits" } });
    expect(await discard({ all: true })).toMatchObject({ status: 200, body: { remaining: 0 } });
    expect((await loadWorkingConfig(site.id)).groups.find((g) => g.name === "b")!.assignment).toBeNull();
    expect(await Change.count({ where: { siteId: site.id } })).toBe(0);
    expect(await discard({ all: true })).toMatchObject({ status: 404, body: { field: "change" } });
    expect((await discard({ nothing: true })).status).toBe(422);
    expect(await AuditEvent.count({ where: { action: "draft.discard", siteId: site.id } })).toBe(2);
  });

  it("undoes added, removed, changed and reordered groups against the release", async () => {
    const { site, gw, engineer } = await plant();
    await createTag(site, gw, { name: "A/TT-1/PV" });
    const a = await createGroup(site, { name: "a", patterns: ["A/*/PV"], priority: 10 });
    const b = await createGroup(site, { name: "b", patterns: ["B/*/PV"], priority: 20 });
    await createAssignment(b);
    const base = await loadWorkingConfig(site.id);
    await Release.create({ siteId: site.id, number: 1, config: base, changeId: null, releasedBy: null, releasedAt: new Date() });
    await Change.create({ siteId: site.id, baseRelease: 1, createdBy: engineer.id });
    await a.update({ priority: 30, description: "edited" });
    await b.destroy();
    await createGroup(site, { name: "c", patterns: ["C/*/PV"], priority: 40 });
    const edits = (await json(await draftRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug })))).body.edits;
    expect(edits.map((e: { key: string }) => e.key).sort()).toEqual(["group-added:c", "group-changed:a", "group-removed:b"]);
    const res = await json(await discardRoute(await request("POST", "/", { user: engineer, body: { all: true } }), ctx({ site: site.slug })));
    expect(res.body.remaining).toBe(0);
    expect(await loadWorkingConfig(site.id)).toEqual(base);
  });
});

async function createAssignment(group: Awaited<ReturnType<typeof createGroup>>) {
  const { revision } = await createProfile();
  const { createAssignment: make } = await import("../factories");
  const a = await make(group, revision);
  return a;
}
