"use strict";
// The demo scenario: Larkmoor Valley Dairy Co-operative (invented) and its three plants.

const SITES = [
  {
    slug: "fenwick-creamery",
    name: "Fenwick Creamery",
    time_zone: "Europe/London",
    uplink_budget_kbps: 512,
    storage_price_per_gb_month: 0.023,
    retention_months: 36,
    default_handling: "pass-through",
    gateways: [
      { slug: "fw-gw-01", name: "Process hall gateway", description: "Reception, separators, pasteurisers and fillers.", poll_seconds: 60 },
      { slug: "fw-gw-02", name: "Utilities and CIP gateway", description: "Clean-in-place sets, boilers, chilled water and compressed air.", poll_seconds: 60 },
    ],
  },
  {
    slug: "osterby-cheese",
    name: "Osterby Cheese Works",
    time_zone: "Europe/Dublin",
    uplink_budget_kbps: 256,
    storage_price_per_gb_month: 0.025,
    retention_months: 24,
    default_handling: "pass-through",
    gateways: [
      { slug: "os-gw-01", name: "Vat room gateway", description: "Milk treatment, cheese vats and curd handling.", poll_seconds: 60 },
      { slug: "os-gw-02", name: "Whey and press gateway", description: "Whey separation, moulding and presses.", poll_seconds: 120 },
      { slug: "os-gw-03", name: "Ripening store gateway", description: "Brine baths and ripening-room climate.", poll_seconds: 300 },
    ],
  },
  {
    slug: "kestrel-ridge-powder",
    name: "Kestrel Ridge Milk Powder",
    time_zone: "Europe/London",
    uplink_budget_kbps: 1024,
    storage_price_per_gb_month: 0.021,
    retention_months: 60,
    default_handling: "drop",
    gateways: [
      { slug: "kr-gw-01", name: "Evaporator and dryer gateway", description: "Falling-film evaporator, spray dryer and fluid bed.", poll_seconds: 30 },
      { slug: "kr-gw-02", name: "Packing and utilities gateway", description: "Powder silos, bagging line, boilers and air handling.", poll_seconds: 60 },
    ],
  },
];

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  SITES,
  async up(queryInterface) {
    const now = new Date();
    await queryInterface.bulkInsert(
      "sites",
      SITES.map(({ gateways, ...s }) => ({ ...s, created_at: now, updated_at: now })),
      { ignoreDuplicates: true },
    );
    const ids = await queryInterface.sequelize.query("SELECT id, slug FROM sites WHERE slug IN (:slugs)", {
      replacements: { slugs: SITES.map((s) => s.slug) },
      type: queryInterface.sequelize.QueryTypes.SELECT,
    });
    const idOf = new Map(ids.map((r) => [r.slug, r.id]));
    const gateways = SITES.flatMap((s) =>
      s.gateways.map((g) => ({ ...g, site_id: idOf.get(s.slug), created_at: now, updated_at: now })),
    );
    await queryInterface.bulkInsert("gateways", gateways, { ignoreDuplicates: true });
  },
  async down(queryInterface) {
    const slugs = SITES.flatMap((s) => s.gateways.map((g) => g.slug));
    await queryInterface.bulkDelete("gateways", { slug: slugs });
    await queryInterface.bulkDelete("sites", { slug: SITES.map((s) => s.slug) });
  },
};
