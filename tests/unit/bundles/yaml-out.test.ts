import { describe, expect, it } from "vitest";
import { Document, parse } from "yaml";
import { Flow, scalar, toYaml } from "@/lib/bundles/yaml-out";

describe("toYaml (the bundle writer)", () => {
  it("writes plain only strings every YAML reader takes as that string", () => {
    for (const s of ["PAST1/TT-101/PV", "bundle/1", "Europe/London", "Temperature shape", "pass-through", "Etc/GMT+5"]) expect(scalar(s)).toBe(s);
    // Numbers, dates, YAML 1.1 booleans, indicators, merge keys, spacing: quoted.
    for (const s of ["101", "2026-12-01T10:00:00Z", "yes", "off", "null", "~", "", "- x", "a: b", "#x", "*x", "<<", " x", "x ", "a  b", ".5", "x,y"]) {
      expect(scalar(s)).toBe(JSON.stringify(s));
    }
    expect(scalar("bell\u0007 nel\u0085 ls\u2028")).toBe('"bell\\u0007 nel\\u0085 ls\\u2028"');
    expect([scalar(0.3), scalar(1e21), scalar(-2), scalar(true), scalar(null)]).toEqual(["0.3", "1e+21", "-2", "true", "null"]);
  });

  it("writes what the yaml package reads back as the same data", () => {
    const odd = ["101", "true", "- dash", "a: b", "#hash", "quote'\"", "  spaced ", "~", "Ünïcode/τ", "tab\there", "bell\u0007", "<<", "x\u2028y"];
    const data = {
      sluice: "bundle/1",
      issued: "2026-12-01T10:00:00Z",
      empty: [],
      list: odd,
      groups: [
        { name: "g", profile: new Flow({ name: "P: x", revision: 3 }), steps: [new Flow({ method: "m4", window: 60 }), { method: "rdp", epsilon: new Map(odd.map((k, i) => [k, i / 10])) }] },
      ],
    };
    const plain = JSON.parse(JSON.stringify(data, (_k, v) => (v instanceof Map ? Object.fromEntries(v) : v instanceof Flow ? v.entries : v)));
    expect(parse(toYaml(data))).toEqual(plain);
    // The same data through the yaml package's own writer reads back alike.
    expect(parse(new Document(plain).toString())).toEqual(parse(toYaml(data)));
  });

  it("lays out blocks with two-space indentation and one-line flow maps", () => {
    const text = toYaml({ a: 1, b: { c: [] }, d: [new Flow({ method: "drop" }), { method: "rdp", epsilon: new Map([["T/1", 0.5]]) }] });
    expect(text).toBe("a: 1\nb:\n  c: []\nd:\n  - { method: drop }\n  - method: rdp\n    epsilon:\n      T/1: 0.5\n");
  });
});
