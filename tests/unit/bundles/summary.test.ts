import { describe, expect, it } from "vitest";
import type { SiteConfig } from "@/lib/config/site-config";
import { renderSiteBundles, type BundleTag } from "@/lib/bundles/render";
import { summarizeChange } from "@/lib/bundles/summary";
import { config, gateways, input, profiles, tags } from "./fixtures";

const slugs = [...gateways.map((g) => g.slug), "fw-gw-03"];
const snap = (c: SiteConfig) => ({ config: c, profiles });

/**
 * The proposed configuration: temperatures on revision 4 (deviation 0.2 % → 0.3 %),
 * pressures on revision 2 (output "db" renamed "deadband") with an override for the one
 * tag, the counter group removed, a flow group added, and the first two groups swapped.
 */
function proposed(): SiteConfig {
  const c = structuredClone(config);
  const [temps, pressures] = c.groups;
  Object.assign(temps.assignment!, { revisionId: 14, revision: 4 });
  Object.assign(pressures.assignment!, { revisionId: 22, revision: 2 });
  pressures.assignment!.tags = [{ tag: "PAST1/PT-201/PV", overrides: [{ output: "deadband", step: 0, parameter: "max-interval", value: 300 }] }];
  [temps.priority, pressures.priority] = [2, 1];
  c.groups = c.groups.filter((g) => g.name !== "counters");
  c.groups.push({ name: "flows", description: "", priority: 5, regulated: false, selector: { units: ["m3/h"] } as SiteConfig["groups"][number]["selector"], assignment: null });
  return c;
}

describe("summarizeChange", () => {
  it("says what changes in words, flags the regulated group and names the gateways affected", () => {
    const s = summarizeChange(snap(config), snap(proposed()), tags, slugs);
    expect(s.statements.map((x) => [x.kind, x.text])).toEqual([
      ["assignment", 'Group "pressures": "Pressure deadband" revision 1 → revision 2'],
      ["outputs", 'Group "pressures": output "db" renamed to "deadband" — what the cloud receives changes'],
      ["overrides", 'Group "pressures": overrides for 1 tag changed: PAST1/PT-201/PV'],
      ["assignment", 'Group "pasteuriser-temperatures": "Temperature shape" revision 3 → revision 4'],
      ["parameters", 'Group "pasteuriser-temperatures": Output "shape" step 2 (swinging-door): deviation 0.2 % of range → 0.3 % of range'],
      ["group-added", `Group "flows" added, with no profile (its tags get the site's default handling)`],
      ["group-removed", 'Group "counters" removed'],
      ["groups-reordered", 'Priority order changed: "pasteuriser-temperatures" moved to position 2 of 3'],
      ["tags-assigned", '1 tag in no group joins "flows": PAST1/FT-900/PV'],
      ["tags-unassigned", '1 tag leaves "counters" and is in no group now (site default handling): CIP/FQ-1/PV'],
      ["regulated", 'Regulated-record groups touched: "pasteuriser-temperatures" — the reviewer acknowledges the caution at approval'],
      ["gateways", "Gateways affected: fw-gw-01, fw-gw-02 (2 of 3)"],
    ]);
    expect(s.regulatedTouched).toEqual(["pasteuriser-temperatures"]);
    expect(s.gatewaysAffected).toEqual(["fw-gw-01", "fw-gw-02"]);
    expect(s.statements.filter((x) => x.regulated).map((x) => x.group)).toEqual(["pasteuriser-temperatures", "pasteuriser-temperatures"]);
  });

  it("describes outputs added and removed, group overrides, and a first release", () => {
    const c = structuredClone(config);
    c.groups[0].assignment!.overrides = [{ output: "shape", step: 1, parameter: "deviation", value: { percent: 0.5 } }];
    c.groups[1].assignment!.overrides = [{ output: "db", step: 0, parameter: "deadband", value: { value: 2, unit: "kPa" } }];
    const texts = summarizeChange(snap(config), snap(c), tags, slugs).statements.map((x) => x.text);
    expect(texts).toContain('Group "pasteuriser-temperatures": override of deviation (output "shape", step 2) set to 0.5 % of range');
    expect(texts).toContain('Group "pressures": override of deadband (output "db", step 1) set to 2 kPa');
    const back = summarizeChange(snap(c), snap(config), tags, slugs).statements.map((x) => x.text);
    expect(back).toContain(`Group "pressures": override of deadband (output "db", step 1) removed (back to the profile's 2 kPa)`);

    const first = summarizeChange(null, snap(config), tags, slugs);
    expect(first.statements.map((x) => x.text).slice(0, 2)).toEqual([
      'Group "pasteuriser-temperatures" added as a regulated record, assigned "Temperature shape" revision 3',
      'Group "pasteuriser-temperatures": output "shape" added — what the cloud receives changes',
    ]);
    expect(first.gatewaysAffected).toEqual(["fw-gw-01", "fw-gw-02"]);
  });

  it("counts tags and names the first three", () => {
    const many: BundleTag[] = Array.from({ length: 5 }, (_, i) => ({ ...tags[2], name: `PAST1/TT-2${i}/PV` }));
    const c = structuredClone(config);
    c.groups[0].selector = { patterns: ["PAST1/TT-1*/PV"] } as SiteConfig["groups"][number]["selector"];
    const s = summarizeChange(snap(config), snap(c), [...tags, ...many], slugs);
    expect(s.statements.find((x) => x.kind === "tags-unassigned")?.text).toBe(
      '5 tags leave "pasteuriser-temperatures" and are in no group now (site default handling): PAST1/TT-20/PV, PAST1/TT-21/PV, PAST1/TT-22/PV and 2 more',
    );
    expect(s.gatewaysAffected).toEqual(["fw-gw-02"]);
  });

  it("reports tags moving between groups and a regulated group they leave", () => {
    const c = structuredClone(config);
    c.groups.push({ name: "holding-tube", description: "", priority: 0, regulated: false, selector: { include: ["PAST1/TT-101/PV"] } as SiteConfig["groups"][number]["selector"], assignment: null });
    const s = summarizeChange(snap(config), snap(c), tags, slugs);
    expect(s.statements.find((x) => x.kind === "tags-moved")).toEqual({
      kind: "tags-moved",
      text: '1 tag moves from "pasteuriser-temperatures" to "holding-tube": PAST1/TT-101/PV',
      group: "holding-tube",
      regulated: false,
    });
    expect(s.regulatedTouched).toEqual(["pasteuriser-temperatures"]);
    expect(s.gatewaysAffected).toEqual(["fw-gw-01"]);
  });

  it("finds no gateway affected when only a description changes", () => {
    const c = structuredClone(config);
    c.groups[0].description = "Holding tube and plates";
    const s = summarizeChange(snap(config), snap(c), tags, slugs);
    expect(s.gatewaysAffected).toEqual([]);
    expect(s.statements).toEqual([{ kind: "gateways", text: "No gateway's bundle changes" }]);
  });

  it("names exactly the gateways whose rendered bundles differ", () => {
    const variants: SiteConfig[] = [proposed(), structuredClone(config)];
    variants[1].groups[1].regulated = true;
    for (const after of variants) {
      const a = renderSiteBundles(input({ config }), gateways);
      const b = renderSiteBundles(input({ config: after }), gateways);
      const differ = gateways.map((g) => g.slug).filter((g) => a.get(g) !== b.get(g));
      expect(summarizeChange(snap(config), snap(after), tags, gateways.map((g) => g.slug)).gatewaysAffected).toEqual(differ);
    }
  });
});
