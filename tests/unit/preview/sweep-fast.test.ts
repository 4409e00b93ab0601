// sweepParameter's fast path (steps before the swept one run once, no copy for a step that
// keeps every sample, errors without extrema) against the straightforward way: one
// previewProfile per value with the value as an override, on seeded random series (with
// and without quality and gaps) and several profiles. The points must be identical —
// the same numbers to the bit, not merely close.
import { describe, expect, it } from "vitest";
import { type SweepPoint, type SweepTarget, createSweep, gridValues, mulberry32, previewProfile, sweepParameter } from "@/lib/preview";
import { type Magnitude, type Profile, type ProfileTag, QUALITY_BAD, type RunContext, type Series } from "@/lib/reduction";

const TAG: ProfileTag = { name: "T/TT-1/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 100, samplePeriodMs: 1000 };

/** A random walk at about 1 s; with `quality`, runs of uncertain and bad samples (some bad ones NaN); with `gaps`, a few steps past 3 s. */
function randomSeries(seed: number, n: number, opts: { quality: boolean; gaps: boolean }): Series {
  const rand = mulberry32(seed);
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  const q = new Uint8Array(n);
  let now = Date.UTC(2026, 0, 1);
  let x = 50;
  let code = 0;
  for (let i = 0; i < n; i++) {
    now += opts.gaps && rand() < 0.005 ? 5000 + Math.floor(rand() * 60_000) : 500 + Math.floor(rand() * 1000);
    x += rand() < 0.01 ? 20 * (rand() - 0.5) : rand() - 0.5;
    if (rand() < 0.02) code = rand() < 0.6 ? 0 : rand() < 0.5 ? 1 : QUALITY_BAD;
    t[i] = now;
    q[i] = code;
    v[i] = opts.quality && code === QUALITY_BAD && rand() < 0.3 ? Number.NaN : x;
  }
  return opts.quality ? { t, v, q } : { t, v };
}

type Case = { name: string; profile: Profile; target: SweepTarget; values: number[]; form: (x: number) => Magnitude | number; ctx?: RunContext };
const degC = (x: number) => ({ value: x, unit: "degC" });
const plain = (x: number) => x;
const one = (name: string, steps: Profile["outputs"][number]["steps"]): Profile => ({
  name,
  kinds: ["analog"],
  outputs: [{ name: "other", steps: [{ method: "aggregate", fn: "mean", window: 60 }] }, { name: "out", steps }],
});
const at = (step: number, parameter: string): SweepTarget => ({ output: "out", step, parameter });

const CASES: Case[] = [
  {
    name: "quality filter → swinging door (max interval), sweep the door",
    profile: one("qf-sd", [{ method: "quality-filter", keep: "good" }, { method: "swinging-door", deviation: degC(0.3), "max-interval": 120 }]),
    target: at(1, "deviation"),
    values: [0, ...gridValues(0.05, 5, 9, "log")],
    form: degC,
  },
  {
    name: "quality filter (good and uncertain) → swinging door in percent",
    profile: one("qf-sd-pct", [{ method: "quality-filter", keep: "good-and-uncertain" }, { method: "swinging-door", deviation: { percent: 1 } }]),
    target: at(1, "deviation"),
    values: gridValues(0.01, 3, 6, "log"),
    form: (x) => ({ percent: x }),
  },
  {
    name: "swinging door alone, sweep the first step",
    profile: one("sd", [{ method: "swinging-door", deviation: degC(0.5) }]),
    target: at(0, "deviation"),
    values: gridValues(0.05, 2, 7, "log"),
    form: degC,
  },
  {
    name: "deadband (step reconstruction) → swinging door, sweep the first step",
    profile: one("db-sd", [{ method: "deadband", deadband: degC(0.2), "max-interval": 300 }, { method: "swinging-door", deviation: degC(0.4) }]),
    target: at(0, "deadband"),
    values: [0, 0.1, 0.5, 2],
    form: degC,
  },
  {
    name: "pass-through → quality filter → deadband, sweep the last step's max interval",
    profile: one("pt-qf-db", [{ method: "pass-through" }, { method: "quality-filter", keep: "good" }, { method: "deadband", deadband: degC(0.5) }]),
    target: at(2, "max-interval"),
    values: [5, 30, 600],
    form: plain,
  },
  {
    name: "quality filter → mean, sweep the window (step-hold of an aggregation)",
    profile: one("qf-mean", [{ method: "quality-filter", keep: "good" }, { method: "aggregate", fn: "mean", window: 60 }]),
    target: at(1, "window"),
    values: [5, 60, 900],
    form: plain,
  },
  {
    name: "swinging door → mean, sweep the door (a selection before an aggregation)",
    profile: one("sd-mean", [{ method: "swinging-door", deviation: degC(0.5) }, { method: "aggregate", fn: "max", window: 60 }]),
    target: at(0, "deviation"),
    values: [0, 0.3, 3],
    form: degC,
  },
  {
    name: "count: no reconstruction (NaN errors)",
    profile: one("count", [{ method: "aggregate", fn: "count", window: 60 }]),
    target: at(0, "window"),
    values: [10, 120],
    form: plain,
  },
  {
    name: "quality filter → LTTB, sweep the points (an integer, rounded)",
    profile: one("qf-lttb", [{ method: "quality-filter", keep: "good" }, { method: "lttb", points: 100 }]),
    target: at(1, "points"),
    values: [2.4, 50, 333.6, 100_000],
    form: (x) => Math.round(x),
  },
  {
    name: "RDP → M4, sweep the epsilon with an override of the M4 window",
    profile: one("rdp-m4", [{ method: "rdp", epsilon: degC(0.5) }, { method: "m4", window: 60 }]),
    target: at(0, "epsilon"),
    values: [0.1, 1, 4],
    form: degC,
    ctx: { overrides: [{ output: "out", step: 1, parameter: "window", value: 30 }] },
  },
];

/** The straightforward sweep: previewProfile of the swept output, once per value. */
function oracle(s: Series, c: Case): SweepPoint[] {
  const output = c.profile.outputs.find((o) => o.name === c.target.output)!;
  const single: Profile = { ...c.profile, outputs: [output] };
  const own = (c.ctx?.overrides ?? []).filter((o) => o.output === c.target.output);
  return c.values.map((value) => {
    const [m] = previewProfile(s, single, TAG, { ...c.ctx, overrides: [...own, { ...c.target, value: c.form(value) }] }).map((o) => o.metrics);
    return { value, ratio: m.ratio, maxAbsError: m.maxAbsError ?? Number.NaN, rmse: m.rmse ?? Number.NaN };
  });
}

const SERIES = [
  { name: "plain", opts: { quality: false, gaps: false } },
  { name: "gaps", opts: { quality: false, gaps: true } },
  { name: "quality", opts: { quality: true, gaps: false } },
  { name: "quality and gaps", opts: { quality: true, gaps: true } },
];

describe("sweepParameter's fast path equals previewProfile value by value", () => {
  for (const [k, { name, opts }] of SERIES.entries()) {
    for (const seed of [1, 2]) {
      const s = randomSeries(1000 * k + seed, 4000, opts);
      for (const c of CASES) {
        it(`${name} series (seed ${seed}): ${c.name}`, () => {
          const points = sweepParameter(s, c.profile, TAG, c.target, c.values, c.ctx ?? {});
          expect(points).toEqual(oracle(s, c));
          // toEqual takes 0 and −0 as different and NaN as NaN; check bit for bit anyway.
          points.forEach((p, i) => expect(Object.is(p.maxAbsError, oracle(s, c)[i].maxAbsError)).toBe(true));
        });
      }
    }
  }

  it("a sweep reused value by value (createSweep) gives the same points, in any order", () => {
    const s = randomSeries(7, 4000, { quality: true, gaps: true });
    const c = CASES[0];
    const want = oracle(s, c);
    const evaluate = createSweep(s, c.profile, TAG, c.target, {});
    const order = [...c.values.keys()].reverse();
    const got = new Map(order.map((i) => [i, evaluate([c.values[i]])[0]]));
    expect(c.values.map((_, i) => got.get(i))).toEqual(want);
    expect(evaluate(c.values)).toEqual(want);
  });

  it("a selection that keeps every sample leaves the input untouched", () => {
    const s = randomSeries(8, 2000, { quality: false, gaps: false });
    const copy = { t: s.t.slice(), v: s.v.slice() };
    const c = CASES[4];
    expect(sweepParameter(s, c.profile, TAG, c.target, c.values, {})).toEqual(oracle(s, c));
    expect(s).toEqual(copy);
  });

  it("a bad series or value throws as before, at the first value", () => {
    const s = randomSeries(9, 100, { quality: false, gaps: false });
    const bad = { t: s.t, v: s.v.slice() };
    bad.v[50] = Number.NaN;
    const c = CASES[2];
    expect(sweepParameter(bad, c.profile, TAG, c.target, [], {})).toEqual([]);
    expect(() => sweepParameter(bad, c.profile, TAG, c.target, [1], {})).toThrow(/v\[50\]/);
    expect(() => sweepParameter(s, c.profile, TAG, c.target, [1, -1], {})).toThrow();
  });
});
