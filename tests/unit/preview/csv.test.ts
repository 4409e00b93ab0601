// Sample-data CSV layout (issue #8): RFC 4180 fields, separators, quality, numbers read as
// Number() reads them, and problems with their line numbers (timestamps: csv-timestamps.test.ts).
import { describe, expect, it } from "vitest";
import { type ParsedSamples, parseSampleCsv } from "@/lib/preview";

const UTC = { timeZone: "UTC" };

function ok(r: ParsedSamples) {
  if (!r.ok) throw new Error(`expected a series, got ${JSON.stringify(r.problems)}`);
  return r;
}
function problems(r: ParsedSamples) {
  if (r.ok) throw new Error("expected problems, got a series");
  return r.problems;
}

describe("parseSampleCsv — layout", () => {
  it("quality as 0/1/2 or words; a bad sample's value may be anything (read as NaN), any other must be a number", () => {
    const r = ok(parseSampleCsv("Time,PV,Quality\n1,1,good\n2,2,1\n3,,bad\n4,NaN,2\n5,5,UNCERTAIN\n6,Comm Fail,bad\n7,7.5,bad\n", UTC));
    expect(r.columns).toEqual({ time: "Time", value: "PV", quality: "Quality" });
    expect(Array.from(r.series.q as Uint8Array)).toEqual([0, 1, 2, 2, 1, 2, 2]);
    expect(Array.from(r.series.v)).toEqual([1, 2, Number.NaN, Number.NaN, 5, Number.NaN, 7.5]);
    const p = problems(parseSampleCsv("t,v,q\n1,NaN,uncertain\n2,Comm Fail,0\n", UTC));
    expect(p).toEqual([
      { line: 2, message: "bad number \"NaN\"" },
      { line: 3, message: "bad number \"Comm Fail\"" },
    ]);
  });

  it("; with decimal commas, tab, CRLF, byte order mark, quoted fields, extra columns and blank trailing lines", () => {
    const want = [Date.UTC(2026, 0, 1), Date.UTC(2026, 0, 1, 0, 0, 1)];
    const semi = ok(parseSampleCsv('\ufeff"tag";"time";"value"\r\n"TT-1";"2026-01-01T00:00:00Z";"1,5"\r\nTT-1; 2026-01-01T00:00:01Z ;-2,25e1\r\n\r\n\r\n', UTC));
    expect(Array.from(semi.series.t)).toEqual(want);
    expect(Array.from(semi.series.v)).toEqual([1.5, -22.5]);
    const tab = ok(parseSampleCsv("datetime\tval\n2026-01-01T00:00:00Z\t1.5\n2026-01-01T00:00:01Z\t7\n\n", UTC));
    expect(Array.from(tab.series.t)).toEqual(want);
    expect(Array.from(tab.series.v)).toEqual([1.5, 7]);
  });

  it("numbers read exactly as Number() reads them, long ones included", () => {
    const values = ["0.1", "-3.14159", "1e-7", "123456789012345678", "0.30000000000000004", "+7", "2.5E3", "1.7976931348623157e308"];
    const csv = `t,v\n${values.map((x, i) => `${i + 1},${x}`).join("\n")}`;
    expect(Array.from(ok(parseSampleCsv(csv, UTC)).series.v)).toEqual(values.map(Number));
  });
});

describe("parseSampleCsv — refused with line numbers", () => {
  it("a header without a value column (line 1)", () => {
    expect(problems(parseSampleCsv("time,temperature\n1,2\n", UTC))).toEqual([{ line: 1, message: expect.stringMatching(/^the header has no value column \(value, v, pv, val\)/) }]);
    expect(problems(parseSampleCsv("2026-01-01T00:00:00Z,1\n", UTC))[0]).toEqual({ line: 1, message: expect.stringMatching(/no time column .* and no value column/) });
    expect(problems(parseSampleCsv("", UTC))[0].line).toBe(1);
  });

  it("bad timestamps, bad numbers, bad quality, too few fields", () => {
    const csv = "time,value,q\n2026-01-01T00:00:00Z,1,0\n2026-02-30T00:00:00Z,2,0\n2026-01-01T00:00:02Z,abc,0\n2026-01-01T00:00:03Z,3,7\n2026-01-01T00:00:04Z,4\n2026-01-01T00:00:05,5,0\n2026-01-01T00:00:06Z,,0\n";
    const p = problems(parseSampleCsv(csv, UTC));
    expect(p.map((x) => x.line)).toEqual([3, 4, 5, 6, 7, 8]);
    expect(p[0].message).toMatch(/bad timestamp "2026-02-30T00:00:00Z"/);
    expect(p[1].message).toMatch(/bad number "abc"/);
    expect(p[2].message).toMatch(/bad quality "7"/);
    expect(p[3].message).toMatch(/at least 3 fields/);
    expect(p[4].message).toMatch(/no UTC offset, but the first row has one/);
    expect(p[5].message).toMatch(/missing value/);
  });

  it("unsorted and duplicate timestamps name their lines", () => {
    const p = problems(parseSampleCsv("ts,value\n1000,1\n1002,2\n1001,3\n1003,4\n1003,5\n", UTC));
    expect(p).toEqual([
      { line: 4, message: "timestamp before line 3's: rows must ascend in time" },
      { line: 6, message: "duplicate timestamp (the same instant as line 5)" },
    ]);
  });

  it("an epoch-seconds file with a millisecond value", () => {
    const p = problems(parseSampleCsv("ts,value\n1767225600,1\n1767225601000,2\n", UTC));
    expect(p).toEqual([{ line: 3, message: expect.stringMatching(/looks like epoch milliseconds/) }]);
  });

  it("a header and no data rows", () => {
    expect(problems(parseSampleCsv("time,value\n\n", UTC))).toEqual([{ line: 2, message: "the file has a header but no data rows" }]);
  });

  it("at most 20 problems, the first ones", () => {
    const csv = `t,v\n${Array.from({ length: 50 }, (_, i) => `${i + 1},x`).join("\n")}`;
    const p = problems(parseSampleCsv(csv, UTC));
    expect(p).toHaveLength(20);
    expect(p[19].line).toBe(21);
  });

  it("more than maxRows data rows: a problem on the first row over (blank lines still count as lines)", () => {
    const csv = "t,v\n1,1\n2,2\n\n3,3\n4,4\n5,5\n6,6\n";
    expect(ok(parseSampleCsv(csv, { timeZone: "UTC", maxRows: 6 })).rows).toBe(6);
    expect(problems(parseSampleCsv(csv, { timeZone: "UTC", maxRows: 5 }))).toEqual([{ line: 8, message: "more than 5 data rows (the limit): line 8 is row 6" }]);
  });

  it("2,000,001 rows against the default limit of 2,000,000, parsed in under 3 s of CPU time", () => {
    const csv = epochMsCsv(2_000_001);
    // CPU time, not wall time: the test machine is shared.
    const started = process.cpuUsage();
    const p = problems(parseSampleCsv(csv, UTC));
    const used = process.cpuUsage(started);
    expect((used.user + used.system) / 1000).toBeLessThan(3000);
    expect(p).toEqual([{ line: 2_000_002, message: "more than 2,000,000 data rows (the limit): line 2,000,002 is row 2,000,001" }]);
  }, 30_000);
});

/** "ts,value" and `rows` rows "1767225600001,1" … (16 bytes each), written as bytes: 2M template strings would take longer than the parse. */
function epochMsCsv(rows: number): string {
  const head = "ts,value\n";
  const bytes = new Uint8Array(head.length + rows * 16);
  for (let k = 0; k < head.length; k++) bytes[k] = head.charCodeAt(k);
  const digits = Array.from("1767225600000", Number);
  for (let i = 1, p = head.length; i <= rows; i++, p += 16) {
    for (let d = 12; (digits[d] = (digits[d] + 1) % 10) === 0; d--); // odometer: + 1
    for (let d = 0; d < 13; d++) bytes[p + d] = 48 + digits[d];
    bytes[p + 13] = 44;
    bytes[p + 14] = 48 + (i & 7);
    bytes[p + 15] = 10;
  }
  return new TextDecoder("latin1").decode(bytes);
}
