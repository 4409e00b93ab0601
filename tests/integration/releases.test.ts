import { describe, expect, it } from "vitest";
import { POST as submitRoute } from "@/app/api/sites/[site]/changes/route";
import { GET as changeRoute } from "@/app/api/sites/[site]/changes/[changeId]/route";
import { POST as approveRoute } from "@/app/api/sites/[site]/changes/[changeId]/approve/route";
import { POST as rejectRoute } from "@/app/api/sites/[site]/changes/[changeId]/reject/route";
import { POST as releaseRoute } from "@/app/api/sites/[site]/changes/[changeId]/release/route";
import { GET as bundleRoute } from "@/app/api/sites/[site]/releases/[number]/bundles/[gateway]/route";
import { GET as releasesRoute } from "@/app/api/sites/[site]/releases/route";
import { POST as urgentRoute } from "@/app/api/sites/[site]/rollbacks/urgent/route";
import { PUT as assignRoute } from "@/app/api/sites/[site]/groups/[groupId]/assignment/route";
import { digestHex } from "@/lib/bundles/digest";
import { verifyBytes } from "@/lib/bundles/signing";
import { validateBundle } from "@/lib/bundles/validate";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { publishRelease } from "@/lib/data/releases";
import { signingKeys } from "@/lib/data/signing-keys";
import { loadWorkingConfig } from "@/lib/data/groups";
import { readCaughtIndex } from "@/lib/mail/caught";
import { Bundle, Change, Release, Site, Tag, sequelize } from "@/models";
import { createGateway, createGroup, createProfile, createSite, createTag, createUser, ctx, request } from "../factories";

const json = async (res: Response) => ({ status: res.status, body: await res.json() });

async function plant() {
  const site = await createSite();
  const gw1 = await createGateway(site, { slug: `gw-a-${site.id}` });
  const gw2 = await createGateway(site, { slug: `gw-b-${site.id}` });
  await createTag(site, gw1, { name: "PAST1/TT-101/PV" });
  await createTag(site, gw2, { name: "PAST1/TT-102/PV" });
  await createTag(site, gw2, { name: "CIP1/TT-201/PV" });
  const group = await createGroup(site, { name: "pasteuriser", patterns: ["PAST1/*/PV"] });
  const engineer = await createUser({ role: "engineer" });
  const reviewer = await createUser({ role: "reviewer" });
  const { profile, revision } = await createProfile();
  return { site, gw1, gw2, group, engineer, reviewer, profile, revision };
}

// Route contexts differ per route; the tests pass the params each route reads.
const p = (site: Site, extra: Record<string, string> = {}) => ctx({ site: site.slug, ...extra }) as never;

async function assign(site: Site, groupId: number, user: Awaited<ReturnType<typeof createUser>>, body: unknown) {
  return json(await assignRoute(await request("PUT", "/", { user, body }), p(site, { groupId: String(groupId) })));
}

async function submit(site: Site, user: Awaited<ReturnType<typeof createUser>>, note = "") {
  return json(await submitRoute(await request("POST", "/", { user, body: { note } }), p(site)));
}

const act = async (route: typeof approveRoute, site: Site, changeId: number, user: Awaited<ReturnType<typeof createUser>> | null, body?: unknown) =>
  json(await route(await request("POST", "/", { user, body: body ?? {} }), p(site, { changeId: String(changeId) })));

describe("review and release", () => {
  it("submits, shows each gateway's bundle and the summary, approves with four eyes, releases signed bundles", async () => {
    const { site, gw1, gw2, group, engineer, reviewer, profile } = await plant();
    expect((await assign(site, group.id, engineer, { profileId: profile.id, revision: 1 })).status).toBe(200);
    const submitted = await submit(site, engineer, "first configuration");
    expect(submitted.status).toBe(201);
    const changeId = submitted.body.changeId as number;

    const view = (await json(await changeRoute(await request("GET", "/", { user: reviewer }), p(site, { changeId: String(changeId) })))).body;
    expect(view).toMatchObject({ state: "in_review", note: "first configuration", baseRelease: null });
    expect(view.authors.map((a: { email: string }) => a.email)).toEqual([engineer.email]);
    expect(view.review.release).toBe(1);
    expect(view.review.gateways.map((g: { gateway: string }) => g.gateway).sort()).toEqual([gw1.slug, gw2.slug].sort());
    const added = view.review.gateways[0].diff.hunks.flatMap((h: { lines: { kind: string; text: string }[] }) => h.lines.filter((l) => l.kind === "added").map((l) => l.text)).join("\n");
    expect(added).toContain(site.slug);
    expect(view.review.summary.map((s: { text: string }) => s.text).join(" ")).toMatch(/pasteuriser/);

    // Four eyes: the author (engineers may not review anyway) and an admin who edited may not approve.
    expect((await act(approveRoute, site, changeId, engineer)).status).toBe(403);
    const admin = await createUser({ role: "admin" });
    await assign(site, group.id, admin, { profileId: profile.id, revision: 1, overrides: [{ output: "shape", step: 1, parameter: "max-interval", value: 300 }] });
    // The admin's edit sent the change back to draft: it must be submitted again.
    expect((await Change.findByPk(changeId))!.state).toBe("draft");
    expect((await submit(site, admin)).status).toBe(201);
    const four = await act(approveRoute, site, changeId, admin);
    expect(four).toMatchObject({ status: 403, body: { field: "change" } });
    expect(four.body.error).toMatch(/four-eyes/);
    // Viewers and engineers cannot release; an unapproved change is not released.
    expect((await act(releaseRoute, site, changeId, await createUser({ role: "viewer" }))).status).toBe(403);
    expect((await act(releaseRoute, site, changeId, engineer)).status).toBe(403);
    expect((await act(releaseRoute, site, changeId, reviewer)).status).toBe(409);

    expect((await act(approveRoute, site, changeId, reviewer, { comment: "looks right" })).status).toBe(200);
    const released = await act(releaseRoute, site, changeId, reviewer);
    expect(released).toMatchObject({ status: 200, body: { release: 1 } });
    expect((await Change.findByPk(changeId))!.state).toBe("released");
    expect((await Site.findByPk(site.id))!.releaseCounter).toBe(1);

    const history = (await json(await releasesRoute(await request("GET", "/", { user: engineer }), p(site)))).body.releases;
    expect(history).toHaveLength(1);
    expect(history[0]).toMatchObject({ number: 1, changeId, rollbackOf: null, urgentReason: null });
    const res = await bundleRoute(await request("GET", "/", { user: engineer }), p(site, { number: "1", gateway: gw2.slug }));
    const text = await res.text();
    expect(validateBundle(text)).toEqual({ ok: true });
    expect(text).toContain("PAST1/TT-102/PV");
    expect(text).not.toContain("PAST1/TT-101/PV");
    expect(res.headers.get("bundle-digest")).toBe(digestHex(text));
    const [, key, sig] = res.headers.get("bundle-signature")!.match(/^key=([^,]+), ed25519=(.+)$/)!;
    const publicKey = signingKeys().keys.find((k) => k.id === key)!.publicKeyPem;
    expect(verifyBytes(publicKey, text, sig)).toBe(true);
    expect(verifyBytes(publicKey, text.replace("PAST1/TT-102/PV", "PAST1/TT-103/PV"), sig)).toBe(false);

    // The catcher received the review request for the reviewers.
    const mail = await readCaughtIndex(process.env.SLUICE_MAIL_DIR!);
    expect(mail.some((m) => m.to.includes(reviewer.email) && /review/i.test(m.subject) && m.subject.includes(site.name))).toBe(true);
  });

  it("needs the reviewer's acknowledgement when a regulated-record group is touched, and a comment to reject", async () => {
    const { site, group, engineer, reviewer, profile } = await plant();
    await group.update({ regulated: true });
    await assign(site, group.id, engineer, { profileId: profile.id, revision: 1, acknowledge: REGULATED_RECORD_CAUTION.id });
    const { changeId } = (await submit(site, engineer)).body;
    const view = (await json(await changeRoute(await request("GET", "/", { user: reviewer }), p(site, { changeId: String(changeId) })))).body;
    expect(view.review.regulatedTouched).toEqual(["pasteuriser"]);
    expect(await act(approveRoute, site, changeId, reviewer)).toMatchObject({ status: 422, body: { field: "acknowledge" } });
    expect(await act(rejectRoute, site, changeId, reviewer, { comment: " " })).toMatchObject({ status: 422, body: { field: "comment" } });
    expect((await act(rejectRoute, site, changeId, reviewer, { comment: "deviation too wide for the holding tube" })).status).toBe(200);
    expect((await Change.findByPk(changeId))!.state).toBe("rejected");
    expect((await submit(site, engineer)).status).toBe(201);
    expect((await act(approveRoute, site, changeId, reviewer, { acknowledge: REGULATED_RECORD_CAUTION.id })).status).toBe(200);
  });

  it("refuses to release an approved change whose base went stale, sending it back to draft", async () => {
    const { site, group, engineer, reviewer, profile } = await plant();
    await assign(site, group.id, engineer, { profileId: profile.id, revision: 1 });
    const { changeId } = (await submit(site, engineer)).body;
    await act(approveRoute, site, changeId, reviewer);
    // Someone publishes meanwhile (e.g. an urgent release on another path).
    await sequelize.transaction((t) => publishRelease(site, { groups: [] }, { changeId: null, actor: { id: reviewer.id, email: reviewer.email, name: reviewer.name, role: "reviewer" } }, t));
    const stale = await act(releaseRoute, site, changeId, reviewer);
    expect(stale).toMatchObject({ status: 409, body: { field: "change" } });
    expect(stale.body.error).toMatch(/submit it again/);
    expect((await Change.findByPk(changeId))!.state).toBe("draft");
    expect(await Release.count({ where: { siteId: site.id } })).toBe(1);
  });

  it("gives 20 concurrent releases on one site the numbers n+1 … n+20, none lost or duplicated", async () => {
    const { site, reviewer } = await plant();
    const actor = { id: reviewer.id, email: reviewer.email, name: reviewer.name, role: "reviewer" as const };
    const config = await loadWorkingConfig(site.id);
    const numbers = await Promise.all(Array.from({ length: 20 }, () => sequelize.transaction((t) => publishRelease(site, config, { changeId: null, actor }, t)).then((r) => r.number)));
    expect([...numbers].sort((a, b) => a - b)).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
    expect((await Site.findByPk(site.id))!.releaseCounter).toBe(20);
    const ids = (await Release.findAll({ where: { siteId: site.id }, attributes: ["id"] })).map((r) => r.id);
    // Two gateways → two bundles per release.
    expect(await Bundle.count({ where: { releaseId: ids } })).toBe(40);
  });

  it("refuses a release whose bundle cannot be rendered, storing nothing", async () => {
    const { site, group, engineer, reviewer, profile } = await plant();
    await assign(site, group.id, engineer, { profileId: profile.id, revision: 1 });
    const { changeId } = (await submit(site, engineer)).body;
    await act(approveRoute, site, changeId, reviewer);
    // The inventory changes under the approved change: a degC deviation no longer fits a kPa tag.
    await Tag.update({ unit: "kPa" }, { where: { siteId: site.id, name: "PAST1/TT-101/PV" } });
    const refused = await act(releaseRoute, site, changeId, reviewer);
    expect(refused.status).toBe(422);
    expect(refused.body.error).toMatch(/kPa/);
    expect(await Release.count({ where: { siteId: site.id } })).toBe(0);
    expect((await Site.findByPk(site.id))!.releaseCounter).toBe(0);
  });

  it("rolls back urgently: the new release's bundles equal the target's bytes apart from number and issue time", async () => {
    const { site, group, engineer, reviewer, profile, revision } = await plant();
    await assign(site, group.id, engineer, { profileId: profile.id, revision: 1 });
    let { changeId } = (await submit(site, engineer)).body;
    await act(approveRoute, site, changeId, reviewer);
    await act(releaseRoute, site, changeId, reviewer);
    // Release 2: a tighter deviation through a new revision.
    const { ProfileRevision } = await import("@/models");
    const doc2 = structuredClone(revision.document);
    (doc2.outputs[0].steps[1] as { deviation: unknown }).deviation = { value: 0.1, unit: "degC" };
    await ProfileRevision.create({ profileId: profile.id, number: 2, document: doc2, note: "", createdBy: null });
    await profile.update({ latestRevision: 2 });
    await assign(site, group.id, engineer, { profileId: profile.id, revision: 2 });
    ({ changeId } = (await submit(site, engineer)).body);
    await act(approveRoute, site, changeId, reviewer);
    expect((await act(releaseRoute, site, changeId, reviewer)).body.release).toBe(2);

    expect((await json(await urgentRoute(await request("POST", "/", { user: reviewer, body: { release: 1, reason: "short" } }), p(site)))).status).toBe(422);
    expect((await json(await urgentRoute(await request("POST", "/", { user: engineer, body: { release: 1, reason: "line 2 alarms flooding" } }), p(site)))).status).toBe(403);
    const urgent = await json(await urgentRoute(await request("POST", "/", { user: reviewer, body: { release: 1, reason: "Holding-tube alarms flood the historian" } }), p(site)));
    expect(urgent).toMatchObject({ status: 201, body: { release: 3 } });
    const history = (await json(await releasesRoute(await request("GET", "/", { user: engineer }), p(site)))).body.releases;
    expect(history[0]).toMatchObject({ number: 3, rollbackOf: 1, urgentReason: "Holding-tube alarms flood the historian" });

    const bytes = async (n: number) => {
      const r = await Release.findOne({ where: { siteId: site.id, number: n } });
      return new Map((await Bundle.findAll({ where: { releaseId: r!.id } })).map((b) => [b.gatewaySlug, b.bytes.toString("utf8")]));
    };
    const [one, two, three] = [await bytes(1), await bytes(2), await bytes(3)];
    const strip = (s: string) => s.replace(/^release: \d+$/m, "release: N").replace(/^issued: .*$/m, "issued: T");
    for (const [gw, text] of one) {
      expect(strip(three.get(gw)!)).toBe(strip(text));
      expect(three.get(gw)).not.toBe(text);
    }
    expect([...two.values()].some((t, i) => strip(t) !== strip([...one.values()][i]))).toBe(true);
    expect((await loadWorkingConfig(site.id)).groups[0].assignment!.revision).toBe(1);
  });
});
