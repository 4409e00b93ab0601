import { describe, expect, it } from "vitest";
import { PROFILE_FILE_MAX_BYTES, profileFromYaml, profilesFromYaml, profilesToYaml, profileToYaml } from "@/lib/profiles/yaml";
import type { Profile } from "@/lib/reduction/profile";
import { VALID } from "./corpus";

// Our profile file: YAML 1.2 (the yaml package, core schema) with a `sluice: profile/1` header.

const stats = VALID.find((v) => v.label.startsWith("1-minute statistics"))!.doc;

describe("profileToYaml / profileFromYaml", () => {
  it.each(VALID.map((v) => [v.label, v.doc] as const))("round-trips %s byte-stably", (_label, doc) => {
    const text = profileToYaml(doc, { revision: 7, exported: "2026-12-02T10:00:00.000Z" });
    const read = profileFromYaml(text);
    expect(read).toEqual({ ok: true, profile: doc });
    expect(profileToYaml((read as { profile: Profile }).profile, { revision: 7, exported: "2026-12-02T10:00:00.000Z" })).toBe(text);
  });

  it("writes the header, then name, kinds and outputs, each step method first", () => {
    const doc: Profile = {
      name: "Shape",
      kinds: ["analog"],
      outputs: [{ name: "shape", steps: [{ "max-interval": 600, deviation: { unit: "degC", value: 0.5 }, method: "swinging-door" } as Profile["outputs"][0]["steps"][0]] }],
    };
    expect(profileToYaml(doc, { revision: 3 })).toBe(
      [
        "sluice: profile/1",
        "revision: 3",
        "name: Shape",
        "kinds: [ analog ]",
        "outputs:",
        "  - name: shape",
        "    steps:",
        "      - { method: swinging-door, deviation: { value: 0.5, unit: degC }, max-interval: 600 }",
        "",
      ].join("\n"),
    );
  });

  it("ignores revision and exported on import", () => {
    const text = profileToYaml(stats, { revision: 12, exported: "yesterday" });
    expect(profileFromYaml(text)).toEqual({ ok: true, profile: stats });
  });

  it("names the line of a YAML syntax error", () => {
    const read = profileFromYaml("sluice: profile/1\nname: Stats\nkinds: [analog\noutputs: []\n");
    expect(read.ok).toBe(false);
    expect(read.ok || read.problems[0].line).toBeGreaterThanOrEqual(3);
    expect(read.ok || read.problems[0].path).toBe("");
  });

  it("refuses a key given twice, with its line", () => {
    const read = profileFromYaml("sluice: profile/1\nname: a\nname: b\n");
    expect(read).toMatchObject({ ok: false, problems: [{ path: "", line: 3 }] });
  });

  it("refuses a file without the header, naming it", () => {
    const text = profileToYaml(stats).replace("sluice: profile/1\n", "");
    expect(profileFromYaml(text)).toMatchObject({ ok: false, problems: [{ path: "sluice", line: 1, message: expect.stringContaining("sluice: profile/1") }] });
    expect(profileFromYaml("")).toMatchObject({ ok: false, problems: [{ path: "sluice" }] });
    expect(profileFromYaml("- a\n- b\n")).toMatchObject({ ok: false, problems: [{ path: "sluice" }] });
  });

  it("refuses another format version, naming it", () => {
    const text = profileToYaml(stats).replace("sluice: profile/1", "sluice: profile/2");
    expect(profileFromYaml(text)).toMatchObject({ ok: false, problems: [{ path: "sluice", line: 1, message: expect.stringContaining("profile/2") }] });
  });

  it("names the path and line of each bad field", () => {
    const text = [
      "sluice: profile/1",
      "name: Shape",
      "kinds: [analog]",
      "outputs:",
      "  - name: shape",
      "    steps:",
      "      - { method: quality-filter, keep: good }",
      "      - method: swinging-door",
      "        deviation: { percent: 0 }",
      "  - name: Stats",
      "    steps:",
      "      - { method: aggregate, fn: mean, window: 60, colour: red }",
      "",
    ].join("\n");
    expect(profileFromYaml(text)).toEqual({
      ok: false,
      problems: [
        { path: "outputs[0].steps[1].deviation.percent", line: 9, message: "must be > 0" },
        { path: "outputs[1].name", line: 10, message: expect.stringContaining("lower-case") },
        { path: "outputs[1].steps[0].colour", line: 12, message: expect.stringContaining('no parameter "colour"') },
      ],
    });
  });

  it("names a missing field at its parent's line", () => {
    const text = "sluice: profile/1\nname: Shape\nkinds: [analog]\noutputs:\n  - name: shape\n    steps:\n      - method: deadband\n        max-interval: 60\n";
    expect(profileFromYaml(text)).toEqual({ ok: false, problems: [{ path: "outputs[0].steps[0].deadband", line: 7, message: "is required" }] });
  });

  it("names semantic problems at their field", () => {
    const text = "sluice: profile/1\nname: P\nkinds: [analog]\noutputs:\n  - name: p\n    steps:\n      - { method: aggregate, fn: mean, window: 60, percentile: 5 }\n";
    expect(profileFromYaml(text)).toMatchObject({ ok: false, problems: [{ path: "outputs[0].steps[0].percentile", line: 7 }] });
  });

  it("refuses a file over 256 KB before parsing it", () => {
    const text = `${profileToYaml(stats)}# ${"x".repeat(PROFILE_FILE_MAX_BYTES)}\n`;
    expect(profileFromYaml(text)).toMatchObject({ ok: false, problems: [{ path: "", message: expect.stringContaining("256 KB") }] });
  });

  it("refuses alias bombs", () => {
    const text = `sluice: profile/1\na: &a [x, x, x, x, x, x, x, x, x, x]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a, *a]\nc: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b, *b]\nd: [*c, *c, *c, *c, *c, *c, *c, *c, *c, *c]\n`;
    expect(profileFromYaml(text)).toMatchObject({ ok: false, problems: [{ path: "", message: expect.stringContaining("alias") }] });
  });
});

describe("profilesToYaml / profilesFromYaml", () => {
  const docs = VALID.slice(0, 5).map((v) => v.doc);

  it("round-trips several profiles in one file", () => {
    const text = profilesToYaml(docs);
    expect(text.split("\n---\n")).toHaveLength(docs.length);
    expect(profilesFromYaml(text)).toEqual({ ok: true, profiles: docs });
    expect(profileFromYaml(text)).toMatchObject({ ok: false, problems: [{ message: expect.stringContaining("more than one profile") }] });
  });

  it("names the document and the file line of a problem", () => {
    const text = profilesToYaml(docs).replace("name: out\n", "name: OUT\n");
    const read = profilesFromYaml(text);
    expect(read.ok).toBe(false);
    const problem = (read as { problems: { document: number; path: string; line?: number }[] }).problems[0];
    expect(problem).toMatchObject({ document: 0, path: "outputs[0].name" });
    expect(text.split("\n")[problem.line! - 1]).toContain("name: OUT");
  });
});
