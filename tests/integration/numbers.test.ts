import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { AuditEvent, Site, sequelize } from "@/models";
import { createSite, createUser } from "../factories";

// The mariadb 3.x driver returns BigInt for BIGINT columns, insert ids, COUNT() and
// DECIMAL as strings unless configured (lib/db.ts): every one of them must be a number.
describe("numbers from MariaDB", () => {
  it("returns auto-increment ids as numbers", async () => {
    const user = await createUser();
    expect(typeof user.id).toBe("number");
    const site = await createSite();
    const again = await Site.findByPk(site.id);
    expect(typeof again!.id).toBe("number");
  });

  it("returns BIGINT ids, COUNT() and SUM() as numbers", async () => {
    const user = await createUser();
    const ev = await AuditEvent.create({
      actorId: user.id,
      actorEmail: user.email,
      action: "test.numbers",
      entityType: "test",
      entityId: null,
      entityLabel: "",
      siteId: null,
      beforeJson: null,
      afterJson: { a: 1 },
    });
    expect(typeof ev.id).toBe("number");
    const fetched = await AuditEvent.findByPk(ev.id);
    expect(typeof fetched!.id).toBe("number");
    expect(fetched!.afterJson).toEqual({ a: 1 });
    const [row] = await sequelize.query<{ n: unknown; s: unknown }>("SELECT COUNT(*) AS n, SUM(id) AS s FROM audit_events", {
      type: QueryTypes.SELECT,
    });
    expect(typeof row.n).toBe("number");
    expect(typeof row.s).toBe("number");
    expect(typeof (await Site.count())).toBe("number");
  });

  it("returns DECIMAL columns as numbers", async () => {
    const site = await createSite();
    const again = await Site.findByPk(site.id);
    expect(again!.storagePricePerGbMonth).toBe(0.02);
    expect(again!.uplinkBudgetKbps).toBe(256);
  });
});
