import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { describeError } from "@/lib/http";
import { sequelize } from "@/models";
import { createGateway, createSite } from "../../factories";
import { Hostile, countRows, changedTables } from "./harness";

// The last line of defence: a value a schema let through but a column cannot hold (too
// long, out of range, not a value of its type, against a CHECK constraint) must answer 422
// naming the column, never 500. Each statement here bypasses the schemas on purpose.

const h = new Hostile("database errors behind the schemas");

async function failure(sql: string, replacements: unknown[]): Promise<unknown> {
  try {
    await sequelize.query(sql, { replacements, type: QueryTypes.UPDATE });
  } catch (err) {
    return err;
  }
  throw new Error(`the statement succeeded: ${sql}`);
}

describe("hostile input: database errors a schema missed", () => {
  it("answers 422 naming the column for data errors (1406, 1264, 1366, 1292) and CHECK constraints (4025)", async () => {
    const site = await createSite();
    const gw = await createGateway(site);
    const cases: { label: string; errno: number; sql: string; args: unknown[]; field?: string; mentions?: string }[] = [
      { label: "a name too long for VARCHAR(120)", errno: 1406, sql: "UPDATE sites SET name = ? WHERE id = ?", args: ["x".repeat(121), site.id], field: "name" },
      { label: "1e12 kbit/s in DECIMAL(12,3)", errno: 1264, sql: "UPDATE sites SET uplink_budget_kbps = ? WHERE id = ?", args: [1e12, site.id], field: "uplinkBudgetKbps" },
      { label: "-1 in an unsigned column", errno: 1264, sql: "UPDATE gateways SET poll_seconds = ? WHERE id = ?", args: [-1, gw.id], field: "pollSeconds" },
      { label: "text in an integer column", errno: 1366, sql: "UPDATE sites SET retention_months = ? WHERE id = ?", args: ["twelve", site.id], field: "retentionMonths" },
      { label: "a date in year 99999", errno: 1292, sql: "UPDATE gateways SET last_check_in_at = ? WHERE id = ?", args: ["99999-01-01 00:00:00", gw.id], field: "lastCheckInAt" },
      { label: "an uplink budget of 0 (CHECK sites_positive)", errno: 4025, sql: "UPDATE sites SET uplink_budget_kbps = 0 WHERE id = ?", args: [site.id], mentions: "sites_positive" },
      { label: "a poll of 1 s (CHECK gateways_poll_range)", errno: 4025, sql: "UPDATE gateways SET poll_seconds = 1 WHERE id = ?", args: [gw.id], mentions: "gateways_poll_range" },
    ];
    for (const c of cases) {
      await h.action(c.label, "database error", async () => {
        const before = await countRows();
        const err = await failure(c.sql, c.args);
        expect((err as { parent?: { errno?: number } }).parent?.errno, c.label).toBe(c.errno);
        expect(changedTables(before, await countRows())).toEqual([]);
        const { status, body } = describeError(err);
        if (c.mentions) expect.soft(body.error, c.label).toContain(c.mentions);
        return { ok: false, status, ...body };
      }, { field: c.field ?? null });
    }
    expect(h.summary()).toBe(cases.length);
  });
});
