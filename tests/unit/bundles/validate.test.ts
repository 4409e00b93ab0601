import { describe, expect, it } from "vitest";
import { renderBundle } from "@/lib/bundles/render";
import { validateBundle } from "@/lib/bundles/validate";
import bundleSchema from "@/schemas/bundle.schema.json";
import { gateways, input } from "./fixtures";
import { expectedStepDefs } from "./schema-from-methods";

const good = renderBundle({ ...input(), gateway: gateways[0] });
const problems = (text: string) => {
  const r = validateBundle(text);
  return r.ok ? [] : r.problems;
};

describe("validateBundle", () => {
  it("accepts a rendered bundle", () => {
    expect(validateBundle(good)).toEqual({ ok: true });
  });

  it("refuses a bundle without its site, naming the path", () => {
    expect(problems(good.replace("site: fenwick-creamery\n", ""))).toEqual([{ path: "site", message: "is required" }]);
  });

  it("refuses a value of the wrong type at its path", () => {
    expect(problems(good.replace("release: 14", "release: fourteen"))).toEqual([{ path: "release", message: "must be integer" }]);
    expect(problems(good.replace("regulated: true", "regulated: yes"))).toEqual([{ path: "groups[0].regulated", message: "must be boolean" }]);
    expect(problems(good.replace("deadband: 5", "deadband: -5"))).toEqual([
      { path: "groups[1].outputs[0].steps[0].deadband", message: "must be a value of the parameter's type, or a map from tag name to such values" },
    ]);
  });

  it("refuses unknown keys, unknown methods and a wrong format header", () => {
    expect(problems(good.replace("poll: 60", "poll: 60\nextra: 1"))).toEqual([{ path: "extra", message: "is not a key of a bundle here" }]);
    expect(problems(good.replace("method: deadband", "method: average"))[0].path).toBe("groups[1].outputs[0].steps[0].method");
    expect(problems(good.replace("sluice: bundle/1", "sluice: bundle/2"))).toEqual([{ path: "sluice", message: "must be bundle/1" }]);
  });

  it("refuses YAML it cannot read as one plain document", () => {
    expect(problems("sluice: [")[0].path).toBe("");
    expect(problems(good.replace("poll: 60", "poll: 60\npoll: 61"))[0].message).toMatch(/unique/i);
    expect(problems(`${good}---\n${good}`).length).toBeGreaterThan(0);
    expect(problems("a: &x 1\nb: *x\n").length).toBeGreaterThan(0);
  });

  it("refuses a tag listed twice and a per-tag map naming a stranger or missing a tag", () => {
    expect(problems(good.replace("    - PAST1/FT-900/PV\n", "    - PAST1/FT-900/PV\n    - PAST1/TT-101/PV\n"))).toEqual([
      { path: "groups[0].tags[0]", message: "tag PAST1/TT-101/PV is already listed at unassigned.tags[1]" },
    ]);
    expect(problems(good.replace("PAST1/TT-102/PV: 0.4", "PAST1/TT-999/PV: 0.4"))).toEqual([
      { path: "groups[0].outputs[0].steps[1].deviation.PAST1/TT-999/PV", message: 'tag PAST1/TT-999/PV is not a tag of group "pasteuriser-temperatures"' },
      { path: "groups[0].outputs[0].steps[1].deviation", message: "gives no value for tag PAST1/TT-102/PV; a required parameter needs one for every tag" },
    ]);
  });

  it("checks the group's gap: positive seconds, a map naming only the group's tags, only beside a profile", () => {
    expect(good).toContain("    gap: 1.5\n");
    expect(problems(good.replace("    gap: 1.5\n", "    gap: 0\n"))).toEqual([
      { path: "groups[1].gap", message: "must be a value of the parameter's type, or a map from tag name to such values" },
    ]);
    expect(problems(good.replace("    gap: 1.5\n", "    gap:\n      PAST1/PT-201/PV: 1.5\n      PAST1/PT-999/PV: 1.5\n"))).toEqual([
      { path: "groups[1].gap.PAST1/PT-999/PV", message: 'tag PAST1/PT-999/PV is not a tag of group "pressures"' },
    ]);
    // Bundles rendered before the key existed stay valid (their tags have no gaps).
    expect(validateBundle(good.replaceAll(/ {4}gap: [0-9.]+\n/g, ""))).toEqual({ ok: true });
    const gw2 = renderBundle({ ...input(), gateway: gateways[1] });
    const onHandling = gw2.replace("    handling: pass-through\n    tags:\n      - CIP/FQ-1/PV\n", "    handling: pass-through\n    tags:\n      - CIP/FQ-1/PV\n    gap: 3\n");
    expect(onHandling).not.toBe(gw2);
    expect(problems(onHandling)).toEqual([{ path: "groups[1]", message: "must have property profile when property gap is present" }]);
  });

  it("refuses a group with both a profile and a default handling", () => {
    const both = good.replace("    profile: { name: Pressure deadband, revision: 1 }\n", "    profile: { name: Pressure deadband, revision: 1 }\n    handling: drop\n");
    expect(problems(both)).toEqual([{ path: "groups[1]", message: "a group has either a profile with outputs or a default handling, not both" }]);
  });
});

describe("schemas/bundle.schema.json", () => {
  it("describes every method's resolved step as METHODS states it", () => {
    const defs = bundleSchema.$defs as Record<string, unknown>;
    for (const [name, def] of Object.entries(expectedStepDefs())) expect(defs[name], name).toEqual(def);
  });
});
