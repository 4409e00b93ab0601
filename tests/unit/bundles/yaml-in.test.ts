import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parse } from "yaml";
import { renderSiteBundles } from "@/lib/bundles/render";
import { readCanonical } from "@/lib/bundles/yaml-in";
import { Flow, type Scalar, type YamlValue, toYaml } from "@/lib/bundles/yaml-out";
import { gateways, input } from "./fixtures";

const yaml12 = (text: string) => parse(text, { uniqueKeys: true, strict: true });

const scalarArb: fc.Arbitrary<Scalar> = fc.oneof(
  fc.string({ unit: "binary" }),
  fc.constantFrom("yes", "No", "null", "~", "1e3", "0x10", ".5", "<<", "- a", "a: b", "#c", "2026-12-01T10:00:00Z", "PAST1/TT-101/PV", "x\u2028y"),
  fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => (x === 0 ? 0 : x)),
  fc.integer(),
  fc.boolean(),
  fc.constant(null),
);
const keyArb = fc.oneof(fc.string({ unit: "binary" }), fc.constantFrom("method", "PAST1/TT-101/PV", "101", "true", "a b"));
const valueArb: fc.Arbitrary<YamlValue> = fc.oneof(
  scalarArb,
  fc.array(scalarArb, { maxLength: 4 }),
  fc.uniqueArray(fc.tuple(keyArb, scalarArb), { selector: ([k]) => k, minLength: 1, maxLength: 4 }).map((e) => new Map<string, YamlValue>(e)),
  fc.dictionary(fc.stringMatching(/^[a-z][a-z-]{0,8}$/), scalarArb, { maxKeys: 4 }).map((d) => new Flow(d)),
  fc.array(fc.uniqueArray(fc.tuple(keyArb, scalarArb), { selector: ([k]) => k, minLength: 1, maxLength: 3 }).map((e) => new Map<string, YamlValue>(e)), { maxLength: 3 }),
);
const docArb = fc.uniqueArray(fc.tuple(keyArb, valueArb), { selector: ([k]) => k, minLength: 1, maxLength: 5 }).map((e) => new Map<string, YamlValue>(e));

const plain = (v: YamlValue): unknown =>
  v instanceof Map ? Object.fromEntries([...v].map(([k, x]) => [k, plain(x)])) : v instanceof Flow ? { ...v.entries } : Array.isArray(v) ? v.map(plain) : v;

describe("toYaml and readCanonical", () => {
  it("write text the yaml package reads as the data, and read it back alike", () => {
    let direct = 0;
    fc.assert(
      fc.property(docArb, (doc) => {
        const text = toYaml(doc);
        expect(yaml12(text)).toEqual(plain(doc));
        const read = readCanonical(text);
        // undefined sends the text to the full parser; a reading must match it.
        if (read !== undefined) {
          direct++;
          expect(read).toEqual(yaml12(text));
        }
      }),
      { numRuns: 300 },
    );
    expect(direct).toBeGreaterThan(250);
  });

  it("reads every rendered bundle directly, as the yaml package does", () => {
    for (const text of renderSiteBundles(input(), gateways).values()) {
      const value = readCanonical(text);
      expect(value).toBeDefined();
      expect(value).toEqual(yaml12(text));
    }
  });

  it("leaves any other form of the same data to the full parser", () => {
    const text = renderSiteBundles(input(), gateways).get("fw-gw-01")!;
    const variants = [
      text.replace("poll: 60\n", "poll: 60 # seconds\n"),
      text.replace("poll: 60\n", "poll:  60\n"),
      text.replace("poll: 60\n", "poll: 60\npoll: 60\n"),
      text.replace("poll: 60\n", "poll: 0x3c\n"),
      text.replace("key: k2\n", "key: 'k2'\n"),
      text.replace("  handling: pass-through\n", "    handling: pass-through\n"),
      text.replace("  handling: pass-through\n", "\thandling: pass-through\n"),
      text.replace("- { method: deadband, deadband: 5 }", "- {method: deadband, deadband: 5}"),
      text.replace("- { method: deadband, deadband: 5 }", "- { method: deadband, deadband: 5, deadband: 5 }"),
      `${text}---\n${text}`,
      text.slice(0, -1),
      `%YAML 1.2\n---\n${text}`,
    ];
    for (const v of variants) expect(readCanonical(v), v.slice(0, 400)).toBeUndefined();
  });
});
