// Sample-data CSV timestamps (issue #8, DESIGN.md "Signals"): ISO 8601 timestamps
// (RFC 3339 profile) with an offset or read in the site's zone through the IANA zone data;
// epoch seconds or milliseconds; problems with their line numbers.
import { describe, expect, it } from "vitest";
import { type ParsedSamples, parseSampleCsv } from "@/lib/preview";

const UTC = { timeZone: "UTC" };
const H = 3_600_000;

function ok(r: ParsedSamples) {
  if (!r.ok) throw new Error(`expected a series, got ${JSON.stringify(r.problems)}`);
  return r;
}
function problems(r: ParsedSamples) {
  if (r.ok) throw new Error("expected problems, got a series");
  return r.problems;
}
const times = (r: ParsedSamples) => Array.from(ok(r).series.t);

describe("parseSampleCsv — timestamps", () => {
  it("ISO 8601 with Z and with offsets (±hh:mm, ±hhmm, ±hh), fractions of a second", () => {
    const csv = [
      "time,value",
      "2026-01-01T00:00:00Z,1.5", // 00:00:00Z
      "2026-01-01T01:00:00.250+01:00,2", // 01:00:00.250 at UTC+1 = 00:00:00.250Z
      "2026-01-01 00:00:01-0130,3", // 00:00:01 at UTC−1:30 = 01:30:01Z
      "2026-01-01T07:30+05,4", // 07:30 at UTC+5 = 02:30Z
    ].join("\n");
    const r = ok(parseSampleCsv(csv, UTC));
    const t0 = Date.UTC(2026, 0, 1);
    expect(Array.from(r.series.t)).toEqual([t0, t0 + 250, t0 + 1.5 * H + 1000, t0 + 2.5 * H]);
    expect(r.format).toBe("iso-offset");
    expect(r.rows).toBe(4);
    expect(Array.from(r.series.v)).toEqual([1.5, 2, 3, 4]);
    expect(r.series.q).toBeUndefined();
  });

  it("without an offset: read in the site's zone (Europe/London summer time = UTC+1)", () => {
    const r = ok(parseSampleCsv("timestamp,value\n2026-07-01T12:00:00,1\n2026-07-01T12:00:01.5,2\n", { timeZone: "Europe/London" }));
    expect(r.format).toBe("iso-local");
    expect(Array.from(r.series.t)).toEqual([Date.UTC(2026, 6, 1, 11), Date.UTC(2026, 6, 1, 11, 0, 1, 500)]);
  });

  // EU summer time begins at 01:00 UTC on the last Sunday of March and ends at 01:00 UTC
  // on the last Sunday of October (Directive 2000/84/EC, Articles 2 and 3). In 2026 those
  // are 29 March and 25 October (1 October 2026 is a Thursday: Sundays 4, 11, 18, 25).
  it("spring: a local time the clocks skip (London 2026-03-29 01:30, between 01:00 GMT and 02:00 BST) is a problem on its line", () => {
    const csv = "time,value\n2026-03-29 00:30:00,1\n2026-03-29 01:30:00,2\n2026-03-29 02:30:00,3\n";
    const p = problems(parseSampleCsv(csv, { timeZone: "Europe/London" }));
    expect(p).toHaveLength(1);
    expect(p[0].line).toBe(3);
    expect(p[0].message).toMatch(/2026-03-29 01:30:00 does not exist in Europe\/London.*2026-03-29T01:00:00\.000Z/);
  });

  it("autumn: the repeated hour (London 2026-10-25 01:00–02:00 local) is resolved by row order", () => {
    // 02:00 BST (UTC+1) = 01:00 UTC becomes 01:00 GMT (UTC+0): local 01:00–01:59 occurs twice.
    // Local 00:30 BST = 23:30Z (24th); first pass 01:00, 01:30 BST = 00:00Z, 00:30Z;
    // time goes back to 01:00 → second pass in GMT: 01:00Z, 01:30Z; 02:00 GMT = 02:00Z.
    const csv = ["time,value", "2026-10-25T00:30,1", "2026-10-25T01:00,2", "2026-10-25T01:30,3", "2026-10-25T01:00,4", "2026-10-25T01:30,5", "2026-10-25T02:00,6"].join("\n");
    const utc = (h: number, m: number) => Date.UTC(2026, 9, 25, h, m);
    expect(times(parseSampleCsv(csv, { timeZone: "Europe/London" }))).toEqual([Date.UTC(2026, 9, 24, 23, 30), utc(0, 0), utc(0, 30), utc(1, 0), utc(1, 30), utc(2, 0)]);
    // Europe/Dublin keeps the same clock times (IST in summer, GMT in winter).
    expect(times(parseSampleCsv(csv, { timeZone: "Europe/Dublin" }))).toEqual(times(parseSampleCsv(csv, { timeZone: "Europe/London" })));
  });

  it("autumn, hourly rows: the second 01:00 (not after the previous row) is the GMT one", () => {
    const csv = "time,value\n2026-10-25 00:00,1\n2026-10-25 01:00,2\n2026-10-25 01:00,3\n2026-10-25 02:00,4\n";
    // 00:00 BST = 23:00Z; 01:00 BST = 00:00Z; 01:00 GMT = 01:00Z; 02:00 GMT = 02:00Z.
    const h = (x: number) => Date.UTC(2026, 9, 24, 23) + x * H;
    expect(times(parseSampleCsv(csv, { timeZone: "Europe/London" }))).toEqual([h(0), h(1), h(2), h(3)]);
  });

  it("the same rule west of UTC and with a half-hour shift (IANA tz database rules)", () => {
    // US daylight time ends at 02:00 local on the first Sunday of November (15 U.S.C. §260a,
    // as amended in 2005): 2026-11-01, EDT (UTC−4) → EST (UTC−5). 00:30 EDT = 04:30Z;
    // 01:30 EDT = 05:30Z; 01:30 again = EST = 06:30Z; 02:30 EST = 07:30Z.
    const ny = "time,value\n2026-11-01 00:30,1\n2026-11-01 01:30,2\n2026-11-01 01:30,3\n2026-11-01 02:30,4\n";
    expect(times(parseSampleCsv(ny, { timeZone: "America/New_York" }))).toEqual([4.5, 5.5, 6.5, 7.5].map((h) => Date.UTC(2026, 10, 1) + h * H));
    // Lord Howe Island moves by 30 min: 02:00 UTC+11 → 01:30 UTC+10:30 on 2026-04-05, so
    // 01:30–02:00 repeats. 01:15 (+11) = 14:15Z; 01:45 (+11) = 14:45Z; 01:45 (+10:30) = 15:15Z; 02:15 = 15:45Z (4 April).
    const lh = "time,value\n2026-04-05 01:15,1\n2026-04-05 01:45,2\n2026-04-05 01:45,3\n2026-04-05 02:15,4\n";
    expect(times(parseSampleCsv(lh, { timeZone: "Australia/Lord_Howe" }))).toEqual([14.25, 14.75, 15.25, 15.75].map((h) => Date.UTC(2026, 3, 4) + h * H));
  });

  it("a whole year of local 15-minute rows across both changes: every step is 15 min except the spring jump (the clock loses an hour)", () => {
    const lines = ["time,value"];
    const local: number[] = [];
    // Local wall times as the site's logger writes them: 15-min steps, 01:00–02:00 written twice in October.
    for (let w = Date.UTC(2026, 0, 1); w < Date.UTC(2027, 0, 1); w += 15 * 60_000) {
      const d = new Date(w);
      if (d.getUTCMonth() === 2 && d.getUTCDate() === 29 && d.getUTCHours() === 1) continue; // skipped in spring
      local.push(w);
      if (d.getUTCMonth() === 9 && d.getUTCDate() === 25 && d.getUTCHours() === 1 && d.getUTCMinutes() === 45) {
        for (let x = Date.UTC(2026, 9, 25, 1); x <= w; x += 15 * 60_000) local.push(x); // second pass
      }
    }
    for (const w of local) lines.push(`${new Date(w).toISOString().slice(0, 16)},1`);
    const t = times(parseSampleCsv(lines.join("\n"), { timeZone: "Europe/London" }));
    expect(t).toHaveLength(local.length);
    const steps = new Set(t.slice(1).map((x, i) => x - t[i]));
    expect([...steps]).toEqual([15 * 60_000]);
    expect(t[0]).toBe(Date.UTC(2026, 0, 1)); // GMT in January
    expect(t[t.length - 1]).toBe(Date.UTC(2026, 11, 31, 23, 45));
  });

  it("epoch seconds (below 1e11) and milliseconds, fractions allowed", () => {
    const t0 = Date.UTC(2026, 0, 1); // 1767225600000
    const s = ok(parseSampleCsv("ts,v\n1767225600,1\n1767225600.5,2\n1767225601.001,3\n", UTC));
    expect(s.format).toBe("epoch-s");
    expect(Array.from(s.series.t)).toEqual([t0, t0 + 500, t0 + 1001]);
    const ms = ok(parseSampleCsv("ts,v\n1767225600000,1\n1767225600000.25,2\n1767225600001,3\n", UTC));
    expect(ms.format).toBe("epoch-ms");
    expect(Array.from(ms.series.t)).toEqual([t0, t0 + 0.25, t0 + 1]);
  });
});
