import { createRequire } from "node:module";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { checkAssignment } from "@/lib/config/assignment-check";
import { diffConfigs } from "@/lib/config/site-config";
import { loadBaseConfig } from "@/lib/data/drafts";
import { loadWorkingConfig } from "@/lib/data/groups";
import { allTagValues } from "@/lib/data/tags";
import { profileFromYaml, profileToYaml } from "@/lib/profiles/yaml";
import { runProfile, type ProfileTag } from "@/lib/reduction/profile";
import { assignGroups } from "@/lib/tags/selector";
import { convertUnit } from "@/lib/units";
import { CautionAcknowledgement, ProfileRevision, ReductionProfile, Release, Site } from "@/models";

const require = createRequire(import.meta.url);
const { CAUTION, PROFILES } = require(path.resolve("seeders/20261202060000-demo-profiles.js")) as {
  CAUTION: { id: string; text: string };
  PROFILES: { name: string; revisions: unknown[] }[];
};

const PLANTS = ["fenwick-creamery", "osterby-cheese", "kestrel-ridge-powder"];

/** A deterministic series for a tag: a slow wave with noise-like wiggle, steps for discrete, a ramp for counters. */
function series(tag: ProfileTag, n = 5000) {
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  const t0 = Date.UTC(2026, 10, 30);
  const lo = tag.euLow ?? 0;
  const span = (tag.euHigh ?? 100) - lo;
  for (let i = 0; i < n; i++) {
    t[i] = t0 + i * tag.samplePeriodMs;
    if (tag.kind === "discrete") v[i] = Math.floor(i / 137) % 2;
    else if (tag.kind === "counter") v[i] = (i * 3.5) % 1e9;
    else v[i] = lo + span * (0.5 + 0.3 * Math.sin(i / 200) + 0.001 * Math.sin(i * 1.7));
  }
  return { t, v };
}

describe("demo profiles and assignments", () => {
  it("seeds the named profiles; each document round-trips through YAML and passes the contract", async () => {
    const profiles = await ReductionProfile.findAll({ where: { name: PROFILES.map((p) => p.name) } });
    expect(profiles.map((p) => p.name).sort()).toEqual(PROFILES.map((p) => p.name).sort());
    const revisions = await ProfileRevision.findAll({ where: { profileId: profiles.map((p) => p.id) } });
    expect(revisions.length).toBe(PROFILES.reduce((a, p) => a + p.revisions.length, 0));
    for (const r of revisions) {
      const text = profileToYaml(r.document);
      const back = profileFromYaml(text);
      expect(back.ok, `${r.document.name} r${r.number}`).toBe(true);
      if (back.ok) expect(back.profile).toEqual(r.document);
      expect(profileToYaml(back.ok ? back.profile : r.document)).toBe(text);
    }
    const stats = revisions.find((r) => r.document.name === "1-minute statistics")!.document;
    expect(stats.outputs.map((o) => o.name)).toEqual(["avg", "lo", "hi"]);
  });

  it("runs every assigned profile on every tag of every plant through runProfile without error, and reduces", async () => {
    let runs = 0;
    let samplesIn = 0;
    let samplesOut = 0;
    for (const slug of PLANTS) {
      const site = (await Site.findOne({ where: { slug } }))!;
      const config = await loadWorkingConfig(site.id);
      const tags = await allTagValues(site.id);
      const { winner } = assignGroups(tags, config.groups);
      for (const g of config.groups) {
        expect(g.assignment, `${slug}/${g.name} is assigned`).not.toBeNull();
        const doc = (await ProfileRevision.findByPk(g.assignment!.revisionId))!.document;
        const members = tags.filter((_, i) => winner[i] === g.name);
        expect(checkAssignment(doc, members, g.assignment!.overrides, g.assignment!.tags, { timeZone: site.timeZone, convert: convertUnit })).toEqual([]);
        // One tag per group per plant keeps this quick; the check above covers every tag.
        const tag = members[0];
        if (!tag) continue;
        const own = g.assignment!.tags.find((x) => x.tag === tag.name)?.overrides ?? [];
        const run = runProfile(series(tag), doc, tag, { timeZone: site.timeZone, convert: convertUnit, overrides: [...g.assignment!.overrides, ...own] });
        for (const o of doc.outputs) {
          expect(run[o.name], `${g.name}.${o.name}`).toBeDefined();
          // A 1-minute window on a 1-minute tag keeps every sample; most outputs reduce a lot (checked below).
          expect(run[o.name].series.t.length, `${slug}/${g.name}.${o.name} on ${tag.name}`).toBeLessThanOrEqual(5000);
          samplesIn += 5000;
          samplesOut += run[o.name].series.t.length;
        }
        runs++;
      }
    }
    expect(runs).toBeGreaterThanOrEqual(15);
    expect(samplesOut / samplesIn).toBeLessThan(0.25);
  });

  it("leaves Fenwick released-looking (release 1 equals its configuration) and the others with an open draft", async () => {
    const fenwick = (await Site.findOne({ where: { slug: "fenwick-creamery" } }))!;
    expect(await Release.count({ where: { siteId: fenwick.id } })).toBe(1);
    expect(diffConfigs(await loadBaseConfig(fenwick.id), await loadWorkingConfig(fenwick.id))).toEqual([]);
    for (const slug of ["osterby-cheese", "kestrel-ridge-powder"]) {
      const site = (await Site.findOne({ where: { slug } }))!;
      const edits = diffConfigs(await loadBaseConfig(site.id), await loadWorkingConfig(site.id));
      expect(edits.length).toBeGreaterThan(0);
      expect(edits.every((e) => e.kind === "group-added" && e.assignment !== null)).toBe(true);
    }
    // A newer revision waits for Fenwick's pasteuriser group: the upgrade the console offers.
    const past = (await loadWorkingConfig(fenwick.id)).groups.find((g) => g.name === "pasteuriser-temperatures")!;
    expect(past.assignment).toMatchObject({ profile: "Temperature shape", revision: 1 });
    expect(past.regulated).toBe(true);
    expect((await ReductionProfile.findOne({ where: { name: "Temperature shape" } }))!.latestRevision).toBe(2);
  });

  it("records the regulated groups' acknowledgements with today's caution text", async () => {
    expect(CAUTION).toEqual({ id: REGULATED_RECORD_CAUTION.id, text: REGULATED_RECORD_CAUTION.text });
    const acks = await CautionAcknowledgement.findAll({ where: { userEmail: "eli.engineer@demo.invalid" } });
    expect(acks.map((a) => a.groupName).sort()).toEqual(expect.arrayContaining(["cip-temperatures", "pasteuriser-temperatures", "thermiser-temperatures"]));
    for (const a of acks) expect(a.cautionText).toBe(REGULATED_RECORD_CAUTION.text);
  });
});
