import { execFileSync } from "node:child_process";
import path from "node:path";
import { QueryTypes, Sequelize } from "sequelize";
import { afterAll, describe, expect, it } from "vitest";

// Runs every migration up, all the way down, and up again on a database of its own.
const url = process.env.MIGRATIONS_TEST_DATABASE_URL;
const cli = path.resolve("node_modules/.bin/sequelize-cli");

function sequelizeCli(...args: string[]) {
  execFileSync(cli, args, { env: { ...process.env, DATABASE_URL: url }, stdio: "pipe" });
}

describe.runIf(url)("migrations", () => {
  const db = new Sequelize(url ?? "mariadb://x@127.0.0.1/x", { logging: false, dialectOptions: { bigIntAsNumber: true } });
  afterAll(() => db.close());

  const tables = async () =>
    (await db.query<{ t: string }>("SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE()", { type: QueryTypes.SELECT }))
      .map((r) => r.t)
      .filter((t) => t !== "sequelize_meta")
      .sort();

  it("run up, down and up again", async () => {
    sequelizeCli("db:migrate");
    const first = await tables();
    expect(first).toEqual(expect.arrayContaining(["users", "sites", "gateways", "audit_events", "sign_in_throttles"]));
    sequelizeCli("db:migrate:undo:all");
    expect(await tables()).toEqual([]);
    sequelizeCli("db:migrate");
    expect(await tables()).toEqual(first);
  }, 120_000);

  it("enforce constraints in the database", async () => {
    sequelizeCli("db:migrate");
    const now = "2026-12-01 00:00:00";
    await db.query(
      `INSERT INTO sites (slug, name, time_zone, uplink_budget_kbps, storage_price_per_gb_month, retention_months, created_at, updated_at)
       VALUES ('dup', 'A', 'UTC', 1, 0, 1, '${now}', '${now}')`,
    );
    await expect(
      db.query(
        `INSERT INTO sites (slug, name, time_zone, uplink_budget_kbps, storage_price_per_gb_month, retention_months, created_at, updated_at)
         VALUES ('dup', 'B', 'UTC', 1, 0, 1, '${now}', '${now}')`,
      ),
    ).rejects.toMatchObject({ name: "SequelizeUniqueConstraintError" });
    await expect(
      db.query(`INSERT INTO gateways (site_id, slug, name, created_at, updated_at) VALUES (999999, 'g', 'G', '${now}', '${now}')`),
    ).rejects.toMatchObject({ name: "SequelizeForeignKeyConstraintError" });
    await expect(
      db.query(
        `INSERT INTO sites (slug, name, time_zone, uplink_budget_kbps, storage_price_per_gb_month, retention_months, created_at, updated_at)
         VALUES ('neg', 'C', 'UTC', -5, 0, 1, '${now}', '${now}')`,
      ),
    ).rejects.toThrow(/CONSTRAINT|check/i);
  }, 60_000);
});
