import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  checkCsvSize,
  exportTagsCsv,
  parseTagCsv,
  parseTagCsvStreaming,
  suggestMapping,
  TAG_CSV_COLUMNS,
  type TagCsvResult,
} from "@/lib/tags/csv";
import { TAG_KINDS, tagSchema, type TagValues } from "@/schemas/tag";

// CSV syntax: RFC 4180. Formula neutralisation: OWASP "CSV Injection".
const HEADER = "name,unit,sample_period_ms,kind,eu_low,eu_high,area,equipment,gateway";
const gateways = ["fw-gw-01", "fw-gw-02"];
const tt101: TagValues = {
  name: "PAST1/TT-101/PV",
  unit: "degC",
  samplePeriodMs: 1000,
  kind: "analog",
  euLow: 0,
  euHigh: 150,
  area: "Hall 1\nnorth",
  equipment: "HTST-1",
  gateway: "fw-gw-01",
};
const ft204: TagValues = { name: "CIP2/FT-204/TOT", unit: "m3", samplePeriodMs: 1000, kind: "counter", euLow: null, euHigh: null, area: null, equipment: null, gateway: "fw-gw-01" };

// One bad row per reason; line 2 holds a quoted value with a line break, so every later row
// sits one physical line below its record number.
const BAD_FILE = [
  HEADER,
  'PAST1/TT-101/PV,degC,1000,analog,0,150,"Hall 1',
  'north",HTST-1,fw-gw-01',
  "",
  "PAST1/TT-102/PV,degC,1000,analogue,,,,,fw-gw-01",
  "PAST1/TT-103/PV,degC,1000,analog,150,0,,,fw-gw-01",
  "PAST1/TT-104/PV,,1000,analog,,,,,fw-gw-01",
  "PAST1/TT-105/PV,degC,1000,analog,,,,,fw-gw-09",
  "PAST1/TT-101/PV,degC,1000,analog,,,,,fw-gw-01",
  "PAST1/TT-106/PV,degC,fast,analog,,,,,fw-gw-01",
  ",degC,1000,analog,,,,,fw-gw-01",
  "PAST1/TT-107/PV,degC,1000,analog,0,,,,fw-gw-01",
  "PAST1/TT-108/PV,degC,,,,,,,",
  'PAST1/TT-109/PV,degC,100.5,analog,"1,5",2,,,fw-gw-01',
  "PAST1/TT-110/PV,degC,1000,analog,,,,,fw-gw-01,extra",
  ",,,,,,,,",
  `${"X".repeat(192)},degC,1000,analog,,,${"a".repeat(65)},,fw-gw-01`,
  "CIP2/FT-204/TOT,m3,1000,counter,,,,,fw-gw-01",
  "",
].join("\n");

const BAD_FILE_ERRORS = [
  { line: 5, field: "kind", reason: 'Line 5: unknown kind "analogue"; use analog, discrete or counter.' },
  { line: 6, field: "eu_high", reason: "Line 6: eu_low (150) must be below eu_high (0)." },
  { line: 7, field: "unit", reason: "Line 7: the unit is missing; give the engineering unit (e.g. degC, kPa, m3/h; 'state' for discrete)." },
  { line: 8, field: "gateway", reason: 'Line 8: unknown gateway "fw-gw-09"; this site has fw-gw-01, fw-gw-02.' },
  { line: 9, field: "name", reason: 'Line 9: duplicate name "PAST1/TT-101/PV" (first on line 2).' },
  { line: 10, field: "sample_period_ms", reason: 'Line 10: sample_period_ms "fast" is not a number.' },
  { line: 11, field: "name", reason: "Line 11: the tag name is missing." },
  { line: 12, field: "eu_high", reason: "Line 12: give both eu_low and eu_high, or leave both empty." },
  { line: 13, field: "sample_period_ms", reason: "Line 13: the sample period (sample_period_ms) is missing." },
  { line: 13, field: "kind", reason: "Line 13: the kind is missing; use analog, discrete or counter." },
  { line: 13, field: "gateway", reason: "Line 13: the gateway is missing; this site has fw-gw-01, fw-gw-02." },
  { line: 14, field: "eu_low", reason: 'Line 14: eu_low "1,5" is not a number (use a point as the decimal separator).' },
  { line: 14, field: "sample_period_ms", reason: "Line 14: the sample period is a whole number of milliseconds." },
  { line: 15, reason: 'Line 15: 10 values but the first line names 9 columns; quote values that contain ",".' },
  { line: 17, field: "name", reason: "Line 17: a tag name has at most 191 characters." },
  { line: 17, field: "area", reason: "Line 17: an area has at most 64 characters." },
];

// A valid, already normalised inventory: text with formula characters, delimiters, quotes,
// line breaks (area, equipment) and non-ASCII; ranges from any finite numbers.
const piece = fc.oneof(
  fc.constantFrom("=", "+", "-", "@", "'", "'=", "''+", '"', '""', ",", ";", "\t", " ", "é", "日本", "🙂", "/", "#"),
  fc.string({ maxLength: 5 }),
);
const text = (pieces: fc.Arbitrary<string>) => fc.array(pieces, { minLength: 1, maxLength: 6 }).map((p) => p.join(""));
const withBreaks = fc.oneof(piece, fc.constantFrom("\n", "\r\n", "\r"));
const number = fc.double({ noNaN: true, noDefaultInfinity: true }).map((n) => n + 0);
const candidate = fc.record({
  name: text(piece),
  unit: text(piece),
  samplePeriodMs: fc.integer({ min: 1, max: 86_400_000 }),
  kind: fc.constantFrom(...TAG_KINDS),
  range: fc.option(fc.tuple(number, number), { nil: null }),
  area: fc.option(text(withBreaks), { nil: null }),
  equipment: fc.option(text(withBreaks), { nil: null }),
  gateway: fc.constantFrom(...gateways),
});
// Keep only tags the schema accepts unchanged.
const validTag = candidate
  .map(({ range, ...t }): TagValues => ({
    name: t.name,
    unit: t.unit,
    samplePeriodMs: t.samplePeriodMs,
    kind: t.kind,
    euLow: range && Math.min(...range),
    euHigh: range && Math.max(...range),
    area: t.area,
    equipment: t.equipment,
    gateway: t.gateway,
  }))
  .filter((t) => {
    const parsed = tagSchema.safeParse(t);
    return parsed.success && JSON.stringify(parsed.data) === JSON.stringify(t);
  });
const inventory = fc.uniqueArray(validTag, { maxLength: 12, selector: (t) => t.name });

describe("parseTagCsv", () => {
  it("reads the canonical columns", () => {
    const csv = `${HEADER}\nCIP2/FT-204/TOT,m3,1000,counter,,,,,fw-gw-01\nPAST1/TT-101/PV,degC,1000,analog,0,150,"Hall 1\nnorth",HTST-1,fw-gw-01\n`;
    const result = parseTagCsv(csv, { gateways });
    expect(result.errors).toEqual([]);
    expect(result.rows).toEqual([ft204, tt101]);
    expect(result.headers).toEqual(HEADER.split(","));
    expect(result.mapping).toEqual(Object.fromEntries(TAG_CSV_COLUMNS.map((c, i) => [c.key, i])));
  });

  it("reports every problem with the physical line its row starts on", () => {
    const result = parseTagCsv(BAD_FILE, { gateways });
    expect(result.errors).toEqual(BAD_FILE_ERRORS);
    expect(result.rows).toEqual([tt101, ft204]);
  });

  it("counts lines the same with CRLF and CR line ends", () => {
    for (const newline of ["\r\n", "\r"]) {
      const result = parseTagCsv(BAD_FILE.replace(/\n/g, newline), { gateways });
      expect(result.errors).toEqual(BAD_FILE_ERRORS);
      expect(result.rows).toEqual([{ ...tt101, area: `Hall 1${newline}north` }, ft204]);
    }
  });

  it("reports an unclosed quote and a stray quote on their lines", () => {
    const unclosed = parseTagCsv(`${HEADER}\n\nCIP2/FT-204/TOT,m3,1000,counter,,,,,fw-gw-01\nA/1,"degC,1000,analog,,,,,fw-gw-01\nA/2,degC,1000,analog,,,,,fw-gw-01\n`, { gateways });
    expect(unclosed.errors).toEqual([
      { line: 4, reason: 'Line 4: a quoted value is not closed (a closing " is missing); the rest of the file could not be read.' },
    ]);
    expect(unclosed.rows).toEqual([ft204]);
    const stray = parseTagCsv(`${HEADER}\nA/1,"deg"C,1000,analog,,,,,fw-gw-01\nCIP2/FT-204/TOT,m3,1000,counter,,,,,fw-gw-01\n`, { gateways });
    expect(stray.errors).toEqual([
      { line: 2, reason: 'Line 2: a quoted value has a stray " inside and is not closed; the rest of the file could not be read.' },
    ]);
    expect(stray.rows).toEqual([]);
    const recovered = parseTagCsv(`${HEADER}\nA/1,"deg"C",1000,analog,,,,,fw-gw-01\nCIP2/FT-204/TOT,m3,1000,counter,,,,,fw-gw-01\n`, { gateways });
    expect(recovered.errors).toEqual([{ line: 2, reason: 'Line 2: a quoted value has a stray " inside; double it ("") or remove it.' }]);
    expect(recovered.rows).toEqual([ft204]);
  });

  it("maps odd headers, ignores extra columns and reads kind and gateway in any case", () => {
    const headers = ["Tag Name", "Description", "UoM", "Scan Rate", "Type", "Range Low", "Range High", "Plant Area", "Equip", "GW"];
    expect(suggestMapping(headers)).toEqual({
      name: 0,
      unit: 2,
      sample_period_ms: 3,
      kind: 4,
      eu_low: 5,
      eu_high: 6,
      area: 7,
      equipment: 8,
      gateway: 9,
    });
    const csv = `${headers.join(",")}\nPAST1/TT-101/PV,Holding tube outlet,degC,1000,Analog,0,150,"Hall 1\nnorth",HTST-1,FW-GW-01\n`;
    expect(parseTagCsv(csv, { gateways })).toMatchObject({ rows: [tt101], errors: [] });
  });

  it("knows the synonyms of the brief and prefers exact canonical names", () => {
    const mapping = suggestMapping(["tagname", "Eng Unit", "Sample period (ms)", "kind", "EU low", "eu-high", "Area", "equipment", "collector", "name"]);
    expect(mapping).toEqual({ name: 9, unit: 1, sample_period_ms: 2, kind: 3, eu_low: 4, eu_high: 5, area: 6, equipment: 7, gateway: 8 });
    expect(suggestMapping(["tag", "units", "period", "type", "min", "max", "gw"])).toMatchObject({
      name: 0,
      unit: 1,
      sample_period_ms: 2,
      kind: 3,
      eu_low: 4,
      eu_high: 5,
      gateway: 6,
      area: null,
      equipment: null,
    });
  });

  it("uses a mapping it is given", () => {
    const csv = "a,b,c,d,e\nm3,CIP2/FT-204/TOT,counter,1000,fw-gw-01\n";
    const result = parseTagCsv(csv, { gateways, mapping: { name: 1, unit: 0, kind: 2, sample_period_ms: 3, gateway: 4, area: null } });
    expect(result).toMatchObject({ rows: [ft204], errors: [] });
  });

  it("refuses a file without a required column, once", () => {
    const result = parseTagCsv("name,unit,kind\nA/1,degC,analog\n", { gateways });
    expect(result.errors).toEqual([
      { line: 1, reason: "Line 1: no column for sample_period_ms, gateway; the first line must name the columns (name, unit, sample_period_ms, kind, gateway are required)." },
    ]);
    expect(result.rows).toEqual([]);
    expect(parseTagCsv("\n\n", { gateways }).errors).toEqual([{ line: 1, reason: "Line 1: the file is empty; the first line must name the columns." }]);
  });

  it("detects semicolons and tabs, and ignores a byte-order mark", () => {
    const semicolon = `\uFEFF${HEADER.replace(/,/g, ";")}\nPAST1/TT-101/PV;degC;1000;analog;0;150;"Hall 1\nnorth";HTST-1;fw-gw-01\nCIP2/FT-204/TOT;m3;1000;counter;;;;;fw-gw-01\n`;
    expect(parseTagCsv(semicolon, { gateways })).toMatchObject({ rows: [tt101, ft204], errors: [], headers: HEADER.split(",") });
    const tab = `${HEADER.replace(/,/g, "\t")}\r\nCIP2/FT-204/TOT\tm3\t1000\tcounter\t\t\t\t\tfw-gw-01\r\n`;
    expect(parseTagCsv(tab, { gateways })).toMatchObject({ rows: [ft204], errors: [] });
  });

  it("removes an apostrophe that neutralised a formula", () => {
    const csv = `${HEADER}\n'=A/1,'+x,1000,analog,'-40,'-20,'@home,''-x,fw-gw-01\n`;
    expect(parseTagCsv(csv, { gateways })).toMatchObject({
      errors: [],
      rows: [{ name: "=A/1", unit: "+x", euLow: -40, euHigh: -20, area: "@home", equipment: "'-x" }],
    });
  });

  it("refuses more rows than the limit with one error and no rows", () => {
    const row = (i: number) => `A/${i},degC,1000,analog,,,,,fw-gw-01`;
    const csv = (n: number) => [HEADER, ...Array.from({ length: n }, (_, i) => row(i)), ""].join("\n");
    expect(parseTagCsv(csv(3), { gateways, maxRows: 3 })).toMatchObject({ errors: [], rows: { length: 3 } });
    const over = parseTagCsv(`${csv(3)}\nbad,,,,\n${row(3)}\n${row(4)}\n`, { gateways, maxRows: 3 });
    expect(over).toMatchObject({ errors: [{ line: 6, reason: "Line 6: the file has more than 3 rows; split it into smaller files." }], rows: [] });
  });

  it("allows 200,000 rows by default", () => {
    // The limit is checked before any row is validated, so short rows do.
    const result = parseTagCsv(`${HEADER}\n${"x\n".repeat(200_001)}`, { gateways });
    expect(result.errors).toEqual([{ line: 200_002, reason: "Line 200002: the file has more than 200,000 rows; split it into smaller files." }]);
    expect(result.rows).toEqual([]);
  }, 30_000);
});

describe("checkCsvSize", () => {
  it("accepts 20 MB and refuses a byte more", () => {
    expect(checkCsvSize(20 * 1024 * 1024)).toBeNull();
    expect(checkCsvSize(20 * 1024 * 1024 + 1)).toBe("The file is 20.0 MB; the limit is 20 MB. Split it into smaller files.");
    expect(checkCsvSize(31.5 * 1024 * 1024)).toBe("The file is 31.5 MB; the limit is 20 MB. Split it into smaller files.");
  });
});

describe("exportTagsCsv", () => {
  it("writes the canonical header, CRLF line ends and empty cells for absent values", () => {
    expect(exportTagsCsv([ft204, tt101])).toBe(
      `${HEADER}\r\nCIP2/FT-204/TOT,m3,1000,counter,,,,,fw-gw-01\r\nPAST1/TT-101/PV,degC,1000,analog,0,150,"Hall 1\nnorth",HTST-1,fw-gw-01\r\n`,
    );
    expect(exportTagsCsv([])).toBe(`${HEADER}\r\n`);
  });

  it("neutralises text that a spreadsheet would run as a formula, not numbers", () => {
    const tags: TagValues[] = [
      { ...ft204, name: "=HYPERLINK(\"x\")", unit: "+V", euLow: -40, euHigh: -0.5, area: "-A", equipment: "@E" },
      { ...ft204, name: "'=already", unit: "'plain", euLow: -1e-7, euHigh: 1e21, area: "a=b", equipment: null },
    ];
    const lines = exportTagsCsv(tags).split("\r\n");
    expect(lines[1]).toBe(`"'=HYPERLINK(""x"")","'+V",1000,counter,-40,-0.5,"'-A","'@E",fw-gw-01`);
    expect(lines[2]).toBe(`"''=already",'plain,1000,counter,-1e-7,1e+21,a=b,,fw-gw-01`);
  });

  it("round-trips any valid inventory", () => {
    fc.assert(
      fc.property(inventory, (tags) => {
        const result = parseTagCsv(exportTagsCsv(tags), { gateways });
        expect(result.errors).toEqual([]);
        expect(result.rows).toEqual(tags);
      }),
      { numRuns: 300 },
    );
  });
});

describe("parseTagCsvStreaming", () => {
  const same = (a: TagCsvResult, b: TagCsvResult) => expect(a).toEqual(b);

  it("gives the same result as parseTagCsv, chunk size aside, with progress up to 1", async () => {
    for (const file of [BAD_FILE, BAD_FILE.replace(/\n/g, "\r\n"), exportTagsCsv([tt101, ft204, { ...tt101, name: "=x", area: "a\r\nb" }])]) {
      for (const chunkSize of [1, 7, 64, 1 << 20]) {
        const progress: number[] = [];
        const streamed = await parseTagCsvStreaming(file, { gateways, chunkSize }, (f) => progress.push(f));
        same(streamed, parseTagCsv(file, { gateways }));
        expect(progress.at(-1)).toBe(1);
        expect(progress.every((f, i) => f >= 0 && f <= 1 && (i === 0 || f >= progress[i - 1]))).toBe(true);
      }
    }
  });

  it("matches parseTagCsv on random inventories and chunk sizes", async () => {
    await fc.assert(
      fc.asyncProperty(inventory, fc.integer({ min: 8, max: 300 }), async (tags, chunkSize) => {
        const csv = exportTagsCsv(tags);
        same(await parseTagCsvStreaming(csv, { gateways, chunkSize }), parseTagCsv(csv, { gateways }));
      }),
      { numRuns: 40 },
    );
  }, 30_000);

  it("reads a Blob (a File in the browser) and stops at the row limit", async () => {
    const blob = new Blob([`\uFEFF${BAD_FILE}`], { type: "text/csv" });
    same(await parseTagCsvStreaming(blob, { gateways }), parseTagCsv(BAD_FILE, { gateways }));
    const many = [HEADER, ...Array.from({ length: 10 }, (_, i) => `A/${i},degC,1000,analog,,,,,fw-gw-01`)].join("\n");
    const limited = await parseTagCsvStreaming(many, { gateways, maxRows: 4, chunkSize: 40 });
    same(limited, parseTagCsv(many, { gateways, maxRows: 4 }));
    expect(limited.errors).toEqual([{ line: 6, reason: "Line 6: the file has more than 4 rows; split it into smaller files." }]);
  });
});
