"use strict";
// The demo co-operative's tag inventory (about 1,700 tags over three plants) and a first
// set of tag groups per plant. Invented data, generated deterministically: same rows every run.

// Instrument templates: ISA-5.1-style letters, unit, sample period, kind, engineering range.
const I = {
  TT: { unit: "degC", period: 1000, kind: "analog", low: 0, high: 150, suffix: "PV" },
  TTF: { unit: "degC", period: 500, kind: "analog", low: 60, high: 95, suffix: "PV", code: "TT" }, // pasteuriser holding
  FT: { unit: "m3/h", period: 1000, kind: "analog", low: 0, high: 60, suffix: "PV" },
  LT: { unit: "%", period: 5000, kind: "analog", low: 0, high: 100, suffix: "PV" },
  PT: { unit: "kPa", period: 500, kind: "analog", low: 0, high: 1000, suffix: "PV" },
  DPT: { unit: "kPa", period: 1000, kind: "analog", low: -50, high: 150, suffix: "PV", code: "PDT" },
  VT: { unit: "mm/s", period: 100, kind: "analog", low: 0, high: 50, suffix: "PV" },
  AT: { unit: "mS/cm", period: 1000, kind: "analog", low: 0, high: 200, suffix: "PV" },
  ST: { unit: "rpm", period: 1000, kind: "analog", low: 0, high: 3000, suffix: "PV" },
  MT: { unit: "%", period: 10000, kind: "analog", low: 0, high: 10, suffix: "PV" }, // moisture
  HT: { unit: "%RH", period: 60000, kind: "analog", low: 0, high: 100, suffix: "PV" },
  XV: { unit: "state", period: 1000, kind: "discrete", low: null, high: null, suffix: "STATE" },
  YS: { unit: "state", period: 1000, kind: "discrete", low: null, high: null, suffix: "RUN" },
  FQ: { unit: "m3", period: 10000, kind: "counter", low: null, high: null, suffix: "TOT" },
  EQ: { unit: "kWh", period: 60000, kind: "counter", low: null, high: null, suffix: "TOT" },
};

// area, equipment prefix, units per line (each area has two lines), instruments per unit, gateway index
const PLANTS = {
  "fenwick-creamery": [
    ["RECV", "BAY", 4, ["FT", "TT", "XV", "XV", "FQ", "AT"], 0],
    ["SILO", "SL", 6, ["LT", "TT", "XV", "XV", "YS"], 0],
    ["SEP", "SP", 3, ["ST", "VT", "VT", "FT", "PT", "TT", "YS", "FQ"], 0],
    ["PAST1", "HX", 4, ["TTF", "TTF", "TTF", "FT", "PT", "DPT", "XV", "XV", "XV"], 0],
    ["PAST2", "HX", 4, ["TTF", "TTF", "TTF", "FT", "PT", "DPT", "XV", "XV", "XV"], 0],
    ["FILL", "FL", 6, ["ST", "VT", "PT", "XV", "YS", "FQ", "TT"], 0],
    ["CIP1", "CS", 4, ["TT", "TT", "FT", "AT", "LT", "PT", "XV", "XV", "XV", "XV", "FQ"], 1],
    ["CIP2", "CS", 4, ["TT", "TT", "FT", "AT", "LT", "PT", "XV", "XV", "XV", "XV", "FQ"], 1],
    ["BOIL", "BL", 2, ["PT", "TT", "LT", "FT", "FQ", "EQ", "YS", "AT"], 1],
    ["CHW", "CH", 4, ["TT", "TT", "FT", "PT", "VT", "YS", "EQ"], 1],
    ["AIR", "AC", 4, ["PT", "TT", "VT", "VT", "YS", "EQ", "HT"], 1],
  ],
  "osterby-cheese": [
    ["MILK", "MT", 4, ["LT", "TT", "FT", "XV", "XV", "FQ"], 0],
    ["THERM", "HX", 2, ["TTF", "TTF", "TTF", "FT", "PT", "DPT", "XV", "XV"], 0],
    ["VAT", "CV", 10, ["TT", "TT", "LT", "ST", "VT", "XV", "XV", "YS", "AT"], 0],
    ["CURD", "DR", 4, ["ST", "VT", "TT", "LT", "YS", "FQ"], 0],
    ["WHEY", "WS", 3, ["FT", "TT", "AT", "PT", "ST", "VT", "FQ", "XV"], 1],
    ["PRESS", "PR", 8, ["PT", "PT", "YS", "XV", "TT"], 1],
    ["BRINE", "BB", 4, ["TT", "AT", "LT", "FT", "XV"], 2],
    ["RIPEN", "RR", 8, ["TT", "HT", "TT", "HT", "YS", "EQ"], 2],
  ],
  "kestrel-ridge-powder": [
    ["EVAP", "EV", 2, ["TT", "TT", "TT", "PT", "PT", "FT", "FT", "LT", "DPT", "AT", "ST", "VT", "XV", "XV", "FQ"], 0],
    ["DRYER", "SD", 2, ["TT", "TT", "TT", "TT", "PT", "DPT", "FT", "ST", "VT", "VT", "MT", "HT", "YS", "XV", "EQ"], 0],
    ["FBED", "FB", 2, ["TT", "TT", "DPT", "FT", "VT", "MT", "YS"], 0],
    ["SILO", "PS", 6, ["LT", "TT", "HT", "XV", "YS"], 1],
    ["BAG", "BG", 4, ["ST", "VT", "PT", "YS", "XV", "FQ"], 1],
    ["BOIL", "BL", 2, ["PT", "TT", "LT", "FT", "FQ", "EQ", "YS", "AT"], 1],
    ["AHU", "AH", 6, ["TT", "TT", "HT", "PT", "VT", "YS", "EQ"], 1],
  ],
};

function tagsFor(slug) {
  const rows = [];
  for (const [area, eqPrefix, units, instruments, gw] of PLANTS[slug]) {
    for (let u = 1; u <= units * 2; u++) {
      const equipment = `${eqPrefix}-${String(u).padStart(2, "0")}`;
      const seen = new Map();
      instruments.forEach((key) => {
        const t = I[key];
        const code = t.code ?? key.replace(/F$/, "");
        const n = (seen.get(code) ?? 0) + 1;
        seen.set(code, n);
        const number = `${code}-${u}${String(n).padStart(2, "0")}`;
        rows.push({
          name: `${area}/${number}/${t.suffix}`,
          unit: t.unit,
          sample_period_ms: t.period,
          kind: t.kind,
          eu_low: t.low,
          eu_high: t.high,
          area,
          equipment,
          gw,
        });
      });
    }
  }
  return rows;
}

const sel = (o) => ({ patterns: [], units: [], kinds: [], areas: [], equipment: [], gateways: [], include: [], exclude: [], ...o });

const GROUPS = {
  "fenwick-creamery": [
    ["pasteuriser-temperatures", "Holding and heating temperatures of both pasteurisers.", true, sel({ patterns: ["PAST*/TT-*/PV"] })],
    ["cip-temperatures", "Clean-in-place supply and return temperatures.", true, sel({ patterns: ["CIP*/TT-*/PV"] })],
    ["vibration", "Separator, filler, chiller and compressor vibration.", false, sel({ patterns: ["**/VT-*/PV"] })],
    ["process-temperatures", "Every other temperature.", false, sel({ units: ["degC"], kinds: ["analog"] })],
    ["flows-and-pressures", "", false, sel({ units: ["m3/h", "kPa"] })],
    ["levels", "", false, sel({ patterns: ["**/LT-*/PV"] })],
    ["valve-states", "", false, sel({ kinds: ["discrete"] })],
    ["totalisers", "Flow and energy totalisers.", false, sel({ kinds: ["counter"] })],
  ],
  "osterby-cheese": [
    ["thermiser-temperatures", "Milk heat treatment before the vats.", true, sel({ patterns: ["THERM/TT-*/PV"] })],
    ["vat-temperatures", "", false, sel({ patterns: ["VAT/TT-*/PV"] })],
    ["ripening-climate", "", false, sel({ areas: ["RIPEN"], units: ["degC", "%RH"] })],
    ["vibration", "", false, sel({ patterns: ["**/VT-*/PV"] })],
    ["states", "", false, sel({ kinds: ["discrete"] })],
    ["totalisers", "", false, sel({ kinds: ["counter"] })],
  ],
  "kestrel-ridge-powder": [
    ["dryer-temperatures", "Inlet, outlet and chamber temperatures.", false, sel({ patterns: ["DRYER/TT-*/PV", "FBED/TT-*/PV"] })],
    ["evaporator", "", false, sel({ areas: ["EVAP"], kinds: ["analog"] })],
    ["vibration", "", false, sel({ patterns: ["**/VT-*/PV"] })],
    ["powder-moisture", "", false, sel({ patterns: ["DRYER/MT-*/PV", "FBED/MT-*/PV"] })],
    ["states", "", false, sel({ kinds: ["discrete"] })],
  ],
};

function rulesOf(s) {
  const out = [];
  const add = (field, values) => values.forEach((value) => out.push({ field, value }));
  add("pattern", s.patterns);
  add("unit", s.units);
  add("kind", s.kinds);
  add("area", s.areas);
  add("equipment", s.equipment);
  add("gateway", s.gateways);
  add("include", s.include);
  add("exclude", s.exclude);
  return out;
}

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  PLANTS,
  tagsFor,
  async up(queryInterface) {
    const { QueryTypes } = queryInterface.sequelize;
    const now = new Date();
    for (const slug of Object.keys(PLANTS)) {
      const [site] = await queryInterface.sequelize.query("SELECT id FROM sites WHERE slug = ?", { replacements: [slug], type: QueryTypes.SELECT });
      if (!site) continue;
      const gws = await queryInterface.sequelize.query("SELECT id FROM gateways WHERE site_id = ? ORDER BY slug", {
        replacements: [site.id],
        type: QueryTypes.SELECT,
      });
      const rows = tagsFor(slug).map(({ gw, ...t }) => ({ ...t, site_id: site.id, gateway_id: gws[Math.min(gw, gws.length - 1)].id, created_at: now, updated_at: now }));
      for (let i = 0; i < rows.length; i += 500) await queryInterface.bulkInsert("tags", rows.slice(i, i + 500), { ignoreDuplicates: true });

      for (const [i, [name, description, regulated, selector]] of GROUPS[slug].entries()) {
        await queryInterface.bulkInsert(
          "tag_groups",
          [{ site_id: site.id, name, description, regulated, priority: (i + 1) * 10, created_at: now, updated_at: now }],
          { ignoreDuplicates: true },
        );
        const [group] = await queryInterface.sequelize.query("SELECT id FROM tag_groups WHERE site_id = ? AND name = ?", {
          replacements: [site.id, name],
          type: QueryTypes.SELECT,
        });
        const [{ n }] = await queryInterface.sequelize.query("SELECT COUNT(*) AS n FROM tag_group_rules WHERE group_id = ?", {
          replacements: [group.id],
          type: QueryTypes.SELECT,
        });
        if (Number(n) === 0) {
          const rules = rulesOf(selector).map((r, position) => ({ ...r, group_id: group.id, position }));
          if (rules.length) await queryInterface.bulkInsert("tag_group_rules", rules);
        }
      }
    }
  },
  async down(queryInterface) {
    const { QueryTypes } = queryInterface.sequelize;
    for (const slug of Object.keys(PLANTS)) {
      const [site] = await queryInterface.sequelize.query("SELECT id FROM sites WHERE slug = ?", { replacements: [slug], type: QueryTypes.SELECT });
      if (!site) continue;
      await queryInterface.bulkDelete("tag_groups", { site_id: site.id, name: GROUPS[slug].map((g) => g[0]) });
      const names = tagsFor(slug).map((t) => t.name);
      for (let i = 0; i < names.length; i += 500) await queryInterface.bulkDelete("tags", { site_id: site.id, name: names.slice(i, i + 500) });
    }
  },
};
