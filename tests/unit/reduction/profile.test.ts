// The profile runner (DESIGN.md "Reduction profile", "Bundle"): named outputs, each an
// ordered chain of steps; percent parameters resolved against the tag's engineering
// range (OPC UA Part 8 percent deadband: percent × (high − low)); absolute ones converted
// to the tag's unit; steps refused where they do not suit the tag's kind ("Signals").
import { describe, expect, it } from "vitest";
import { type Profile, ProfileError, type ProfileTag, resolveSteps, runProfile, type RunContext } from "@/lib/reduction";
import { FIXTURE, SHAPE, STATISTICS, T0, TT101 } from "./profile-fixtures";
import { plain } from "./signal-helpers";

/** °F ↔ °C by the definition °F = °C × 9/5 + 32 (NIST SP 811, appendix B); the app passes a units library. */
const convert: RunContext["convert"] = (value, from, to) => {
  if (from === to) return value;
  if (from === "degF" && to === "degC") return ((value - 32) * 5) / 9;
  if (from === "degC" && to === "degF") return (value * 9) / 5 + 32;
  throw new Error(`cannot convert ${from} to ${to}`);
};

function errorOf(run: () => unknown): ProfileError {
  try {
    run();
  } catch (e) {
    if (e instanceof ProfileError) return e;
    throw e;
  }
  throw new Error("no ProfileError thrown");
}

describe("runProfile — a three-output statistics profile, exact outputs", () => {
  const run = runProfile(FIXTURE, STATISTICS, TT101);

  it("avg: means of the good samples per 5 s: 83/4, 102/4, 30.5", () => {
    // [0, 5 s): 20 21 22 20 (23 is uncertain); [5, 10 s): 25 27 26 24 (99 is bad); [10, 15 s): 30 31.
    expect(plain({ ...run.avg.series, goodShare: run.avg.goodShare })).toEqual({
      t: [T0, T0 + 5000, T0 + 10_000],
      v: [20.75, 25.5, 30.5],
      q: [1, 1, 0],
      goodShare: [0.8, 0.8, 1],
    });
    expect(run.avg.kept).toBeUndefined();
  });

  it("lo: 20, 24, 30; hi with uncertain samples: 23, 27, 31", () => {
    expect(Array.from(run.lo.series.v)).toEqual([20, 24, 30]);
    expect(Array.from(run.hi.series.v)).toEqual([23, 27, 31]);
    expect(Object.keys(run)).toEqual(["avg", "lo", "hi"]);
  });
});

describe("runProfile — a two-step shape profile, exact outputs", () => {
  it("quality filter, then swinging door with 2 % of 0–150 degC = 3 degC → samples at 0, 4, 6, 9 and 11 s", () => {
    // After the filter: t 0 1 3 4 5 6 8 9 10 11, v 20 21 22 20 25 27 26 24 30 31. Swinging door, deviation 3
    // (DESIGN.md formulation), corridors worked by hand:
    // anchor 0 s; 1 s → [−2, 4]; 3 s slope 2/3 in → [−1/3, 5/3]; 4 s slope 0 in → [−1/3, 3/4];
    // 5 s slope 1 > 3/4 → keep 4 s; 6 s slope 3.5 in [2, 8] → [2, 5]; 8 s slope 1.5 < 2 → keep 6 s;
    // 9 s slope −1 in [−2, 1] → [−2, 0]; 10 s slope 3/4 > 0 → keep 9 s; 11 s slope 3.5 in [3, 9]; keep the last.
    const run = runProfile(FIXTURE, SHAPE, TT101);
    expect(plain(run.shape.series)).toEqual({
      t: [0, 4, 6, 9, 11].map((s) => T0 + s * 1000),
      v: [20, 20, 27, 24, 31],
      q: [0, 0, 0, 0, 0],
    });
    expect(Array.from(run.shape.kept as Uint32Array)).toEqual([0, 4, 6, 9, 11]);
    expect(run.shape.goodShare).toBeUndefined();
  });

  it("an absolute deviation of 3 degC gives the same; 5.4 degF converts as a difference (3 degC)", () => {
    const absolute = (value: number, unit: string): Profile => ({
      ...SHAPE,
      outputs: [{ name: "shape", steps: [{ method: "quality-filter", keep: "good" }, { method: "swinging-door", deviation: { value, unit } }] }],
    });
    const expected = runProfile(FIXTURE, SHAPE, TT101).shape.kept;
    expect(runProfile(FIXTURE, absolute(3, "degC"), TT101).shape.kept).toEqual(expected);
    expect(runProfile(FIXTURE, absolute(5.4, "degF"), TT101, { convert }).shape.kept).toEqual(expected);
  });
});

describe("resolveSteps — the concrete parameters a bundle carries", () => {
  it("percent parameters are resolved per tag", () => {
    const narrow: ProfileTag = { ...TT101, name: "PAST1/TT-102/PV", euLow: 0, euHigh: 50 };
    expect(resolveSteps(SHAPE, TT101).outputs[0].steps[1]).toEqual({ method: "swinging-door", deviation: 3, "max-interval": 600 });
    expect(resolveSteps(SHAPE, narrow).outputs[0].steps[1]).toEqual({ method: "swinging-door", deviation: 1, "max-interval": 600 });
  });

  it("a threshold is a level: 80 % of 20–70 is 60, and 212 degF is 100 degC; a hysteresis is a width", () => {
    const alarms: Profile = {
      name: "alarms",
      kinds: ["analog"],
      outputs: [
        { name: "high", steps: [{ method: "exceedance-count", window: 60, threshold: { percent: 80 }, hysteresis: { percent: 10 } }] },
        { name: "boil", steps: [{ method: "time-above", window: 60, threshold: { value: 212, unit: "degF" } }] },
      ],
    };
    const r = resolveSteps(alarms, { ...TT101, euLow: 20, euHigh: 70 }, { convert });
    expect(r.outputs[0].steps[0]).toEqual({ method: "exceedance-count", window: 60, threshold: 60, hysteresis: 5 });
    expect(r.outputs[1].steps[0]).toEqual({ method: "time-above", window: 60, threshold: 100 });
    expect(r).toMatchObject({ profile: "alarms", tag: TT101.name, unit: "degC" });
  });

  it("overrides for a group and a tag apply in order, the later winning", () => {
    const r = resolveSteps(SHAPE, TT101, {
      overrides: [
        { output: "shape", step: 1, parameter: "deviation", value: { percent: 1 } },
        { output: "shape", step: 1, parameter: "deviation", value: { value: 0.25, unit: "degC" } },
      ],
    });
    expect(r.outputs[0].steps[1]).toMatchObject({ deviation: 0.25 });
    expect(errorOf(() => resolveSteps(SHAPE, TT101, { overrides: [{ output: "shape", step: 1, parameter: "epsilon", value: 1 }] })).message).toMatch(
      /not a parameter of swinging-door/,
    );
  });
});

describe("clear errors", () => {
  it("a step that does not suit the tag's kind: names the output, step index, method and kind", () => {
    const valve: ProfileTag = { ...TT101, name: "PAST1/XV-201/ST", kind: "discrete", unit: "state", euLow: null, euHigh: null };
    const e = errorOf(() => runProfile(FIXTURE, SHAPE, valve));
    expect(e).toMatchObject({ output: "shape", step: 1, method: "swinging-door" });
    expect(e.message).toMatch(/output "shape", step 1 \(swinging-door\): swinging-door does not suit discrete tags/);
  });

  it("a profile meant for other kinds", () => {
    const counter: ProfileTag = { ...TT101, kind: "counter" };
    const passOnly: Profile = { name: "raw", kinds: ["analog"], outputs: [{ name: "raw", steps: [{ method: "pass-through" }] }] };
    expect(errorOf(() => runProfile(FIXTURE, passOnly, counter)).message).toMatch(/meant for analog tags; tag PAST1\/TT-101\/PV is counter/);
  });

  it("a percent parameter on a tag without an engineering range", () => {
    const e = errorOf(() => runProfile(FIXTURE, SHAPE, { ...TT101, euLow: null, euHigh: null }));
    expect(e).toMatchObject({ output: "shape", step: 1, parameter: "deviation" });
    expect(e.message).toMatch(/2 % of the engineering range, but tag PAST1\/TT-101\/PV has no engineering range/);
  });

  it("an absolute parameter in another unit without a conversion, and a unit that does not convert", () => {
    const inKelvin: Profile = { ...SHAPE, outputs: [{ name: "shape", steps: [{ method: "deadband", deadband: { value: 1, unit: "K" } }] }] };
    expect(errorOf(() => resolveSteps(inKelvin, TT101)).message).toMatch(/step 0 \(deadband\), parameter "deadband": 1 K does not match .* unit degC, and no unit conversion/);
    expect(errorOf(() => resolveSteps(inKelvin, TT101, { convert })).message).toMatch(/K does not convert to degC/);
  });

  it("a calendar window without a time zone", () => {
    const daily: Profile = { name: "daily", kinds: ["analog"], outputs: [{ name: "day", steps: [{ method: "aggregate", fn: "mean", window: 86_400, calendar: true }] }] };
    expect(errorOf(() => resolveSteps(daily, TT101)).message).toMatch(/time zone/);
    expect(() => resolveSteps(daily, TT101, { timeZone: "Europe/Berlin" })).not.toThrow();
  });
});
