import { execFile } from "node:child_process";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";
import { hashToken, TOKEN_PATTERN } from "@/lib/gateway/token";
import { AuditEvent, GatewayToken } from "@/models";
import { createGateway, createGatewayToken, createSite } from "../factories";

// scripts/cli.ts as a script would run it: a child process on the test database (DATABASE_URL).
const run = promisify(execFile);

async function cli(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, ["--conditions=react-server", "--import", "tsx", "scripts/cli.ts", ...args], {
      env: process.env,
      timeout: 60_000,
    });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const e = err as { code?: number; stdout: string; stderr: string };
    if (typeof e.code !== "number") throw err;
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}

describe("gateway-token on the command line", () => {
  it("creates a token: only the token on stdout, stored hashed, audited as the command line", async () => {
    const site = await createSite();
    const gateway = await createGateway(site);
    const r = await cli("gateway-token", "create", "--site", site.slug, "--gateway", gateway.slug, "--label", "deploy job");
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/^sgw_[A-Za-z0-9_-]{43}\n$/);
    const token = r.stdout.trim();
    expect(token).toMatch(TOKEN_PATTERN);
    expect(r.stderr).toContain("shown only now");
    expect(r.stderr).not.toContain(token);
    const row = await GatewayToken.findOne({ where: { tokenHash: hashToken(token) } });
    expect(row).toMatchObject({ gatewayId: gateway.id, prefix: token.slice(0, 12), label: "deploy job", createdBy: null, revokedAt: null });
    expect(r.stderr).toContain(`id ${row!.id}`);
    const audit = await AuditEvent.findAll({ where: { entityType: "token", entityId: row!.id } });
    expect(audit.map((a) => [a.action, a.actorId, a.actorEmail])).toEqual([["token.create", null, "(cli)"]]);
  });

  it("creates a token with a lifetime (--expires-days); a bad one is refused before anything is written", async () => {
    const site = await createSite();
    const gateway = await createGateway(site);
    const where = ["--site", site.slug, "--gateway", gateway.slug];
    const t0 = Date.now();
    const r = await cli("gateway-token", "create", ...where, "--expires-days", "90");
    expect(r.code, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/expiring \d{4}-\d\d-\d\d \d\d:\d\d:\d\d UTC/);
    const row = await GatewayToken.findOne({ where: { tokenHash: hashToken(r.stdout.trim()) } });
    expect(row!.expiresAt!.getTime() - t0).toBeGreaterThanOrEqual(90 * 86_400_000 - 1_000);
    expect(row!.expiresAt!.getTime() - Date.now()).toBeLessThanOrEqual(90 * 86_400_000);
    const listed = await cli("gateway-token", "list", ...where);
    expect(listed.stdout.split("\n")[0]).toMatch(/STATE\s+CREATED \(UTC\)\s+BY\s+EXPIRES \(UTC\)/);
    expect(listed.stdout).toContain(row!.expiresAt!.toISOString().slice(0, 10));

    for (const [bad, why] of [["0", /1 day/], ["3651", /3650/], ["1.5", /whole number/], ["soon", /whole number/]] as const) {
      const refused = await cli("gateway-token", "create", ...where, "--expires-days", bad);
      expect(refused.code, bad).not.toBe(0);
      expect(refused.stderr, bad).toMatch(why);
      expect(refused.stdout, bad).toBe("");
    }
    const misplaced = await cli("gateway-token", "list", ...where, "--expires-days", "5");
    expect(misplaced.code).toBe(2);
    expect(misplaced.stderr).toContain("--expires-days does not apply to gateway-token list");
    expect(await GatewayToken.count({ where: { gatewayId: gateway.id } })).toBe(1);
  });

  it("lists by prefix and state, and revokes once", async () => {
    const site = await createSite();
    const gateway = await createGateway(site);
    const live = await createGatewayToken(gateway, { label: "keeps running" });
    const old = await createGatewayToken(gateway, { label: "to retire" });
    const where = ["--site", site.slug, "--gateway", gateway.slug];

    const revoked = await cli("gateway-token", "revoke", ...where, "--id", String(old.id));
    expect(revoked.code, revoked.stderr).toBe(0);
    expect(revoked.stdout).toMatch(new RegExp(`^${old.id}\trevoked\t${old.row.prefix}…\t\\d{4}-`));
    expect((await GatewayToken.findByPk(old.id))!.revokedAt).not.toBeNull();

    const listed = await cli("gateway-token", "list", ...where);
    expect(listed.code, listed.stderr).toBe(0);
    const lines = listed.stdout.trimEnd().split("\n");
    expect(lines[0]).toMatch(/^ID\s+PREFIX\s+STATE/);
    expect(lines.slice(1).map((l) => l.split(/\s{2,}/).slice(0, 3))).toEqual([
      [String(old.id), `${old.row.prefix}…`, "revoked"],
      [String(live.id), `${live.row.prefix}…`, "live"],
    ]);
    expect(listed.stdout).not.toContain(live.token);
    expect(listed.stdout).not.toContain(hashToken(live.token));

    const json = await cli("gateway-token", "list", ...where, "--json");
    expect(JSON.parse(json.stdout).map((t: { id: number; state: string }) => [t.id, t.state])).toEqual([
      [old.id, "revoked"],
      [live.id, "live"],
    ]);

    const again = await cli("gateway-token", "revoke", ...where, "--id", String(old.id));
    expect(again.code).toBe(1);
    expect(again.stdout).toBe("");
    expect(again.stderr).toContain("already revoked");
    expect(await AuditEvent.count({ where: { entityType: "token", entityId: old.id, action: "token.revoke" } })).toBe(1);
  });

  it("refuses an unknown gateway with exit 1, and usage errors with exit 2 and a usage line", async () => {
    const site = await createSite();
    const unknown = await cli("gateway-token", "create", "--site", site.slug, "--gateway", "no-such-gateway");
    expect(unknown).toMatchObject({ code: 1, stdout: "" });
    expect(unknown.stderr).toContain('no gateway "no-such-gateway"');

    const usage: string[][] = [
      [],
      ["gateway-tokens", "create"],
      ["gateway-token"],
      ["gateway-token", "rotate", "--site", "a", "--gateway", "b"],
      ["gateway-token", "create", "--gateway", "b"],
      ["gateway-token", "list", "--site", "a"],
      ["gateway-token", "revoke", "--site", "a", "--gateway", "b"],
      ["gateway-token", "revoke", "--site", "a", "--gateway", "b", "--id", "x1"],
      ["gateway-token", "create", "--site", "a", "--gateway", "b", "--id", "3"],
      ["gateway-token", "create", "--site", "a", "--gateway", "b", "--colour", "red"],
      ["gateway-token", "create", "--site", "a", "--gateway", "b", "extra"],
    ];
    for (const args of usage) {
      const r = await cli(...args);
      expect(r.code, args.join(" ")).toBe(2);
      expect(r.stdout, args.join(" ")).toBe("");
      expect(r.stderr, args.join(" ")).toMatch(/^usage: npm run -s cli -- gateway-token create/m);
    }
  });
});
