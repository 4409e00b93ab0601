import { describe, expect, it } from "vitest";
import { GET as getMe } from "@/app/api/me/route";
import { authorize } from "@/lib/auth/guard";
import { verifySignIn } from "@/lib/auth/sign-in";
import { delaySeconds, throttleKeys } from "@/lib/auth/throttle";
import { SignInThrottle } from "@/models";
import { createUser, request } from "../factories";

const addr = () => `10.0.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;

describe("sign-in", () => {
  it("accepts the right password and refuses a wrong one", async () => {
    const user = await createUser({ password: "right-one" });
    const ok = await verifySignIn(user.email, "right-one", addr());
    expect(ok).toMatchObject({ ok: true, user: { id: user.id, role: "viewer" } });
    const bad = await verifySignIn(user.email, "wrong-one", addr());
    expect(bad).toEqual({ ok: false, reason: "invalid" });
  });

  it("refuses an unknown e-mail and a deactivated account", async () => {
    expect(await verifySignIn("nobody@test.invalid", "x", addr())).toEqual({ ok: false, reason: "invalid" });
    const user = await createUser({ password: "pw", active: false });
    expect(await verifySignIn(user.email, "pw", addr())).toEqual({ ok: false, reason: "invalid" });
  });

  it("slows repeated failures with a growing delay, shared through the database, without a hard lockout", async () => {
    const user = await createUser({ password: "right-one" });
    const ip = addr();
    // The first three failures from one address answer at once …
    for (let i = 0; i < 3; i++) expect(await verifySignIn(user.email, "nope", ip)).toEqual({ ok: false, reason: "invalid" });
    // … then even the right password must wait.
    const held = await verifySignIn(user.email, "right-one", ip);
    expect(held).toMatchObject({ ok: false, reason: "throttled" });
    if (held.ok || held.reason !== "throttled") throw new Error("expected throttling");
    expect(held.retryAfter).toBeGreaterThanOrEqual(1);
    const [pairKey] = throttleKeys(user.email, ip);
    const row = await SignInThrottle.findByPk(pairKey);
    expect(row!.failures).toBe(3);
    // The delay grows with each failure and is capped (no lockout).
    expect([3, 4, 5, 6, 12].map((n) => delaySeconds(n, 3, 60))).toEqual([1, 2, 4, 8, 60]);
    // Another address is not held up by this one's failures.
    expect(await verifySignIn(user.email, "right-one", addr())).toMatchObject({ ok: true });
    // Once the wait has passed, the right password works and clears the account's counters.
    await row!.update({ blockedUntil: new Date(Date.now() - 1000) });
    expect(await verifySignIn(user.email, "right-one", ip)).toMatchObject({ ok: true });
    expect(await SignInThrottle.findByPk(pairKey)).toBeNull();
  });
});

describe("every request re-reads the user", () => {
  it("refuses a deactivated user on the next request, even with a valid session cookie", async () => {
    const user = await createUser({ role: "engineer" });
    const first = await getMe(await request("GET", "/api/me", { user }), undefined);
    expect(first.status).toBe(200);
    await user.update({ active: false });
    const second = await getMe(await request("GET", "/api/me", { user }), undefined);
    expect(second.status).toBe(401);
    expect(await second.json()).toEqual({ error: "sign in first" });
  });

  it("applies a role change on the next request", async () => {
    const user = await createUser({ role: "viewer" });
    const req = await request("GET", "/api/me", { user });
    await expect(authorize("fleet.admin", req)).rejects.toMatchObject({ status: 403 });
    expect(await (await getMe(req, undefined)).json()).toMatchObject({ role: "viewer" });
    await user.update({ role: "admin" });
    const req2 = await request("GET", "/api/me", { user });
    await expect(authorize("fleet.admin", req2)).resolves.toMatchObject({ id: user.id, role: "admin" });
    expect(await (await getMe(req2, undefined)).json()).toMatchObject({ role: "admin" });
  });

  it("refuses a session cookie signed with another secret", async () => {
    const forged = "next-auth.session-token=eyJhbGciOiJkaXIiLCJlbmMiOiJBMjU2R0NNIn0..forged.forged.forged";
    const res = await getMe(await request("GET", "/api/me", { cookie: forged }), undefined);
    expect(res.status).toBe(401);
  });
});
