import { createRequire } from "node:module";
import path from "node:path";
import fs from "node:fs";
import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { sequelize } from "@/models";

const require = createRequire(import.meta.url);
const seedersDir = path.resolve("seeders");

async function counts() {
  const out: Record<string, number> = {};
  for (const t of ["users", "sites", "gateways"]) {
    const [r] = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${t}`, { type: QueryTypes.SELECT });
    out[t] = r.n;
  }
  return out;
}

describe("demo seed", () => {
  it("gives the same row counts when applied twice", async () => {
    const qi = sequelize.getQueryInterface();
    const files = fs.readdirSync(seedersDir).filter((f) => f.endsWith(".js")).sort();
    expect(files.length).toBeGreaterThan(0);
    // npm test already seeded once; apply every seeder again, twice.
    const before = await counts();
    expect(before.users).toBeGreaterThanOrEqual(4);
    for (let i = 0; i < 2; i++) {
      for (const f of files) await require(path.join(seedersDir, f)).up(qi, sequelize.constructor);
      expect(await counts()).toEqual(before);
    }
  }, 60_000);

  it("holds the three plants of the demo co-operative with their gateways", async () => {
    const sites = await sequelize.query<{ slug: string; n: number }>(
      "SELECT s.slug, COUNT(g.id) AS n FROM sites s JOIN gateways g ON g.site_id = s.id WHERE s.slug IN ('fenwick-creamery','osterby-cheese','kestrel-ridge-powder') GROUP BY s.slug ORDER BY s.slug",
      { type: QueryTypes.SELECT },
    );
    expect(sites).toEqual([
      { slug: "fenwick-creamery", n: 2 },
      { slug: "kestrel-ridge-powder", n: 2 },
      { slug: "osterby-cheese", n: 3 },
    ]);
  });
});
