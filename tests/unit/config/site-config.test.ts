import { describe, expect, it } from "vitest";
import { describeEdit, diffConfigs, type GroupConfig, type SiteConfig } from "@/lib/config/site-config";

const selector = { patterns: ["A/*"], units: [], kinds: [], areas: [], equipment: [], gateways: [], minPeriodMs: null, maxPeriodMs: null, include: [], exclude: [] };
const group = (name: string, priority: number, over: Partial<GroupConfig> = {}): GroupConfig => ({ name, description: "", priority, regulated: false, selector, assignment: null, ...over });
const pin = (revision: number, over: object = {}) => ({ profileId: 1, profile: "Shape", revision, revisionId: 100 + revision, overrides: [], tags: [], ...over });

describe("diffConfigs", () => {
  const base: SiteConfig = { groups: [group("a", 10, { assignment: pin(1) }), group("b", 20)] };

  it("finds no edits between equal snapshots whatever their key order", () => {
    const reordered = JSON.parse(JSON.stringify(base), (_k, v) => (v && typeof v === "object" && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v));
    expect(diffConfigs(base, reordered)).toEqual([]);
  });

  it("names assignment changes: new pin, upgrade, removal and override edits, each with its own key", () => {
    const working: SiteConfig = {
      groups: [
        group("a", 10, { assignment: pin(2) }),
        group("b", 20, { assignment: pin(1) }),
      ],
    };
    const edits = diffConfigs(base, working);
    expect(edits.map((e) => e.key)).toEqual(["assignment-set:a", "assignment-set:b"]);
    expect(edits.map(describeEdit)).toEqual(['Group "a": "Shape" revision 1 → "Shape" revision 2', 'Group "b": assigned "Shape" revision 1']);
    const tagged = diffConfigs(base, { groups: [group("a", 10, { assignment: pin(1, { tags: [{ tag: "A/TT-1/PV", overrides: [{ output: "shape", step: 0, parameter: "deviation", value: 1 }] }] }) }), group("b", 20)] });
    expect(tagged).toEqual([{ key: "overrides-changed:a", kind: "overrides-changed", group: "a", groupOverrides: false, tags: ["A/TT-1/PV"] }]);
    expect(describeEdit(tagged[0])).toBe('Group "a": overrides for tag A/TT-1/PV changed');
    const removed = diffConfigs(base, { groups: [group("a", 10), group("b", 20)] });
    expect(describeEdit(removed[0])).toBe('Group "a": assignment of "Shape" revision 1 removed');
  });

  it("reports added, removed, changed and reordered groups", () => {
    const working: SiteConfig = { groups: [group("b", 5, { regulated: true }), group("c", 30)] };
    const edits = diffConfigs({ groups: [...base.groups, group("d", 40)] }, { groups: [...working.groups, group("d", 1)] });
    expect(edits.map((e) => e.key)).toEqual(["group-changed:b", "group-added:c", "group-removed:a", "groups-reordered"]);
    expect(describeEdit(edits[3])).toBe("Group priority changed: d → b");
  });
});
