import { describe, expect, it } from "vitest";
import { groupSchema, selectorSchema, tagSchema, type TagInput } from "@/schemas/tag";

const tag: TagInput = {
  name: "PAST1/TT-101/PV",
  unit: "degC",
  samplePeriodMs: 1000,
  kind: "analog",
  euLow: 0,
  euHigh: 150,
  area: "Pasteurisation",
  equipment: "HTST-1",
  gateway: "fw-gw-01",
};

/** The issues of a failed parse as "path: message". */
function issues(result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
  expect(result.success).toBe(false);
  return result.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
}

describe("tagSchema", () => {
  it("accepts a complete tag and trims text", () => {
    const parsed = tagSchema.parse({ ...tag, name: "  PAST1/TT-101/PV ", unit: " degC", area: " Pasteurisation " });
    expect(parsed).toEqual(tag);
  });

  it("turns empty or absent area, equipment and range into null", () => {
    const parsed = tagSchema.parse({ ...tag, area: "  ", equipment: undefined, euLow: undefined, euHigh: null });
    expect(parsed).toMatchObject({ area: null, equipment: null, euLow: null, euHigh: null });
  });

  it("requires a unit with a helpful message", () => {
    expect(issues(tagSchema.safeParse({ ...tag, unit: "  " }))).toEqual([
      "unit: Give the engineering unit (e.g. degC, kPa, m3/h; 'state' for discrete)",
    ]);
  });

  it("refuses control characters and over-long names", () => {
    expect(issues(tagSchema.safeParse({ ...tag, name: "PAST1/\tTT-101" }))).toEqual([
      "name: A tag name cannot contain control characters (tabs, line breaks).",
    ]);
    expect(tagSchema.safeParse({ ...tag, name: "x".repeat(191) }).success).toBe(true);
    expect(issues(tagSchema.safeParse({ ...tag, name: "x".repeat(192) }))).toEqual(["name: A tag name has at most 191 characters."]);
    expect(issues(tagSchema.safeParse({ ...tag, name: "" }))).toEqual(["name: Enter the tag name."]);
  });

  it("bounds the sample period to whole milliseconds from 1 ms to a day", () => {
    expect(tagSchema.safeParse({ ...tag, samplePeriodMs: 1 }).success).toBe(true);
    expect(tagSchema.safeParse({ ...tag, samplePeriodMs: 86_400_000 }).success).toBe(true);
    expect(issues(tagSchema.safeParse({ ...tag, samplePeriodMs: 0 }))).toEqual(["samplePeriodMs: The sample period is at least 1 ms."]);
    expect(issues(tagSchema.safeParse({ ...tag, samplePeriodMs: 86_400_001 }))).toEqual([
      "samplePeriodMs: The sample period is at most 86,400,000 ms (a day).",
    ]);
    expect(issues(tagSchema.safeParse({ ...tag, samplePeriodMs: 100.5 }))).toEqual([
      "samplePeriodMs: The sample period is a whole number of milliseconds.",
    ]);
  });

  it("wants both range ends or neither, and low below high (issue on euHigh)", () => {
    expect(issues(tagSchema.safeParse({ ...tag, euLow: 10, euHigh: 10 }))).toEqual(["euHigh: low must be below high"]);
    expect(issues(tagSchema.safeParse({ ...tag, euLow: 20, euHigh: -5 }))).toEqual(["euHigh: low must be below high"]);
    expect(issues(tagSchema.safeParse({ ...tag, euLow: 0, euHigh: null }))).toEqual([
      "euHigh: Give both ends of the engineering range, or neither.",
    ]);
    expect(issues(tagSchema.safeParse({ ...tag, euLow: null, euHigh: 5 }))).toEqual([
      "euLow: Give both ends of the engineering range, or neither.",
    ]);
    expect(tagSchema.parse({ ...tag, euLow: -40, euHigh: -39.5 })).toMatchObject({ euLow: -40, euHigh: -39.5 });
  });

  it("checks kind and gateway slug", () => {
    expect(issues(tagSchema.safeParse({ ...tag, kind: "analogue" }))).toEqual(["kind: Choose analog, discrete or counter."]);
    expect(tagSchema.safeParse({ ...tag, gateway: "-gw" }).success).toBe(false);
    expect(tagSchema.safeParse({ ...tag, gateway: "GW-1" }).success).toBe(false);
    expect(tagSchema.safeParse({ ...tag, gateway: "g" }).success).toBe(true);
  });

  it("limits area and equipment to 64 characters", () => {
    expect(tagSchema.safeParse({ ...tag, area: "a".repeat(64) }).success).toBe(true);
    expect(issues(tagSchema.safeParse({ ...tag, equipment: "e".repeat(65) }))).toEqual([
      "equipment: An equipment name has at most 64 characters.",
    ]);
  });
});

describe("selectorSchema", () => {
  it("fills every list with [] and both periods with null", () => {
    expect(selectorSchema.parse({})).toEqual({
      patterns: [],
      units: [],
      kinds: [],
      areas: [],
      equipment: [],
      gateways: [],
      minPeriodMs: null,
      maxPeriodMs: null,
      include: [],
      exclude: [],
    });
  });

  it("trims and de-duplicates lists, keeping the first occurrence", () => {
    const parsed = selectorSchema.parse({ patterns: [" PAST1/** ", "PAST1/**", "CIP2/*"], units: ["degC", " degC"], kinds: ["analog", "analog"] });
    expect(parsed.patterns).toEqual(["PAST1/**", "CIP2/*"]);
    expect(parsed.units).toEqual(["degC"]);
    expect(parsed.kinds).toEqual(["analog"]);
  });

  it("refuses empty entries instead of widening a filter", () => {
    expect(issues(selectorSchema.safeParse({ patterns: ["  "] }))).toEqual(["patterns.0: Enter a pattern or remove the empty one."]);
    expect(issues(selectorSchema.safeParse({ units: [""] }))).toEqual(["units.0: Remove the empty unit entry."]);
  });

  it("refuses patterns picomatch cannot compile or would read surprisingly", () => {
    const problem = (p: string) => issues(selectorSchema.safeParse({ patterns: [p] }))[0];
    expect(problem("PAST1/TT-[1")).toMatch(/^patterns\.0: Not a valid pattern: Missing closing: "\]"/);
    expect(problem("PAST1/{TT,FT")).toMatch(/^patterns\.0: Not a valid pattern: Missing closing: "\}"/);
    expect(problem("PAST1/[z-a]")).toBe("patterns.0: Not a valid pattern: check character ranges and a trailing “\\”.");
    expect(problem("PAST1\\")).toBe("patterns.0: Not a valid pattern: check character ranges and a trailing “\\”.");
    expect(problem("PAST1/[!T]*")).toBe("patterns.0: Write a negated class as [^…]; [!…] would match the “!” itself.");
    expect(problem("*a*b*c*")).toBe("patterns.0: Use at most 3 wildcards (* or **) in one pattern; split it into several patterns.");
    expect(problem("TT-{1..100}")).toMatch(/^patterns\.0: A range in braces works for single characters only/);
    expect(problem("A/\u0007")).toBe("patterns.0: A pattern cannot contain control characters.");
    expect(selectorSchema.safeParse({ patterns: ["**/TT-*/PV", "PAST1/TT-[0-9]??/{PV,SP}", "A/[*]/**/*"] }).success).toBe(true);
  });

  it("refuses a name in both include and exclude (issue on exclude)", () => {
    expect(issues(selectorSchema.safeParse({ include: ["A/1", "A/2"], exclude: ["A/2", "A/3"] }))).toEqual([
      'exclude: "A/2" is in both include and exclude; keep each name in one list.',
    ]);
  });

  it("wants the shortest sample period not above the longest", () => {
    expect(selectorSchema.safeParse({ minPeriodMs: 1000, maxPeriodMs: 1000 }).success).toBe(true);
    expect(issues(selectorSchema.safeParse({ minPeriodMs: 1001, maxPeriodMs: 1000 }))).toEqual([
      "maxPeriodMs: The longest sample period cannot be below the shortest.",
    ]);
    expect(selectorSchema.parse({ minPeriodMs: 500 })).toMatchObject({ minPeriodMs: 500, maxPeriodMs: null });
  });
});

describe("groupSchema", () => {
  it("defaults description, regulated flag and selector", () => {
    expect(groupSchema.parse({ name: "  Pasteuriser temperatures " })).toEqual({
      name: "Pasteuriser temperatures",
      description: "",
      regulated: false,
      selector: selectorSchema.parse({}),
    });
  });

  it("bounds name and description", () => {
    expect(groupSchema.safeParse({ name: "" }).success).toBe(false);
    expect(groupSchema.safeParse({ name: "n".repeat(80) }).success).toBe(true);
    expect(groupSchema.safeParse({ name: "n".repeat(81) }).success).toBe(false);
    expect(groupSchema.safeParse({ name: "g", description: "d".repeat(501) }).success).toBe(false);
    expect(groupSchema.parse({ name: "g", regulated: true, selector: { patterns: ["PAST1/**"] } })).toMatchObject({
      regulated: true,
      selector: { patterns: ["PAST1/**"] },
    });
  });
});
