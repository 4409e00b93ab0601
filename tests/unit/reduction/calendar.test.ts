// Calendar windows (DESIGN.md "Signals"): windows of an hour or more aligned to a site's
// local calendar through luxon's IANA data; 23- and 25-hour days at DST changes.
// Expected instants from the published rules: EU summer time starts and ends at 01:00 UTC
// on the last Sundays of March and October (Directive 2000/84/EC); US daylight time
// starts on the second Sunday of March and ends on the first Sunday of November at
// 02:00 local time (Energy Policy Act of 2005). 2026: 29 March / 25 October; 8 March / 1 November.
import { describe, expect, it } from "vitest";
import { aggregate, counterDelta, counterRate, type Series } from "@/lib/reduction";

const H = 3_600_000;
const DAY = 24 * H;
const utc = (iso: string) => Date.parse(iso);

/** Samples every `stepMs` over [from, to), value = seconds since `from` (a counter rising 1 per second). */
function regular(from: number, to: number, stepMs: number): Series {
  const n = Math.floor((to - from) / stepMs);
  const t = Float64Array.from({ length: n }, (_, i) => from + i * stepMs);
  return { t, v: t.map((x) => (x - from) / 1000) };
}

/** Window starts and lengths (from consecutive starts) of daily count windows. */
function days(s: Series, timeZone: string, offsetMs = 0) {
  const out = aggregate(s, { windowMs: DAY, offsetMs, timeZone, fn: "count" });
  return { starts: Array.from(out.t), counts: Array.from(out.v) };
}

describe("daily windows in Europe/Berlin", () => {
  const s = regular(utc("2026-03-27T00:00:00Z"), utc("2026-04-01T00:00:00Z"), 15 * 60_000);

  it("spring change (29 March 2026): the day from local midnight to local midnight lasts 23 hours", () => {
    const { starts, counts } = days(s, "Europe/Berlin");
    const k = starts.indexOf(utc("2026-03-28T23:00:00Z")); // 29 March 00:00 CET (UTC+1)
    expect(k).toBeGreaterThan(0);
    expect(starts[k + 1]).toBe(utc("2026-03-29T22:00:00Z")); // 30 March 00:00 CEST (UTC+2)
    expect(starts[k + 1] - starts[k]).toBe(23 * H);
    expect(counts[k]).toBe(92); // 23 h of 15-minute samples
    expect(starts[k] - starts[k - 1]).toBe(24 * H);
  });

  it("autumn change (25 October 2026): 25 hours", () => {
    const autumn = regular(utc("2026-10-23T00:00:00Z"), utc("2026-10-28T00:00:00Z"), 15 * 60_000);
    const { starts, counts } = days(autumn, "Europe/Berlin");
    const k = starts.indexOf(utc("2026-10-24T22:00:00Z")); // 25 October 00:00 CEST
    expect(starts[k + 1]).toBe(utc("2026-10-25T23:00:00Z")); // 26 October 00:00 CET
    expect(counts[k]).toBe(100);
  });

  it("with an offset of 6 h the production day starts at 06:00 local: 23 hours from 28 March 06:00 CET", () => {
    const { starts } = days(s, "Europe/Berlin", 6 * H);
    const k = starts.indexOf(utc("2026-03-28T05:00:00Z"));
    expect(starts[k + 1]).toBe(utc("2026-03-29T04:00:00Z"));
  });

  it("a counter rising one count a second: 82,800 counts on the short day, still 1 per second", () => {
    const delta = counterDelta(s, { windowMs: DAY, timeZone: "Europe/Berlin", rollover: 1e9 });
    const rate = counterRate(s, { windowMs: DAY, timeZone: "Europe/Berlin", rollover: 1e9 });
    const k = Array.from(delta.t).indexOf(utc("2026-03-28T23:00:00Z"));
    expect(delta.v[k]).toBe(23 * 3600);
    expect(rate.v[k]).toBe(1);
  });
});

describe("daily windows in America/New_York", () => {
  it("23 hours on 8 March 2026 and 25 hours on 1 November 2026", () => {
    const spring = days(regular(utc("2026-03-06T00:00:00Z"), utc("2026-03-11T00:00:00Z"), H), "America/New_York");
    const k = spring.starts.indexOf(utc("2026-03-08T05:00:00Z")); // 00:00 EST (UTC−5)
    expect(spring.starts[k + 1]).toBe(utc("2026-03-09T04:00:00Z")); // 00:00 EDT (UTC−4)
    expect(spring.counts[k]).toBe(23);
    const autumn = days(regular(utc("2026-10-30T00:00:00Z"), utc("2026-11-04T00:00:00Z"), H), "America/New_York");
    const j = autumn.starts.indexOf(utc("2026-11-01T04:00:00Z"));
    expect(autumn.starts[j + 1]).toBe(utc("2026-11-02T05:00:00Z"));
    expect(autumn.counts[j]).toBe(25);
  });
});

describe("hourly windows across the changes (Europe/Berlin)", () => {
  it("autumn: the repeated 02:00 hour belongs to the window that started before it (2 h long)", () => {
    const s = regular(utc("2026-10-24T20:00:00Z"), utc("2026-10-25T05:00:00Z"), 30 * 60_000);
    const out = aggregate(s, { windowMs: H, timeZone: "Europe/Berlin", fn: "count" });
    const starts = Array.from(out.t);
    const k = starts.indexOf(utc("2026-10-25T00:00:00Z")); // 02:00 CEST, first occurrence
    expect(starts[k + 1]).toBe(utc("2026-10-25T02:00:00Z")); // 03:00 CET
    expect(out.v[k]).toBe(4);
    expect(Array.from(out.v).filter((c) => c !== 2)).toEqual([4]);
  });

  it("spring: no window for the skipped hour; the windows are contiguous hours", () => {
    const s = regular(utc("2026-03-28T20:00:00Z"), utc("2026-03-29T05:00:00Z"), 30 * 60_000);
    const starts = Array.from(aggregate(s, { windowMs: H, timeZone: "Europe/Berlin", fn: "count" }).t);
    expect(starts.slice(1).map((x, k) => x - starts[k])).toEqual(Array(starts.length - 1).fill(H));
    expect(starts[0]).toBe(utc("2026-03-28T20:00:00Z"));
  });
});

describe("zones without DST and bad parameters", () => {
  it("Asia/Kolkata (UTC+05:30): days start at 18:30 UTC", () => {
    const { starts } = days(regular(utc("2026-06-01T00:00:00Z"), utc("2026-06-04T00:00:00Z"), H), "Asia/Kolkata");
    expect(starts.slice(1)).toEqual([utc("2026-06-01T18:30:00Z"), utc("2026-06-02T18:30:00Z"), utc("2026-06-03T18:30:00Z")]);
  });

  it("refuses windows under an hour and unknown zones", () => {
    const s = regular(0, H, 60_000);
    expect(() => aggregate(s, { windowMs: 30 * 60_000, timeZone: "Europe/Berlin", fn: "mean" })).toThrow(/an hour or more/);
    expect(() => aggregate(s, { windowMs: H, timeZone: "Mars/Olympus", fn: "mean" })).toThrow(/IANA/);
  });
});
