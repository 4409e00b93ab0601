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
  for (const t of ["users", "sites", "gateways", "tags", "tag_groups", "tag_group_rules", "profiles", "profile_revisions", "assignments", "assignment_tag_overrides", "caution_acknowledgements", "releases", "changes"]) {
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

  it("holds at least 1,500 tags over the three plants, every kind present, ranges only on analog tags", async () => {
    const rows = await sequelize.query<{ slug: string; kind: string; n: number; ranged: number }>(
      "SELECT s.slug, t.kind, COUNT(*) AS n, SUM(t.eu_low IS NOT NULL) AS ranged FROM tags t JOIN sites s ON s.id = t.site_id WHERE s.slug IN ('fenwick-creamery','osterby-cheese','kestrel-ridge-powder') GROUP BY s.slug, t.kind",
      { type: QueryTypes.SELECT },
    );
    expect(rows.reduce((a, r) => a + r.n, 0)).toBeGreaterThanOrEqual(1500);
    for (const slug of ["fenwick-creamery", "osterby-cheese", "kestrel-ridge-powder"]) {
      expect(rows.filter((r) => r.slug === slug).map((r) => r.kind).sort()).toEqual(["analog", "counter", "discrete"]);
    }
    for (const r of rows) expect(Number(r.ranged)).toBe(r.kind === "analog" ? r.n : 0);
  });

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
