import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { digestHex } from "@/lib/bundles/digest";
import { verifyBytes } from "@/lib/bundles/signing";
import { A, B, DEMO_ADMIN, DEMO_REVIEWER, api, db, killDatabase, pull, signIn, startDatabase, twoReleases } from "./harness";

// MariaDB stopped (killed) under a gateway pull load and during releases (issue #11 part 3):
// 503 with Retry-After while it is down, no errors within 5 s of its return, and no
// half-written release afterwards.

const SITE = "kestrel-ridge-powder";
const GATEWAY = "kr-gw-01";
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

let token: string;
let reviewer: string;
let targets: [number, number];

beforeAll(async () => {
  const admin = (await signIn(A, DEMO_ADMIN, "192.0.2.30")).cookie!;
  reviewer = (await signIn(B, DEMO_REVIEWER, "192.0.2.31")).cookie!;
  const res = await api(A, admin, "POST", `/api/sites/${SITE}/gateways/${GATEWAY}/tokens`, { label: "database faults" });
  expect(res.status).toBe(201);
  token = (await res.json()).token;
  targets = await twoReleases(SITE);
  const { sequelize: s } = await import("@/models");
  await s.close(); // this process must not hold connections across the restarts below
});

afterAll(async () => {
  // Leave the server running for whatever comes next.
  const conn = await db().catch(() => null);
  if (conn) await conn.end();
  else await startDatabase();
});

type Seen = { at: number; status: number; retryAfter: string | null; body: string };

/** Clients pulling from both instances in a loop until stopped; every answer is kept. */
function pullLoad(clients: number) {
  const seen: Seen[] = [];
  let running = true;
  let etag: string | null = null;
  const client = async (i: number) => {
    while (running) {
      const res = await pull(i % 2 ? B : A, token, etag && i % 3 ? { "if-none-match": etag } : {}).catch(() => null);
      if (!res) {
        seen.push({ at: Date.now(), status: 0, retryAfter: null, body: "connection failed" });
        continue;
      }
      const body = await res.text();
      if (res.status === 200) etag = res.headers.get("etag");
      seen.push({ at: Date.now(), status: res.status, retryAfter: res.headers.get("retry-after"), body: res.status >= 400 ? body : "" });
      await sleep(5);
    }
  };
  const done = Promise.all(Array.from({ length: clients }, (_, i) => client(i)));
  return { seen, stop: async () => ((running = false), await done) };
}

describe("database faults", () => {
  it("answer 503 with Retry-After while MariaDB is down under pull load, and recover within 5 s", async () => {
    const load = pullLoad(20);
    await sleep(1500);
    const killedAt = Date.now();
    await killDatabase();
    await sleep(3000);
    const restarting = Date.now();
    await startDatabase();
    const backAt = Date.now();
    await sleep(8000);
    await load.stop();

    const before = load.seen.filter((s) => s.at < killedAt);
    const down = load.seen.filter((s) => s.at > killedAt + 1000 && s.at < restarting);
    const after = load.seen.filter((s) => s.at > backAt + 5000);
    expect(before.length).toBeGreaterThan(10);
    expect(before.every((s) => s.status === 200 || s.status === 304)).toBe(true);
    expect(down.length).toBeGreaterThan(5);
    // While down: 503 with Retry-After and a JSON error, never a 500 or a stack trace.
    for (const s of down) {
      expect(s.status, s.body).toBe(503);
      expect(Number(s.retryAfter)).toBeGreaterThan(0);
      expect(JSON.parse(s.body).error).toMatch(/database/);
    }
    expect(load.seen.some((s) => s.status === 500 || s.status === 0)).toBe(false);
    // Five seconds after the database is back, no errors at all.
    expect(after.length).toBeGreaterThan(10);
    expect(after.filter((s) => s.status !== 200 && s.status !== 304)).toEqual([]);
  }, 120_000);

  it("leave no half-written release when MariaDB dies during releases", async () => {
    const attempts: Promise<number>[] = [];
    let go = true;
    const releaser = (async () => {
      for (let i = 0; go && i < 200; i++) {
        const p = api(i % 2 ? B : A, reviewer, "POST", `/api/sites/${SITE}/rollbacks/urgent`, { release: targets[i % 2], reason: `system test: release during a fault ${i}` })
          .then((r) => r.status)
          .catch(() => 0);
        attempts.push(p);
        await p;
      }
    })();
    await sleep(2500);
    await killDatabase();
    await sleep(1500);
    go = false;
    await releaser;
    await startDatabase();
    await sleep(2000);
    const statuses = await Promise.all(attempts);
    console.log(`releases during the fault: ${JSON.stringify(statuses)}`);
    expect(statuses.filter((s) => s === 201).length).toBeGreaterThan(0);
    expect(statuses.some((s) => s === 503)).toBe(true);
    expect(statuses.filter((s) => ![201, 422, 503].includes(s))).toEqual([]);

    const conn = await db();
    try {
      const keys = await (await fetch(`${A}/api/gateway/v1/signing-key`, { headers: { authorization: `Bearer ${token}` } })).json();
      const publicKey = new Map<string, string>(keys.keys.map((k: { id: string; publicKey: string }) => [k.id, k.publicKey]));
      const releases: { id: number; number: number }[] = await conn.query(
        "SELECT r.id, r.number FROM releases r JOIN sites s ON s.id = r.site_id WHERE s.slug = ? ORDER BY r.number",
        [SITE],
      );
      const [{ gateways }] = await conn.query("SELECT COUNT(*) AS gateways FROM gateways g JOIN sites s ON s.id = g.site_id WHERE s.slug = ?", [SITE]);
      expect(releases.map((r) => r.number)).toEqual(releases.map((_, i) => i + 1));
      for (const r of releases) {
        const bundles: { digest: string; key_id: string; signature: string; bytes: Buffer }[] = await conn.query("SELECT digest, key_id, signature, bytes FROM bundles WHERE release_id = ?", [r.id]);
        expect(bundles.length, `release ${r.number}`).toBe(gateways);
        for (const b of bundles) {
          expect(digestHex(b.bytes)).toBe(b.digest);
          expect(verifyBytes(publicKey.get(b.key_id)!, b.bytes, b.signature), `release ${r.number}`).toBe(true);
        }
      }
    } finally {
      await conn.end();
    }
    // And the gateways are served again.
    expect((await pull(A, token)).status).toBe(200);
  }, 120_000);
});
