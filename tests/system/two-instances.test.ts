import http from "node:http";
import { beforeAll, describe, expect, it } from "vitest";
import { digestHex } from "@/lib/bundles/digest";
import { A, B, DEMO_ADMIN, DEMO_REVIEWER, api, db, pull, signIn, twoReleases } from "./harness";

// Two app instances on different ports against one database, given the same session
// secret and signing keys through configuration (issue #11 part 4).

const SITE = "osterby-cheese";
const GATEWAY = "os-gw-01";

let admin: string;
let reviewer: string;
let targets: [number, number];

beforeAll(async () => {
  expect(A && B && A !== B).toBeTruthy();
  admin = (await signIn(A, DEMO_ADMIN)).cookie!;
  reviewer = (await signIn(B, DEMO_REVIEWER)).cookie!;
  expect(admin).toBeTruthy();
  expect(reviewer).toBeTruthy();
  // A second release with another configuration, published in-process with the same configured key.
  targets = await twoReleases(SITE);
});

describe("two app instances", () => {
  it("share sessions: a cookie from one works on the other", async () => {
    for (const [from, to] of [[A, B], [B, A]]) {
      const { cookie } = await signIn(from, DEMO_ADMIN, "192.0.2.20");
      const me = await fetch(`${to}/api/me`, { headers: { cookie: cookie! } });
      expect(me.status).toBe(200);
      expect((await me.json()).email ?? JSON.stringify(me)).toMatch(/ada\.admin/);
    }
    const nobody = await fetch(`${B}/api/me`);
    expect(nobody.status).toBe(401);
  });

  it("give a gateway identical bytes, ETag and signature from either", async () => {
    const issued = await (await api(A, admin, "POST", `/api/sites/${SITE}/gateways/${GATEWAY}/tokens`, { label: "two instances" })).json();
    const [ra, rb] = await Promise.all([pull(A, issued.token), pull(B, issued.token)]);
    expect([ra.status, rb.status]).toEqual([200, 200]);
    const [ba, bb] = [Buffer.from(await ra.arrayBuffer()), Buffer.from(await rb.arrayBuffer())];
    expect(ba.equals(bb)).toBe(true);
    expect(ra.headers.get("etag")).toBe(`"${digestHex(ba)}"`);
    expect(rb.headers.get("etag")).toBe(ra.headers.get("etag"));
    expect(rb.headers.get("bundle-signature")).toBe(ra.headers.get("bundle-signature"));
    expect(rb.headers.get("bundle-release")).toBe(ra.headers.get("bundle-release"));
    // Over real HTTP, a client that accepts gzip still gets the exact bytes under the identity ETag (Next.js compresses nothing here).
    const raw = await new Promise<{ headers: http.IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
      http.get(`${B}/api/gateway/v1/bundle`, { headers: { authorization: `Bearer ${issued.token}`, "accept-encoding": "gzip, deflate, br" } }, (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ headers: res.headers, body: Buffer.concat(chunks) }));
      }).on("error", reject);
    });
    expect(raw.headers["content-encoding"]).toBeUndefined();
    expect(raw.body.equals(ba)).toBe(true);
    expect(raw.headers.etag).toBe(ra.headers.get("etag"));
    // Each instance's 304 honours the other's ETag.
    expect((await pull(B, issued.token, { "if-none-match": ra.headers.get("etag")! })).status).toBe(304);
    // Both publish the same configured keys (not one generated per data directory).
    const ka = await (await fetch(`${A}/api/gateway/v1/signing-key`, { headers: { authorization: `Bearer ${issued.token}` } })).json();
    const kb = await (await fetch(`${B}/api/gateway/v1/signing-key`, { headers: { authorization: `Bearer ${issued.token}` } })).json();
    expect(kb).toEqual(ka);
    expect(ka.keys.map((k: { id: string }) => k.id)).toEqual(["sys1"]);
  });

  it("refuse a token revoked through the other on the next request", async () => {
    const issued = await (await api(A, admin, "POST", `/api/sites/${SITE}/gateways/${GATEWAY}/tokens`, { label: "revoke me" })).json();
    expect((await pull(B, issued.token)).status).toBe(200);
    const revoked = await api(A, admin, "DELETE", `/api/sites/${SITE}/gateways/${GATEWAY}/tokens/${issued.id}`);
    expect(revoked.status).toBe(200);
    const next = await pull(B, issued.token);
    expect(next.status).toBe(401);
    expect(next.headers.get("www-authenticate")).toMatch(/error="invalid_token"/);
  });

  it("number concurrent releases through both uniquely and in order", async () => {
    const conn = await db();
    try {
      const [{ latest: before }] = await conn.query("SELECT MAX(r.number) AS latest FROM releases r JOIN sites s ON s.id = r.site_id WHERE s.slug = ?", [SITE]);
      // Urgent rollbacks alternate between two releases whose configurations differ, through both instances at once.
      const calls = Array.from({ length: 8 }, (_, i) =>
        api(i % 2 ? B : A, reviewer, "POST", `/api/sites/${SITE}/rollbacks/urgent`, { release: targets[i % 2], reason: `system test: concurrent release ${i}` }).then(async (r) => ({
          status: r.status,
          body: await r.json(),
        })),
      );
      const results = await Promise.all(calls);
      // A rollback to the configuration already current is refused (422); nothing else may fail.
      for (const r of results) expect([201, 422], JSON.stringify(r)).toContain(r.status);
      const made = results.filter((r) => r.status === 201).map((r) => r.body.release as number);
      expect(made.length).toBeGreaterThanOrEqual(1);
      expect(new Set(made).size).toBe(made.length);
      const rows: { number: number; bundles: number }[] = await conn.query(
        `SELECT r.number, (SELECT COUNT(*) FROM bundles b WHERE b.release_id = r.id) AS bundles
           FROM releases r JOIN sites s ON s.id = r.site_id WHERE s.slug = ? ORDER BY r.number`,
        [SITE],
      );
      const numbers = rows.map((r) => r.number);
      expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, i) => i + 1)); // 1, 2, 3 … with no gap or repeat
      expect(numbers[numbers.length - 1]).toBe(before + made.length);
      expect(made.sort((x, y) => x - y)).toEqual(numbers.slice(numbers.length - made.length));
      const [{ counter }] = await conn.query("SELECT release_counter AS counter FROM sites WHERE slug = ?", [SITE]);
      expect(counter).toBe(numbers[numbers.length - 1]);
      for (const r of rows) expect(r.bundles, `release ${r.number}`).toBe(3);
    } finally {
      await conn.end();
    }
  });

  it("throttle sign-in across both instances (counters in the database)", async () => {
    const address = "198.51.100.77";
    const who = { email: "vic.viewer@demo.invalid", password: "wrong password" };
    const errors: (string | undefined)[] = [];
    for (let i = 0; i < 6; i++) errors.push((await signIn(i % 2 ? B : A, who, address)).error);
    console.log(`sign-in errors: ${JSON.stringify(errors)}`);
    // The first three failures of an account from one address are free; the fourth waits (lib/auth/throttle.ts).
    expect(errors.slice(0, 3).every((e) => e && !/Too many/.test(e))).toBe(true);
    expect(errors.slice(3).some((e) => e && /Too many failed attempts/.test(e))).toBe(true);
    // Even the right password waits while throttled, on either instance.
    const right = await signIn(A, { email: who.email, password: "demo-viewer-pass" }, address);
    expect(right.cookie).toBeNull();
    expect(right.error).toMatch(/Too many failed attempts/);
  });
});
