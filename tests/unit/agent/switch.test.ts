import { describe, expect, it } from "vitest";
import { parseBundle } from "@/lib/agent/bundle";
import { buildPlan, type Plan } from "@/lib/agent/plan";
import { type OutputRow, Reducer, switchBoundary } from "@/lib/agent/switch";
import { digestHex } from "@/lib/bundles/digest";
import type { Profile } from "@/lib/reduction/profile";
import type { Series } from "@/lib/reduction/series";
import { deadband, shape } from "../bundles/fixtures";
import { bundleText } from "./fixtures";

const T0 = Date.UTC(2026, 11, 1, 10, 0, 0);
const TT = "PAST1/TT-101/PV";
const PT = "PAST1/PT-201/PV";

const stats: Profile = {
  name: "Statistics",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 60 }] },
    { name: "hi", steps: [{ method: "aggregate", fn: "max", window: 300, offset: 30 }] },
  ],
};
const planOf = (opts: Parameters<typeof bundleText>[0]) => {
  const text = bundleText(opts);
  return buildPlan(parseBundle(text), digestHex(text));
};
const shapePlan = (release: number, percent = 0.2) => planOf({ release, profiles: new Map([[13, shape(percent)], [21, deadband()]]) });
const statsPlan = (release: number) => planOf({ release, profiles: new Map([[13, stats], [21, deadband()]]) });

/** Samples at 1 s from T0 + fromS to T0 + toS (exclusive), a slow ramp with wiggles. */
function samples(fromS: number, toS: number): Series {
  const n = toS - fromS;
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = T0 + (fromS + i) * 1000;
    v[i] = 70 + (fromS + i) / 50 + Math.sin((fromS + i) / 7);
  }
  return { t, v, q: new Uint8Array(n) };
}
const part = (s: Series, from: number, to: number): Series => ({ t: s.t.subarray(from, to), v: s.v.subarray(from, to), q: s.q!.subarray(from, to) });

/** What a fresh runner of `plan` emits for the series, as rows. */
function alone(plan: Plan, tag: string, s: Series): OutputRow[] {
  const r = new Reducer(plan);
  return [...r.push(tag, s), ...r.finish()];
}
const sortRows = (rows: OutputRow[]) => [...rows].sort((a, b) => a.output.localeCompare(b.output) || a.t - b.t);

describe("switchBoundary", () => {
  it("is the end of the window holding the stream time in the old plan's longest window grid, now without windows, −∞ without data", () => {
    expect(switchBoundary(statsPlan(14), T0 + 130_000)).toBe(T0 + 330_000); // windows 30 s + k·300 s
    expect(switchBoundary(statsPlan(14), T0 + 330_000)).toBe(T0 + 630_000); // a sample on the boundary has opened the next window
    expect(switchBoundary(shapePlan(14), T0 + 130_000)).toBe(T0 + 130_000);
    expect(switchBoundary(statsPlan(14), -Infinity)).toBe(-Infinity);
  });
});

describe("Reducer switch-over", () => {
  it("finishes samples before the boundary with the old runners and starts the new runners at it (windowed old bundle)", () => {
    const old = statsPlan(14);
    const next = shapePlan(15);
    const s = samples(0, 900);
    const r = new Reducer(old);
    const rows = r.push(TT, part(s, 0, 131)); // stream time T0 + 130 s
    const boundary = r.adopt(next);
    expect(boundary).toBe(T0 + 330_000);
    expect(r.plan).toBe(next);
    rows.push(...r.push(TT, part(s, 131, 500)), ...r.push(TT, part(s, 500, 900)), ...r.finish());
    const cut = 330; // index of the sample at the boundary
    const before = rows.filter((x) => x.output === "avg" || x.output === "hi");
    const after = rows.filter((x) => x.output === "shape");
    expect(sortRows(before)).toEqual(sortRows(alone(statsPlan(14), TT, part(s, 0, cut))));
    expect(after).toEqual(alone(shapePlan(15), TT, part(s, cut, 900)));
    expect(Math.max(...before.map((x) => x.t))).toBeLessThan(boundary);
    expect(after[0].t).toBe(boundary);
  });

  it("switches at once when the old bundle has no windows: the next newer sample goes to the new runners", () => {
    const r = new Reducer(shapePlan(14, 0.2));
    const s = samples(0, 400);
    const rows = r.push(TT, part(s, 0, 100));
    expect(r.adopt(shapePlan(15, 2))).toBe(T0 + 99_000);
    rows.push(...r.push(TT, part(s, 100, 400)), ...r.finish());
    const expected = [...alone(shapePlan(14, 0.2), TT, part(s, 0, 100)), ...alone(shapePlan(15, 2), TT, part(s, 100, 400))];
    expect(rows).toEqual(expected);
  });

  it("keeps a tag without newer samples on its old runner until finish, and starts tags first seen later on the new plan", () => {
    const r = new Reducer(shapePlan(14));
    const s = samples(0, 200);
    const first = r.push(PT, part(s, 0, 50));
    r.push(TT, part(s, 0, 60));
    r.adopt(statsPlan(15));
    const later = r.push(TT, part(s, 60, 200));
    const fresh = r.push("PAST1/FT-900/PV", part(s, 100, 120)); // unassigned: passed through by the new plan
    const rest = r.finish();
    expect([...first, ...rest.filter((x) => x.tag === PT)]).toEqual(alone(shapePlan(14), PT, part(s, 0, 50)));
    expect([...later, ...rest].some((x) => x.tag === TT && x.output === "avg")).toBe(true);
    expect(fresh).toHaveLength(20);
    expect(fresh.every((x) => x.output === "")).toBe(true);
  });

  it("lets a newer bundle replace a switch not reached yet, at the same boundary", () => {
    const r = new Reducer(statsPlan(14));
    const s = samples(0, 600);
    r.push(TT, part(s, 0, 100));
    const b1 = r.adopt(shapePlan(15, 0.2));
    const b2 = r.adopt(shapePlan(16, 2));
    expect(b2).toBe(b1);
    const rows = [...r.push(TT, part(s, 100, 600)), ...r.finish()];
    const shapeRows = rows.filter((x) => x.output === "shape");
    expect(shapeRows).toEqual(alone(shapePlan(16, 2), TT, part(s, 330, 600)));
  });

  it("counts samples in and rows out and collects tags the bundle does not list, per report", () => {
    const r = new Reducer(shapePlan(14));
    const s = samples(0, 100);
    const out = [...r.push(TT, s), ...r.push("X/UNKNOWN/PV", part(s, 0, 10)), ...r.push("PAST1/FT-900/PV", part(s, 0, 5))];
    expect(r.takeCounters()).toEqual({ pointsIn: 115, pointsOut: out.length, unknownTags: ["X/UNKNOWN/PV"] });
    expect(r.takeCounters()).toEqual({ pointsIn: 0, pointsOut: 0, unknownTags: [] });
    r.push("X/UNKNOWN/PV", part(s, 10, 20));
    expect(r.takeCounters().unknownTags).toEqual(["X/UNKNOWN/PV"]);
  });
});
