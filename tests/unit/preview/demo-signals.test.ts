// Demo signals (issue #8): invented shapes, common practice; each kind checked for the
// behaviour its JSDoc promises, and for DESIGN.md "Signals" (a gap is a step longer than
// 3 sample periods; quality 2 is bad).
import { describe, expect, it } from "vitest";
import { DEMO_SIGNALS, demoSignal } from "@/lib/preview";
import { validateSeries } from "@/lib/reduction";

const N = 20_000;
const P = 1000;
const gen = (kind: (typeof DEMO_SIGNALS)[number], seed = 3) => demoSignal(kind, { samples: N, periodMs: P, seed });

describe("demoSignal", () => {
  it.each(DEMO_SIGNALS)("%s: deterministic for a seed, different for another", (kind) => {
    const a = gen(kind);
    const b = gen(kind);
    expect(Array.from(a.v)).toEqual(Array.from(b.v));
    expect(Array.from(a.t)).toEqual(Array.from(b.t));
    expect(Array.from(gen(kind, 4).v)).not.toEqual(Array.from(a.v));
  });

  it.each(DEMO_SIGNALS)("%s: a valid series with one gap of 20 periods and four bad samples holding the previous value", (kind) => {
    const s = gen(kind);
    expect(() => validateSeries(s)).not.toThrow();
    expect(s.t).toHaveLength(N);
    expect(s.t[0]).toBe(Date.UTC(2026, 0, 1));
    const steps = Array.from(s.t.subarray(1), (x, i) => x - s.t[i]);
    expect(steps.filter((d) => d > 3 * P)).toEqual([20 * P]);
    expect(steps.filter((d) => d === P)).toHaveLength(N - 2);
    const bad = Array.from(s.q as Uint8Array).flatMap((q, i) => (q === 2 ? [i] : []));
    expect(bad).toEqual([6000, 6001, 6002, 16000]);
    for (const i of bad) expect(s.v[i]).toBe(s.v[i - 1]);
  });

  it("temperature: stays in range, moves between setpoints, little noise between samples", () => {
    const { v } = gen("temperature");
    const values = Array.from(v);
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...values)).toBeLessThanOrEqual(100);
    expect(Math.max(...values) - Math.min(...values)).toBeGreaterThan(20);
    const moves = values.slice(1).map((x, i) => Math.abs(x - values[i])).sort((a, b) => a - b);
    expect(moves[moves.length >> 1]).toBeLessThan(1); // median step < 1 % of the range
  });

  it("flow: the pump stops (near zero) and runs (near 60 % of range), never below the range", () => {
    const values = Array.from(gen("flow").v);
    const stopped = values.filter((x) => x < 0.05 * 50).length / N;
    const running = values.filter((x) => Math.abs(x - 30) < 5).length / N;
    expect(stopped).toBeGreaterThan(0.2);
    expect(running).toBeGreaterThan(0.2);
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
  });

  it("vibration: a low baseline with bursts above 7.1 mm/s (an ISO 10816-3 zone boundary, from memory)", () => {
    const values = Array.from(gen("vibration").v).sort((a, b) => a - b);
    expect(values[values.length >> 1]).toBeLessThan(3);
    expect(values.filter((x) => x > 7.1).length).toBeGreaterThan(10);
    // The first burst starts at 40 % of the samples even in a short series.
    const short = demoSignal("vibration", { samples: 100, periodMs: P, seed: 9 });
    expect(short.v[40]).toBeGreaterThan(7.1);
  });

  it("valve: only 0 and 1, with dwell times of at least 50 samples (46 where a bad sample holds the old state)", () => {
    const v = Array.from(demoSignal("valve", { samples: N, periodMs: P, seed: 3, euLow: 0, euHigh: 100 }).v);
    expect(new Set(v)).toEqual(new Set([0, 1]));
    const changes = v.flatMap((x, i) => (i > 0 && x !== v[i - 1] ? [i] : []));
    expect(changes.length).toBeGreaterThan(10);
    expect(Math.min(...changes.slice(1).map((c, k) => c - changes[k]))).toBeGreaterThanOrEqual(46);
  });

  it("totaliser: rises, wraps to 0 at the rollover exactly once, starts at a quarter and ends at a quarter of it", () => {
    for (const rollover of [1e6, 65_536]) {
      const v = Array.from(demoSignal("totaliser", { samples: N, periodMs: P, seed: 5, rollover }).v);
      const drops = v.flatMap((x, i) => (i > 0 && x < v[i - 1] ? [i] : []));
      expect(drops).toHaveLength(1);
      expect(Math.min(...v)).toBeGreaterThanOrEqual(0);
      expect(Math.max(...v)).toBeLessThan(rollover);
      expect(v[0]).toBe(0.25 * rollover);
      expect(v[N - 1]).toBeCloseTo(0.25 * rollover, 2);
    }
  });

  it("refuses a bad kind, sample count or period", () => {
    expect(() => demoSignal("pressure" as never, { samples: 10, periodMs: P })).toThrow(RangeError);
    expect(() => demoSignal("flow", { samples: 1.5, periodMs: P })).toThrow(RangeError);
    expect(() => demoSignal("flow", { samples: 10, periodMs: 0 })).toThrow(RangeError);
    expect(() => demoSignal("flow", { samples: 10, periodMs: P, euLow: 5, euHigh: 5 })).toThrow(RangeError);
  });
});
