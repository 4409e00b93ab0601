import { describe, expect, it } from "vitest";
import { GET as listGroupsRoute, POST as createGroupRoute } from "@/app/api/sites/[site]/groups/route";
import { DELETE as deleteGroupRoute, PATCH as patchGroupRoute } from "@/app/api/sites/[site]/groups/[groupId]/route";
import { PUT as orderRoute } from "@/app/api/sites/[site]/groups/order/route";
import { POST as previewRoute } from "@/app/api/sites/[site]/groups/preview/route";
import { GET as coverageRoute } from "@/app/api/sites/[site]/coverage/route";
import { GET as draftRoute } from "@/app/api/sites/[site]/draft/route";
import { AuditEvent, Change, ChangeAuthor } from "@/models";
import { createGateway, createSite, createTag, createUser, ctx, request } from "../factories";
import { groupBody } from "./matrix/samples";

const selector = (o: Record<string, unknown>) => ({ ...groupBody().selector, patterns: [], ...o });

async function plant() {
  const site = await createSite();
  const gw = await createGateway(site);
  for (const name of ["PAST1/TT-101/PV", "PAST1/TT-102/PV", "PAST1/HX/TT-103/PV", "CIP1/TT-201/PV", "CIP1/FT-201/PV", "SEP/VT-301/PV"]) {
    await createTag(site, gw, { name, unit: name.includes("/FT-") ? "m3/h" : name.includes("/VT-") ? "mm/s" : "degC" });
  }
  const engineer = await createUser({ role: "engineer" });
  return { site, gw, engineer, p: ctx({ site: site.slug }) };
}

describe("tag groups API", () => {
  it("creates groups, previews selectors, reorders, and shows coverage", async () => {
    const { site, engineer, p } = await plant();
    const post = async (name: string, sel: Record<string, unknown>, regulated = false) => {
      const res = await createGroupRoute(await request("POST", "/", { user: engineer, body: { name, description: "", regulated, selector: selector(sel) } }), p);
      expect(res.status).toBe(201);
      return (await res.json()).id as number;
    };
    // `*` stays within one level: PAST1/HX/TT-103/PV is not matched by PAST1/*/PV.
    const preview = await (await previewRoute(await request("POST", "/", { user: engineer, body: { selector: selector({ patterns: ["PAST1/*/PV"] }) } }), p)).json();
    expect(preview).toMatchObject({ count: 2, sample: ["PAST1/TT-101/PV", "PAST1/TT-102/PV"], total: 6 });

    const past = await post("pasteuriser-temperatures", { patterns: ["PAST1/**/PV"] }, true);
    const temps = await post("all-temperatures", { units: ["degC"] });
    const groups = (await (await listGroupsRoute(await request("GET", "/", { user: engineer }), p)).json()).groups;
    expect(groups.map((g: { name: string; tagCount: number; matchCount: number }) => [g.name, g.tagCount, g.matchCount])).toEqual([
      ["pasteuriser-temperatures", 3, 3],
      ["all-temperatures", 1, 4],
    ]);
    expect(groups[0]).toMatchObject({ regulated: true, selector: { patterns: ["PAST1/**/PV"] } });

    const cov = await (await coverageRoute(await request("GET", "/", { user: engineer }), p)).json();
    expect(cov).toMatchObject({ total: 6, unassignedCount: 2, overlapCount: 3 });
    expect(cov.unassigned.map((t: { name: string }) => t.name)).toEqual(["CIP1/FT-201/PV", "SEP/VT-301/PV"]);
    expect(cov.overlaps[0]).toMatchObject({ winner: "pasteuriser-temperatures", groups: ["pasteuriser-temperatures", "all-temperatures"] });

    // The preview says how many matched tags a higher-priority group already takes.
    const p2 = await (await previewRoute(await request("POST", "/", { user: engineer, body: { selector: selector({ units: ["degC"] }), groupId: temps } }), p)).json();
    expect(p2).toMatchObject({ count: 4, wonElsewhere: 3 });

    const reorder = await orderRoute(await request("PUT", "/", { user: engineer, body: { order: [temps, past] } }), p);
    expect(reorder.status).toBe(204);
    const after = (await (await listGroupsRoute(await request("GET", "/", { user: engineer }), p)).json()).groups;
    expect(after.map((g: { name: string; tagCount: number }) => [g.name, g.tagCount])).toEqual([
      ["all-temperatures", 4],
      ["pasteuriser-temperatures", 0],
    ]);
    const audit = await AuditEvent.findAll({ where: { siteId: site.id }, order: [["id", "ASC"]] });
    expect(audit.map((a) => a.action)).toEqual(["group.create", "group.create", "group.reorder"]);
    expect(audit[2].afterJson).toEqual({ order: ["all-temperatures", "pasteuriser-temperatures"] });
  });

  it("collects group edits in the site's draft change with every author", async () => {
    const { site, engineer, p } = await plant();
    const admin = await createUser({ role: "admin" });
    const res = await createGroupRoute(await request("POST", "/", { user: engineer, body: groupBody() }), p);
    const { id } = await res.json();
    await patchGroupRoute(
      await request("PATCH", "/", { user: admin, body: { ...groupBody(), name: "renamed", regulated: true } }),
      ctx({ site: site.slug, groupId: String(id) }),
    );
    const changes = await Change.findAll({ where: { siteId: site.id } });
    expect(changes).toHaveLength(1);
    expect(changes[0].state).toBe("draft");
    const authors = await ChangeAuthor.findAll({ where: { changeId: changes[0].id } });
    expect(authors.map((a) => a.userId).sort()).toEqual([engineer.id, admin.id].sort());
    const draft = await (await draftRoute(await request("GET", "/", { user: engineer }), p)).json();
    expect(draft).toMatchObject({ changeId: changes[0].id, state: "draft", edits: [{ kind: "group-added", group: "renamed" }] });
    expect(draft.authors.map((a: { email: string }) => a.email).sort()).toEqual([engineer.email, admin.email].sort());
    expect((await deleteGroupRoute(await request("DELETE", "/", { user: engineer }), ctx({ site: site.slug, groupId: String(id) }))).status).toBe(204);
    const empty = await (await draftRoute(await request("GET", "/", { user: engineer }), p)).json();
    expect(empty.edits).toEqual([]);
  });

  it("names the field of bad input", async () => {
    const { site, engineer, p } = await plant();
    const bad = async (body: unknown, field: string | RegExp, status = 422) => {
      const res = await createGroupRoute(await request("POST", "/", { user: engineer, body }), p);
      expect(res.status, JSON.stringify(body)).toBe(status);
      const json = await res.json();
      expect(json.field, JSON.stringify(json)).toMatch(field);
    };
    await bad({ ...groupBody(), name: "" }, "name");
    await bad({ ...groupBody(), selector: selector({ kinds: ["analogue"] }) }, /^selector\.kinds/);
    await bad({ ...groupBody(), selector: selector({ include: ["A"], exclude: ["A"] }) }, /^selector\.exclude/);
    await bad({ ...groupBody(), selector: selector({ minPeriodMs: 5000, maxPeriodMs: 100 }) }, /^selector\./);
    const g = groupBody();
    await createGroupRoute(await request("POST", "/", { user: engineer, body: g }), p);
    await bad(g, "name", 409);
    const order = await orderRoute(await request("PUT", "/", { user: engineer, body: { order: [999999] } }), p);
    expect(order.status).toBe(422);
    expect(await order.json()).toMatchObject({ field: "order" });
    const missing = await patchGroupRoute(await request("PATCH", "/", { user: engineer, body: groupBody() }), ctx({ site: site.slug, groupId: "999999" }));
    expect(missing.status).toBe(404);
    const viewer = await createUser({ role: "viewer" });
    expect((await createGroupRoute(await request("POST", "/", { user: viewer, body: groupBody() }), p)).status).toBe(403);
  });
});
