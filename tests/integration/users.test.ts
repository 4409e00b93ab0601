import { describe, expect, it } from "vitest";
import { GET as listUsersRoute, POST as createUserRoute } from "@/app/api/users/route";
import { PATCH as patchUserRoute } from "@/app/api/users/[id]/route";
import { POST as resetPasswordRoute } from "@/app/api/users/[id]/password/route";
import { verifySignIn } from "@/lib/auth/sign-in";
import { updateUser } from "@/lib/data/users";
import { AuditEvent, User } from "@/models";
import { createUser, ctx, request } from "../factories";

const auditFor = (entityId: number, action: string) => AuditEvent.findAll({ where: { entityType: "user", entityId, action } });

describe("users API", () => {
  it("creates an account with a one-time password that signs in, and audits it once", async () => {
    const admin = await createUser({ role: "admin" });
    const email = `new-${Date.now()}@test.invalid`;
    const res = await createUserRoute(await request("POST", "/api/users", { user: admin, body: { email: email.toUpperCase(), name: " New Person ", role: "engineer" } }), undefined);
    expect(res.status).toBe(201);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const body = await res.json();
    expect(body.user).toMatchObject({ email, name: "New Person", role: "engineer", active: true });
    expect(body.password).toMatch(/^[A-Za-z0-9_-]{16}$/);
    const stored = await User.findOne({ where: { email } });
    expect(stored!.passwordHash).toMatch(/^\$2[aby]\$12\$/);
    expect(stored!.passwordHash).not.toContain(body.password);
    expect(await verifySignIn(email, body.password, "10.9.9.9")).toMatchObject({ ok: true });
    const audit = await auditFor(stored!.id, "user.create");
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actorId: admin.id, actorEmail: admin.email, beforeJson: null, afterJson: { email, name: "New Person", role: "engineer", active: true } });
    expect(JSON.stringify(audit[0].afterJson)).not.toContain("$2");
  });

  it("names the field of bad input and refuses a taken e-mail", async () => {
    const admin = await createUser({ role: "admin" });
    const bad = await createUserRoute(await request("POST", "/api/users", { user: admin, body: { email: "not-an-email", name: "X", role: "viewer" } }), undefined);
    expect(bad.status).toBe(422);
    expect(await bad.json()).toMatchObject({ field: "email" });
    const role = await createUserRoute(await request("POST", "/api/users", { user: admin, body: { email: "r@test.invalid", name: "X", role: "superuser" } }), undefined);
    expect(role.status).toBe(422);
    expect(await role.json()).toMatchObject({ field: "role" });
    const notJson = await createUserRoute(await request("POST", "/api/users", { user: admin, rawBody: "{nope" }), undefined);
    expect(notJson.status).toBe(400);
    expect(await notJson.json()).toMatchObject({ field: "body" });
    const taken = await createUserRoute(await request("POST", "/api/users", { user: admin, body: { email: admin.email, name: "Dup", role: "viewer" } }), undefined);
    expect(taken.status).toBe(409);
    expect(await taken.json()).toMatchObject({ field: "email" });
  });

  it("changes a role and deactivates and reactivates, one audit entry per write with before and after", async () => {
    const admin = await createUser({ role: "admin" });
    const user = await createUser({ role: "viewer" });
    const params = ctx({ id: String(user.id) });
    const r1 = await patchUserRoute(await request("PATCH", `/api/users/${user.id}`, { user: admin, body: { role: "reviewer" } }), params);
    expect(r1.status).toBe(200);
    expect(await r1.json()).toMatchObject({ role: "reviewer" });
    const r2 = await patchUserRoute(await request("PATCH", `/api/users/${user.id}`, { user: admin, body: { active: false } }), params);
    expect(await r2.json()).toMatchObject({ active: false });
    const r3 = await patchUserRoute(await request("PATCH", `/api/users/${user.id}`, { user: admin, body: { active: true } }), params);
    expect(await r3.json()).toMatchObject({ active: true });
    const audit = await AuditEvent.findAll({ where: { entityType: "user", entityId: user.id }, order: [["id", "ASC"]] });
    expect(audit.map((a) => [a.beforeJson?.role, a.afterJson?.role, a.beforeJson?.active, a.afterJson?.active])).toEqual([
      ["viewer", "reviewer", true, true],
      ["reviewer", "reviewer", true, false],
      ["reviewer", "reviewer", false, true],
    ]);
    // A request that changes nothing writes nothing.
    await patchUserRoute(await request("PATCH", `/api/users/${user.id}`, { user: admin, body: { active: true } }), params);
    expect(await AuditEvent.count({ where: { entityType: "user", entityId: user.id } })).toBe(3);
  });

  it("refuses an empty patch, unknown keys and an unknown id", async () => {
    const admin = await createUser({ role: "admin" });
    const user = await createUser();
    const empty = await patchUserRoute(await request("PATCH", "/", { user: admin, body: {} }), ctx({ id: String(user.id) }));
    expect(empty.status).toBe(422);
    const extra = await patchUserRoute(await request("PATCH", "/", { user: admin, body: { passwordHash: "x" } }), ctx({ id: String(user.id) }));
    expect(extra.status).toBe(422);
    const missing = await patchUserRoute(await request("PATCH", "/", { user: admin, body: { role: "viewer" } }), ctx({ id: "99999999" }));
    expect(missing.status).toBe(404);
    expect(await missing.json()).toMatchObject({ field: "id" });
    const badId = await patchUserRoute(await request("PATCH", "/", { user: admin, body: { role: "viewer" } }), ctx({ id: "abc" }));
    expect(badId.status).toBe(422);
  });

  it("resets a password: the old one stops working, the new one works, the audit holds neither", async () => {
    const admin = await createUser({ role: "admin" });
    const user = await createUser({ password: "old-password" });
    const res = await resetPasswordRoute(await request("POST", "/", { user: admin }), ctx({ id: String(user.id) }));
    expect(res.status).toBe(200);
    const { password } = await res.json();
    expect(await verifySignIn(user.email, "old-password", "10.8.8.1")).toMatchObject({ ok: false });
    expect(await verifySignIn(user.email, password, "10.8.8.2")).toMatchObject({ ok: true });
    const audit = await auditFor(user.id, "user.reset-password");
    expect(audit).toHaveLength(1);
    expect(JSON.stringify([audit[0].beforeJson, audit[0].afterJson])).not.toContain(password);
  });

  it("lists accounts for admins only", async () => {
    const admin = await createUser({ role: "admin" });
    const res = await listUsersRoute(await request("GET", "/api/users", { user: admin }), undefined);
    expect((await res.json()).users.some((u: { email: string }) => u.email === admin.email)).toBe(true);
    const reviewer = await createUser({ role: "reviewer" });
    expect((await listUsersRoute(await request("GET", "/api/users", { user: reviewer }), undefined)).status).toBe(403);
  });
});

describe("the last active admin", () => {
  it("cannot be demoted or deactivated, while another admin can", async () => {
    // Leave exactly one active admin: deactivate every other admin first.
    const others = await User.findAll({ where: { role: "admin", active: true } });
    const last = await createUser({ role: "admin" });
    const actor = { id: last.id, email: last.email, name: last.name, role: "admin" as const };
    for (const o of others) await updateUser(actor, o.id, { active: false });
    try {
      await expect(updateUser(actor, last.id, { role: "engineer" })).rejects.toMatchObject({ status: 409, field: "role" });
      await expect(updateUser(actor, last.id, { active: false })).rejects.toMatchObject({ status: 409, field: "active" });
      const res = await patchUserRoute(await request("PATCH", "/", { user: last, body: { role: "viewer" } }), ctx({ id: String(last.id) }));
      expect(res.status).toBe(409);
      expect(await res.json()).toMatchObject({ field: "role", error: expect.stringContaining("last active administrator") });
      expect((await User.findByPk(last.id))!.role).toBe("admin");
      // With a second active admin, the first may step down.
      const second = await createUser({ role: "admin" });
      await expect(updateUser(actor, last.id, { role: "engineer" })).resolves.toMatchObject({ role: "engineer" });
      await expect(updateUser(actor, second.id, { active: false })).rejects.toMatchObject({ status: 409 });
    } finally {
      // Bulk update: the instances above still hold active = true, so an instance update would write nothing.
      await User.update({ active: true }, { where: { id: others.map((o) => o.id) } });
    }
  });

  it("survives two admins demoting each other at the same moment", async () => {
    const others = await User.findAll({ where: { role: "admin", active: true } });
    for (const o of others) await o.update({ active: false });
    try {
      const a = await createUser({ role: "admin" });
      const b = await createUser({ role: "admin" });
      const as = (u: User) => ({ id: u.id, email: u.email, name: u.name, role: "admin" as const });
      const results = await Promise.allSettled([updateUser(as(a), b.id, { role: "viewer" }), updateUser(as(b), a.id, { role: "viewer" })]);
      expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
      expect(await User.count({ where: { role: "admin", active: true } })).toBe(1);
    } finally {
      await User.update({ active: true }, { where: { id: others.map((o) => o.id) } });
    }
  });

  it("leaves the demo administrator active for the tests that follow", async () => {
    expect(await User.findOne({ where: { email: "ada.admin@demo.invalid" } })).toMatchObject({ active: true, role: "admin" });
  });
});
