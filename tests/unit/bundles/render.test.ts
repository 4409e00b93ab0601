import { describe, expect, it } from "vitest";
import { parse } from "yaml";
import { BundleError, renderBundle, renderSiteBundles } from "@/lib/bundles/render";
import { validateBundle } from "@/lib/bundles/validate";
import type { Profile } from "@/lib/reduction/profile";
import { gateways, input, profiles, tags } from "./fixtures";

// The layout is ours (DESIGN.md "Bundle"); this is the whole bundle of the second gateway.
const GW2 = `sluice: bundle/1
site: fenwick-creamery
gateway: fw-gw-02
release: 14
issued: "2026-12-01T10:00:00Z"
poll: 30
key: k2
time-zone: Europe/London
unassigned:
  handling: pass-through
  tags: []
groups:
  - name: pasteuriser-temperatures
    regulated: true
    profile: { name: Temperature shape, revision: 3 }
    tags:
      - PAST1/TT-103/PV
    gap: 3
    outputs:
      - name: shape
        steps:
          - { method: quality-filter, keep: good }
          - { method: swinging-door, deviation: 0.3, max-interval: 600 }
  - name: counters
    regulated: false
    handling: pass-through
    tags:
      - CIP/FQ-1/PV
`;

/** Deterministic shuffle (Park–Miller), so a failure reproduces. */
function shuffled<T>(list: readonly T[], seed: number): T[] {
  const out = [...list];
  let s = seed;
  for (let i = out.length - 1; i > 0; i--) {
    s = (s * 16807) % 2147483647;
    const j = s % (i + 1);
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

describe("renderBundle", () => {
  it("renders our layout: header, default handling, groups in priority order, resolved steps", () => {
    expect(renderBundle({ ...input(), gateway: gateways[1] })).toBe(GW2);
  });

  it("carries each tag's gap threshold (3 × its sample period, in seconds): one value when the group's tags agree, else a map", () => {
    const same = parse(renderBundle({ ...input(), gateway: gateways[0] })) as { groups: { name: string; gap?: unknown }[] };
    expect(same.groups.map((g) => [g.name, g.gap])).toEqual([
      ["pasteuriser-temperatures", 3], // TT-101 and TT-102 at 1 s
      ["pressures", 1.5], // PT-201 at 500 ms
    ]);
    const mixed = input({ tags: tags.map((t) => (t.name === "PAST1/TT-102/PV" ? { ...t, samplePeriodMs: 250 } : t)) });
    const text = renderBundle({ ...mixed, gateway: gateways[0] });
    expect(text).toContain("    gap:\n      PAST1/TT-101/PV: 3\n      PAST1/TT-102/PV: 0.75\n");
    expect(validateBundle(text)).toEqual({ ok: true });
    // A group without a profile runs no step, so it carries no gap.
    const gw2 = parse(renderBundle({ ...input(), gateway: gateways[1] })) as { groups: { name: string; gap?: unknown }[] };
    expect(gw2.groups.find((g) => g.name === "counters")).not.toHaveProperty("gap");
  });

  it("gives identical bytes when rendered twice", () => {
    const a = renderBundle({ ...input(), gateway: gateways[0] });
    const b = renderBundle({ ...input(), gateway: gateways[0] });
    expect(b).toBe(a);
  });

  it("gives the same bytes whatever order the tags, groups and profiles come in", () => {
    const expected = renderSiteBundles(input(), gateways);
    for (const seed of [1, 7, 42]) {
      const i = input();
      const shuffledInput = {
        ...i,
        tags: shuffled(i.tags, seed),
        config: { groups: shuffled(i.config.groups, seed + 1) },
        profiles: new Map(shuffled([...profiles], seed + 2)),
      };
      expect(renderSiteBundles(shuffledInput, shuffled(gateways, seed))).toEqual(expected);
      expect([...renderSiteBundles(shuffledInput, shuffled(gateways, seed)).keys()]).toEqual(["fw-gw-01", "fw-gw-02"]);
    }
  });

  it("resolves a percent parameter per tag: different ranges give a map, equal ranges a scalar", () => {
    const gw1 = renderBundle({ ...input(), gateway: gateways[0] });
    // 0.2 % of 0…150 °C and of 0…200 °C.
    expect(gw1).toContain("deviation:\n              PAST1/TT-101/PV: 0.3\n              PAST1/TT-102/PV: 0.4\n");
    const same = input({ tags: tags.map((t) => (t.name === "PAST1/TT-102/PV" ? { ...t, euHigh: 150 } : t)) });
    expect(renderBundle({ ...same, gateway: gateways[0] })).toContain("- { method: swinging-door, deviation: 0.3, max-interval: 600 }\n");
  });

  it("converts an absolute parameter to the tag's unit (0.05 bar on a kPa tag is 5)", () => {
    expect(renderBundle({ ...input(), gateway: gateways[0] })).toContain("- { method: deadband, deadband: 5 }\n");
  });

  it("lists an optional parameter set on one tag as a map of that tag only", () => {
    const i = input();
    i.config.groups[0].assignment!.tags = [{ tag: "PAST1/TT-101/PV", overrides: [{ output: "shape", step: 0, parameter: "keep", value: "good-and-uncertain" }] }];
    i.config.groups[1].assignment!.tags = [{ tag: "PAST1/PT-201/PV", overrides: [{ output: "db", step: 0, parameter: "max-interval", value: 300 }] }];
    const text = renderBundle({ ...i, gateway: gateways[0] });
    expect(text).toContain("keep:\n              PAST1/TT-101/PV: good-and-uncertain\n              PAST1/TT-102/PV: good\n");
    expect(text).toContain("- { method: deadband, deadband: 5, max-interval: 300 }\n");
    expect(validateBundle(text)).toEqual({ ok: true });
  });

  it("holds only the gateway's own tags, and leaves out groups with none of them", () => {
    const bundles = renderSiteBundles(input(), gateways);
    const gw1 = bundles.get("fw-gw-01")!;
    const gw2 = bundles.get("fw-gw-02")!;
    for (const t of tags) expect(gw1.includes(t.name)).toBe(t.gateway === "fw-gw-01");
    for (const t of tags) expect(gw2.includes(t.name)).toBe(t.gateway === "fw-gw-02");
    expect(gw1).not.toContain("counters");
    expect(gw2).not.toContain("pressures");
    expect(gw1).toContain("unassigned:\n  handling: pass-through\n  tags:\n    - PAST1/FT-900/PV\n");
  });

  it("renders a gateway alone exactly as within the whole site", () => {
    const all = renderSiteBundles(input(), gateways);
    for (const gw of gateways) expect(renderBundle({ ...input(), gateway: gw })).toBe(all.get(gw.slug));
  });

  it("differs only in release and issue time when re-rendered for a later release", () => {
    const a = renderBundle({ ...input(), gateway: gateways[0] });
    const b = renderBundle({ ...input({ release: 15, issued: "2026-12-02T08:30:00Z" }), gateway: gateways[0] });
    const changed = a.split("\n").filter((line, i) => line !== b.split("\n")[i]);
    expect(changed).toEqual(["release: 14", 'issued: "2026-12-01T10:00:00Z"']);
  });

  it("validates every bundle it renders against the schema", () => {
    for (const text of renderSiteBundles(input(), gateways).values()) expect(validateBundle(text)).toEqual({ ok: true });
  });

  it("throws a BundleError naming group, tag and output when a profile cannot resolve for a tag", () => {
    const noRange = input({ tags: tags.map((t) => (t.name === "PAST1/TT-102/PV" ? { ...t, euLow: null, euHigh: null } : t)) });
    let error: unknown;
    try {
      renderSiteBundles(noRange, gateways);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(BundleError);
    expect(error).toMatchObject({ group: "pasteuriser-temperatures", tag: "PAST1/TT-102/PV", output: "shape" });
    expect((error as Error).message).toMatch(/no engineering range/);
  });

  it("refuses a missing profile revision, a duplicate tag or group, and an area selector without areas", () => {
    expect(() => renderSiteBundles(input({ profiles: new Map<number, Profile>() }), gateways)).toThrow(/revision 3 of profile "Temperature shape"/);
    expect(() => renderSiteBundles(input({ tags: [...tags, tags[0]] }), gateways)).toThrow(BundleError);
    const twice = input();
    twice.config.groups.push({ ...twice.config.groups[2], priority: 9 });
    expect(() => renderSiteBundles(twice, gateways)).toThrow(/"counters" appears twice/);
    const i = input();
    i.config.groups[2].selector = { areas: ["pasteurisation"] } as (typeof i.config.groups)[number]["selector"];
    expect(() => renderSiteBundles(i, gateways)).toThrow(/selects by area/);
    const withAreas = { ...i, tags: i.tags.map((t) => ({ ...t, area: t.name.startsWith("CIP") ? "pasteurisation" : null, equipment: null })) };
    expect(renderSiteBundles(withAreas, gateways).get("fw-gw-02")).toContain("- name: counters");
  });

  it("quotes tag names YAML would otherwise read as something else", () => {
    const odd = ["123", "true", "null", "- dash", "a: b", "#hash", "*star", "quote'\"", "  spaced ", "~", "1e3", "Ünïcode/τ", "<<"];
    const i = input({ tags: [...tags, ...odd.map((name, k) => ({ ...tags[2], name, euHigh: 100 + k }))] });
    i.config.groups[0].selector = { patterns: ["PAST1/TT-*/PV"], include: odd } as (typeof i.config.groups)[number]["selector"];
    const text = renderBundle({ ...i, gateway: gateways[1] });
    expect(validateBundle(text)).toEqual({ ok: true });
    const doc = parse(text) as { groups: { tags: string[]; outputs: { steps: Record<string, unknown>[] }[] }[] };
    const sorted = [...odd, "PAST1/TT-103/PV"].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    expect(doc.groups[0].tags).toEqual(sorted);
    expect(Object.keys(doc.groups[0].outputs[0].steps[1].deviation as object).sort()).toEqual([...sorted].sort());
  });

  it("orders tags by code units, not by locale", () => {
    const i = input({ tags: [...tags, { ...tags[2], name: "PAST1/TT-10a/PV" }, { ...tags[2], name: "PAST1/TT-10B/PV" }] });
    const text = renderBundle({ ...i, gateway: gateways[1] });
    expect(text.indexOf("PAST1/TT-103/PV")).toBeLessThan(text.indexOf("PAST1/TT-10B/PV"));
    expect(text.indexOf("PAST1/TT-10B/PV")).toBeLessThan(text.indexOf("PAST1/TT-10a/PV"));
  });
});
