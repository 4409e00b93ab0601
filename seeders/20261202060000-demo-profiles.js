"use strict";

const { tagsFor } = require("./20261202040000-demo-tags-and-groups.js");

// Demo reduction profiles (invented for the demo; parameters are plausible, not recommendations).
const minute = (fn) => ({ method: "aggregate", fn, window: 60 });
const PROFILES = [
  {
    name: "1-minute statistics",
    revisions: [
      {
        kinds: ["analog"],
        description: "Mean, low and high of good samples per minute.",
        outputs: [
          { name: "avg", steps: [minute("mean")] },
          { name: "lo", steps: [minute("min")] },
          { name: "hi", steps: [minute("max")] },
        ],
      },
    ],
  },
  {
    name: "Temperature shape",
    revisions: [
      {
        kinds: ["analog"],
        description: "Good samples only, shape kept with swinging door.",
        outputs: [
          {
            name: "shape",
            steps: [
              { method: "quality-filter", keep: "good" },
              { method: "swinging-door", deviation: { value: 0.3, unit: "degC" }, "max-interval": 600 },
            ],
          },
        ],
      },
      {
        kinds: ["analog"],
        description: "Good samples only, shape kept with swinging door (tighter deviation).",
        outputs: [
          {
            name: "shape",
            steps: [
              { method: "quality-filter", keep: "good" },
              { method: "swinging-door", deviation: { value: 0.2, unit: "degC" }, "max-interval": 600 },
            ],
          },
        ],
        note: "Tighter deviation after the holding-tube review.",
      },
    ],
  },
  {
    name: "Vibration exceedances",
    revisions: [
      {
        kinds: ["analog"],
        description: "Upward crossings of the alert level per minute, windows with repeated crossings as events, and the peak.",
        outputs: [
          { name: "crossings", steps: [{ method: "exceedance-count", window: 60, threshold: { value: 7.1, unit: "mm/s" }, hysteresis: { value: 0.5, unit: "mm/s" } }] },
          { name: "events", steps: [{ method: "exceedance-events", window: 600, threshold: { value: 7.1, unit: "mm/s" }, limit: 3, hysteresis: { value: 0.5, unit: "mm/s" } }] },
          { name: "peak", steps: [minute("max")] },
        ],
      },
    ],
  },
  {
    name: "Valve state changes",
    revisions: [
      {
        kinds: ["discrete"],
        description: "Every change of state, and the number of transitions per hour.",
        outputs: [
          { name: "state", steps: [{ method: "change-of-state" }] },
          { name: "transitions", steps: [{ method: "transition-count", window: 3600 }] },
        ],
      },
    ],
  },
  {
    name: "Totaliser delta",
    revisions: [
      {
        kinds: ["counter"],
        description: "Quarter-hour increase of a totaliser that wraps at 10^9.",
        outputs: [{ name: "delta", steps: [{ method: "counter-delta", window: 900, rollover: 1e9 }] }],
      },
    ],
  },
  {
    name: "Flow and pressure deadband",
    revisions: [
      {
        kinds: ["analog"],
        description: "Report a change of more than 0.5 % of the engineering range, at least every 5 minutes.",
        outputs: [{ name: "value", steps: [{ method: "quality-filter", keep: "good-and-uncertain" }, { method: "deadband", deadband: { percent: 0.5 }, "max-interval": 300 }] }],
      },
    ],
  },
];

// group → [profile, revision]
const ASSIGN = {
  "fenwick-creamery": {
    "pasteuriser-temperatures": ["Temperature shape", 1],
    "cip-temperatures": ["Temperature shape", 1],
    vibration: ["Vibration exceedances", 1],
    "process-temperatures": ["1-minute statistics", 1],
    "flows-and-pressures": ["Flow and pressure deadband", 1],
    levels: ["1-minute statistics", 1],
    "valve-states": ["Valve state changes", 1],
    totalisers: ["Totaliser delta", 1],
  },
  "osterby-cheese": {
    "thermiser-temperatures": ["Temperature shape", 2],
    "vat-temperatures": ["1-minute statistics", 1],
    "ripening-climate": ["1-minute statistics", 1],
    vibration: ["Vibration exceedances", 1],
    states: ["Valve state changes", 1],
    totalisers: ["Totaliser delta", 1],
  },
  "kestrel-ridge-powder": {
    "dryer-temperatures": ["Temperature shape", 2],
    evaporator: ["1-minute statistics", 1],
    vibration: ["Vibration exceedances", 1],
    "powder-moisture": ["1-minute statistics", 1],
    states: ["Valve state changes", 1],
  },
};

// The one noisy transmitter: a wider deadband for the first separator pressure at Fenwick.
const NOISY = { site: "fenwick-creamery", group: "flows-and-pressures", prefix: "SEP/PT-", overrides: [{ output: "value", step: 1, parameter: "deadband", value: { percent: 1.5 } }] };

// Copied from lib/cautions.ts (a seeder cannot import TypeScript); the seed test checks they agree.
const CAUTION = {
  id: "regulated-record/1",
  text:
    "Reduction is lossy: the cloud receives fewer samples than the plant measured. For regulated records " +
    "(pasteurisation, safety-instrumented or custody-transfer signals) keep the raw record wherever local " +
    "regulations and licensed practice require it. Sluice does not replace that record and does not decide " +
    "what the law requires; follow your local codes and your qualified engineers.",
};

const RULE_KEYS = { pattern: "patterns", unit: "units", kind: "kinds", area: "areas", equipment: "equipment", gateway: "gateways", include: "include", exclude: "exclude" };

module.exports = {
  PROFILES,
  ASSIGN,
  CAUTION,
  async up(queryInterface) {
    const db = queryInterface.sequelize;
    const { QueryTypes } = db;
    await db.transaction(async (transaction) => {
      const q = (sql, replacements) => db.query(sql, { replacements, type: QueryTypes.SELECT, transaction });
      const [existing] = await q("SELECT COUNT(*) AS n FROM profiles WHERE name IN (?)", [PROFILES.map((p) => p.name)]);
      if (Number(existing.n) > 0) return;
      const [eli] = await q("SELECT id, email FROM users WHERE email = 'eli.engineer@demo.invalid'");
      const [rui] = await q("SELECT id FROM users WHERE email = 'rui.reviewer@demo.invalid'");
      const author = eli ? eli.id : null;
      const day = 86_400_000;
      const start = Date.now() - 30 * day;
      const revisionIds = new Map();
      for (const [pi, p] of PROFILES.entries()) {
        const last = p.revisions[p.revisions.length - 1];
        const created = new Date(start + pi * 3_600_000);
        await db.query(
          "INSERT INTO profiles (name, description, kinds, latest_revision, created_by, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?)",
          { replacements: [p.name, last.description, last.kinds.join(","), p.revisions.length, author, created, created], transaction },
        );
        const [row] = await q("SELECT id FROM profiles WHERE name = ?", [p.name]);
        for (const [ri, r] of p.revisions.entries()) {
          const document = { name: p.name, description: r.description, kinds: r.kinds, outputs: r.outputs };
          const at = new Date(created.getTime() + ri * 10 * day);
          await db.query("INSERT INTO profile_revisions (profile_id, number, document, note, created_by, created_at) VALUES (?, ?, ?, ?, ?, ?)", {
            replacements: [row.id, ri + 1, JSON.stringify(document), r.note ?? (ri === 0 ? "Created" : ""), author, at],
            transaction,
          });
          const [rev] = await q("SELECT id FROM profile_revisions WHERE profile_id = ? AND number = ?", [row.id, ri + 1]);
          revisionIds.set(`${p.name}#${ri + 1}`, { id: rev.id, profileId: row.id });
        }
      }

      const now = new Date();
      for (const [slug, groups] of Object.entries(ASSIGN)) {
        const [site] = await q("SELECT id FROM sites WHERE slug = ?", [slug]);
        if (!site) continue;
        const snapshot = [];
        const groupRows = await q("SELECT id, name, description, priority, regulated FROM tag_groups WHERE site_id = ? ORDER BY priority, name", [site.id]);
        for (const g of groupRows) {
          const pin = groups[g.name];
          let assignment = null;
          if (pin) {
            const rev = revisionIds.get(`${pin[0]}#${pin[1]}`);
            const overrides = [];
            const tagOverrides = [];
            if (slug === NOISY.site && g.name === NOISY.group) {
              const name = tagsFor(slug).find((t) => t.name.startsWith(NOISY.prefix))?.name;
              const [tag] = name ? await q("SELECT id, name FROM tags WHERE site_id = ? AND name = ?", [site.id, name]) : [];
              if (tag) tagOverrides.push({ tag, overrides: NOISY.overrides });
            }
            await db.query("INSERT INTO assignments (group_id, profile_revision_id, overrides, updated_by, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)", {
              replacements: [g.id, rev.id, JSON.stringify(overrides), author, now, now],
              transaction,
            });
            const [a] = await q("SELECT id FROM assignments WHERE group_id = ?", [g.id]);
            for (const t of tagOverrides) {
              await db.query("INSERT INTO assignment_tag_overrides (assignment_id, tag_id, overrides) VALUES (?, ?, ?)", {
                replacements: [a.id, t.tag.id, JSON.stringify(t.overrides)],
                transaction,
              });
            }
            if (g.regulated && eli) {
              await db.query(
                "INSERT INTO caution_acknowledgements (site_id, group_id, group_name, profile_revision_id, caution_id, caution_text, user_id, user_email, acknowledged_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)",
                { replacements: [site.id, g.id, g.name, rev.id, CAUTION.id, CAUTION.text, eli.id, eli.email, now], transaction },
              );
            }
            assignment = {
              profileId: rev.profileId,
              profile: pin[0],
              revision: pin[1],
              revisionId: rev.id,
              overrides,
              tags: tagOverrides.map((t) => ({ tag: t.tag.name, overrides: t.overrides })),
            };
          }
          const rules = await q("SELECT field, value FROM tag_group_rules WHERE group_id = ? ORDER BY position", [g.id]);
          const selector = { patterns: [], units: [], kinds: [], areas: [], equipment: [], gateways: [], minPeriodMs: null, maxPeriodMs: null, include: [], exclude: [] };
          for (const r of rules) {
            if (r.field === "min_period_ms") selector.minPeriodMs = Number(r.value);
            else if (r.field === "max_period_ms") selector.maxPeriodMs = Number(r.value);
            else selector[RULE_KEYS[r.field]].push(r.value);
          }
          snapshot.push({ name: g.name, description: g.description, priority: g.priority, regulated: !!g.regulated, selector, assignment });
        }
        if (slug === "fenwick-creamery") {
          // Released-looking: Fenwick's configuration as its release 1, approved by the demo reviewer.
          await db.query("INSERT INTO releases (site_id, number, config, change_id, note, released_by, released_at) VALUES (?, 1, ?, NULL, ?, ?, ?)", {
            replacements: [site.id, JSON.stringify({ groups: snapshot }), "Initial configuration (demo)", rui ? rui.id : null, new Date(now.getTime() - day)],
            transaction,
          });
        } else if (eli) {
          // The other plants are still being configured: an open draft change by the demo engineer.
          await db.query("INSERT INTO changes (site_id, state, base_release, created_by, created_at, updated_at) VALUES (?, 'draft', NULL, ?, ?, ?)", {
            replacements: [site.id, eli.id, now, now],
            transaction,
          });
          const [c] = await q("SELECT id FROM changes WHERE site_id = ? AND state = 'draft'", [site.id]);
          await db.query("INSERT INTO change_authors (change_id, user_id, first_edit_at, last_edit_at) VALUES (?, ?, ?, ?)", { replacements: [c.id, eli.id, now, now], transaction });
        }
      }
    });
  },
  async down(queryInterface) {
    const db = queryInterface.sequelize;
    const names = PROFILES.map((p) => p.name);
    await db.transaction(async (transaction) => {
      await db.query("DELETE FROM releases WHERE site_id IN (SELECT id FROM sites WHERE slug IN (?))", { replacements: [Object.keys(ASSIGN)], transaction });
      await db.query("DELETE FROM caution_acknowledgements WHERE site_id IN (SELECT id FROM sites WHERE slug IN (?))", { replacements: [Object.keys(ASSIGN)], transaction });
      await db.query("DELETE FROM changes WHERE site_id IN (SELECT id FROM sites WHERE slug IN (?))", { replacements: [Object.keys(ASSIGN)], transaction });
      await db.query(
        "DELETE a FROM assignments a JOIN profile_revisions r ON r.id = a.profile_revision_id JOIN profiles p ON p.id = r.profile_id WHERE p.name IN (?)",
        { replacements: [names], transaction },
      );
      await db.query("DELETE r FROM profile_revisions r JOIN profiles p ON p.id = r.profile_id WHERE p.name IN (?)", { replacements: [names], transaction });
      await db.query("DELETE FROM profiles WHERE name IN (?)", { replacements: [names], transaction });
    });
  },
};
