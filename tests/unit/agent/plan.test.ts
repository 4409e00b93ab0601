import { describe, expect, it } from "vitest";
import { parseBundle, type AgentBundle } from "@/lib/agent/bundle";
import { buildPlan, longestWindow, profileForTag, stepForTag, type TagRunner } from "@/lib/agent/plan";
import { digestHex } from "@/lib/bundles/digest";
import { convertUnit } from "@/lib/units";
import { type Profile, runProfile } from "@/lib/reduction/profile";
import type { Series } from "@/lib/reduction/series";
import { deadband, shape, tags } from "../bundles/fixtures";
import { bundleText, seeded } from "./fixtures";

// The adapter's oracle is lib/reduction's batch runner on the original profile and tag:
// the bundle's resolved steps run as streams must give exactly what runProfile gives.
const stats: Profile = {
  name: "1-minute statistics",
  kinds: ["analog"],
  outputs: [
    { name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 60 }] },
    { name: "hi", steps: [{ method: "quality-filter", keep: "good" }, { method: "aggregate", fn: "max", window: 300, offset: 30 }] },
  ],
};

/** A temperature-like signal at 1 s with a few bad samples, and no gaps. */
function signal(n: number, seed: number): Series {
  const r = seeded(seed);
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  const q = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = Date.UTC(2026, 11, 1, 10) + i * 1000;
    v[i] = 72 + 3 * Math.sin(i / 40) + (r() - 0.5) * 0.8;
    q[i] = i % 97 === 50 ? 2 : 0;
  }
  return { t, v, q };
}

/** Pushes the series in uneven chunks and joins what each output emitted. */
function streamed(runner: TagRunner, s: Series): Record<string, { t: number[]; v: number[] }> {
  const out: Record<string, { t: number[]; v: number[] }> = {};
  const take = (emitted: Record<string, { t: Float64Array; v: Float64Array }>) => {
    for (const [name, c] of Object.entries(emitted)) {
      out[name] ??= { t: [], v: [] };
      out[name].t.push(...c.t);
      out[name].v.push(...c.v);
    }
  };
  for (let i = 0, size = 1; i < s.t.length; i += size, size = (size * 7) % 113 || 1) {
    const j = Math.min(s.t.length, i + size);
    take(runner.push({ t: s.t.subarray(i, j), v: s.v.subarray(i, j), q: s.q!.subarray(i, j) }));
  }
  take(runner.finish());
  return out;
}

const plan = (text: string) => buildPlan(parseBundle(text), digestHex(text));
const tag = (name: string) => tags.find((t) => t.name === name)!;

describe("stepForTag / profileForTag", () => {
  it("reads per-tag maps at the tag and leaves absent optional parameters to the method", () => {
    const step = { method: "swinging-door" as const, deviation: { A: 0.2, B: 0.25 }, "max-interval": { B: 600 } };
    expect(stepForTag(step, "A")).toEqual({ method: "swinging-door", deviation: 0.2 });
    expect(stepForTag(step, "B")).toEqual({ method: "swinging-door", deviation: 0.25, "max-interval": 600 });
  });

  it("gives magnitudes as absolute values in the unit the tag runs in, other parameters as they are", () => {
    const bundle = parseBundle(bundleText());
    const p = profileForTag(bundle.groups[0], "PAST1/TT-102/PV");
    expect(p.outputs[0].steps).toEqual([
      { method: "quality-filter", keep: "good" },
      { method: "swinging-door", deviation: { value: 0.4, unit: "as-bundled" }, "max-interval": 600 },
    ]);
  });
});

describe("buildPlan", () => {
  it("streams each tag exactly as runProfile runs the original profile on the original tag (percent resolved, units converted)", () => {
    const p = plan(bundleText());
    for (const [name, profile, seed] of [
      ["PAST1/TT-101/PV", shape(0.2), 1],
      ["PAST1/TT-102/PV", shape(0.2), 2],
      ["PAST1/PT-201/PV", deadband(), 3],
    ] as const) {
      const s = signal(3000, seed);
      const batch = runProfile(s, profile, { ...tag(name), samplePeriodMs: 1000 }, { convert: convertUnit });
      const out = streamed(p.take(name)!, s);
      const output = profile.outputs[0].name;
      expect(out[output].t).toEqual([...batch[output].series.t]);
      expect(out[output].v).toEqual([...batch[output].series.v]);
      expect(out[output].t.length).toBeLessThan(s.t.length);
    }
  });

  it("cuts at the gaps the bundle gives (3 × each tag's sample period), exactly as runProfile on the original tag", () => {
    const text = bundleText();
    expect(parseBundle(text).groups.map((g) => g.gap)).toEqual([3, 1.5]);
    const gapAt = [700, 1900];
    for (const [name, profile, period, seed] of [
      ["PAST1/TT-101/PV", shape(0.2), 1000, 5],
      ["PAST1/PT-201/PV", deadband(), 500, 6],
    ] as const) {
      // The tag's own period, a 40-period outage before samples 700 and 1900, and a step of
      // 2.5 periods before sample 1300 (not a gap: at most 3 periods).
      const s = signal(3000, seed);
      for (let i = 0; i < s.t.length; i++) {
        s.t[i] = Date.UTC(2026, 11, 1, 10) + period * (i + (i >= gapAt[0] ? 40 : 0) + (i >= 1300 ? 1.5 : 0) + (i >= gapAt[1] ? 40 : 0));
      }
      const batch = runProfile(s, profile, tag(name), { convert: convertUnit });
      const output = profile.outputs[0].name;
      const out = streamed(plan(text).take(name)!, s);
      expect(out[output].t).toEqual([...batch[output].series.t]);
      expect(out[output].v).toEqual([...batch[output].series.v]);
      for (const i of gapAt) expect(out[output].t).toEqual(expect.arrayContaining([s.t[i - 1], s.t[i]]));
      // Without the key (a bundle from before it), the agent sees no gaps and keeps fewer of those samples.
      const blind = streamed(plan(text.replaceAll(/ {4}gap: [0-9.]+\n/g, "")).take(name)!, s)[output].t;
      expect(gapAt.flatMap((i) => [s.t[i - 1], s.t[i]]).every((t) => blind.includes(t))).toBe(false);
    }
  });

  it("streams windowed aggregates (with an offset) exactly as the batch runner", () => {
    const p = plan(bundleText({ profiles: new Map([[13, stats], [21, deadband()]]) }));
    const s = signal(4000, 9);
    const batch = runProfile(s, stats, tag("PAST1/TT-101/PV"));
    const out = streamed(p.take("PAST1/TT-101/PV")!, s);
    for (const name of ["avg", "hi"]) {
      expect(out[name].t).toEqual([...batch[name].series.t]);
      expect(out[name].v).toEqual([...batch[name].series.v]);
    }
    expect(out.avg.t.length).toBe(Math.ceil(4000 / 60));
  });

  it("passes unassigned tags through under the empty output name, and drops them when the handling says drop", () => {
    const text = bundleText();
    const s = signal(50, 4);
    const pass = streamed(plan(text).take("PAST1/FT-900/PV")!, s);
    expect(Object.keys(pass)).toEqual([""]);
    expect(pass[""].t).toEqual([...s.t]);
    const dropping = plan(text.replace("handling: pass-through", "handling: drop"));
    expect(dropping.take("PAST1/FT-900/PV")).toBeNull();
    expect(dropping.take("NOT/IN/BUNDLE")).toBeNull();
    expect(plan(text).take("NOT/IN/BUNDLE")).not.toBeNull();
    expect(plan(text).listed.has("NOT/IN/BUNDLE")).toBe(false);
  });

  it("throws before anything runs when a step cannot stream at the edge, naming group and tag", () => {
    const lttb: Profile = { name: "Plot", kinds: ["analog"], outputs: [{ name: "plot", steps: [{ method: "lttb", points: 100 }] }] };
    expect(() => plan(bundleText({ profiles: new Map([[13, lttb], [21, deadband()]]) }))).toThrow(/group "pasteuriser-temperatures", tag PAST1\/TT-101\/PV: .*lttb is batch-only/);
  });
});

describe("longestWindow", () => {
  it("finds the longest window over groups, outputs and per-tag maps, with its offset and calendar", () => {
    const b = parseBundle(bundleText({ profiles: new Map([[13, stats], [21, deadband()]]) }));
    expect(longestWindow(b)).toEqual({ windowMs: 300_000, offsetMs: 30_000, timeZone: undefined });
    expect(longestWindow(parseBundle(bundleText()))).toBeNull();
    const perTag: AgentBundle = {
      ...b,
      groups: [{ name: "g", regulated: false, tags: ["A", "B"], outputs: [{ name: "o", steps: [{ method: "aggregate", fn: "mean", window: { A: 60, B: 86_400 }, calendar: { B: true } }] }] }],
    };
    expect(longestWindow(perTag)).toEqual({ windowMs: 86_400_000, offsetMs: 0, timeZone: "Europe/London" });
  });
});
