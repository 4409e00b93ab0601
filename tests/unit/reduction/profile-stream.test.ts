// The streaming runner (DESIGN.md "Signals": the gateway agent sees an endless,
// sometimes late stream): for any split of the input into chunks its outputs equal
// runProfile's (fast-check, random signals with quality and gaps).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createProfileStream, type Profile, ProfileError, type ProfileTag, runProfile, type Series, type StreamChunk } from "@/lib/reduction";
import { SHAPE, STATISTICS, TT101 } from "./profile-fixtures";
import { arbitraryCuts, arbitrarySignal, chunksOf, joinChunks, plain } from "./signal-helpers";

const MIXED: Profile = {
  name: "mixed chains",
  kinds: ["analog"],
  outputs: [
    { name: "p90", steps: [{ method: "aggregate", fn: "percentile", percentile: 90, window: 4, offset: 1 }] },
    { name: "twa", steps: [{ method: "aggregate", fn: "timeWeightedMean", window: 5 }, { method: "quality-filter", keep: "good" }, { method: "deadband", deadband: { value: 0.2, unit: "degC" } }] },
    { name: "above", steps: [{ method: "time-above", window: 6, threshold: { percent: 1 } }] },
    { name: "events", steps: [{ method: "exceedance-events", window: 6, threshold: { value: 0.5, unit: "degC" }, limit: 0, hysteresis: { value: 1, unit: "degC" } }] },
    { name: "cos", steps: [{ method: "change-of-state" }] },
    { name: "none", steps: [{ method: "aggregate", fn: "max", window: 5 }, { method: "drop" }] },
  ],
};
const COUNTER: Profile = {
  name: "counter",
  kinds: ["counter"],
  outputs: [
    { name: "delta", steps: [{ method: "quality-filter", keep: "good-and-uncertain" }, { method: "counter-delta", window: 7, rollover: 1000 }] },
    { name: "rate", steps: [{ method: "counter-rate", window: 7, rollover: 1000, "reset-share": 0.3 }] },
  ],
};
const DISCRETE: Profile = {
  name: "states",
  kinds: ["discrete"],
  outputs: [
    { name: "cos", steps: [{ method: "change-of-state" }] },
    { name: "moves", steps: [{ method: "transition-count", window: 10 }] },
    { name: "open", steps: [{ method: "time-in-state", window: 10, state: 1 }] },
  ],
};

const counterTag: ProfileTag = { name: "PAST1/FQ-301/TOT", kind: "counter", unit: "m3", euLow: null, euHigh: null, samplePeriodMs: 1000 };
const valveTag: ProfileTag = { name: "PAST1/XV-201/ST", kind: "discrete", unit: "state", euLow: null, euHigh: null, samplePeriodMs: 1000 };

function batchOutputs(s: Series, profile: Profile, tag: ProfileTag) {
  const run = runProfile(s, profile, tag);
  return Object.fromEntries(Object.entries(run).map(([name, o]) => [name, plain({ ...o.series, goodShare: o.goodShare })]));
}

function streamOutputs(s: Series, profile: Profile, tag: ProfileTag, cuts: number[]) {
  const stream = createProfileStream(profile, tag);
  const parts: Record<string, StreamChunk>[] = [...chunksOf(s, cuts).map((c) => stream.push(c)), stream.finish()];
  return Object.fromEntries(profile.outputs.map(({ name }) => [name, plain(joinChunks(parts.map((p) => p[name])))]));
}

describe("createProfileStream equals runProfile for random chunkings (fast-check)", () => {
  const cases: [string, Profile, ProfileTag, "doubles" | "states" | "counter"][] = [
    ["statistics", STATISTICS, TT101, "doubles"],
    ["shape", SHAPE, TT101, "doubles"],
    ["mixed chains", MIXED, TT101, "states"],
    ["counter", COUNTER, counterTag, "counter"],
    ["discrete", DISCRETE, valveTag, "states"],
  ];
  for (const [name, profile, tag, values] of cases) {
    it(name, () => {
      fc.assert(
        fc.property(arbitrarySignal({ quality: true, values }), arbitraryCuts(), (s, cuts) => {
          expect(streamOutputs(s, profile, tag, cuts)).toEqual(batchOutputs(s, profile, tag));
        }),
        { seed: 20270110, numRuns: 40 },
      );
    });
  }

  it("counts late samples per step and never throws on them", () => {
    const stream = createProfileStream(SHAPE, TT101);
    stream.push({ t: Float64Array.from([1000, 2000, 1500, 2000, 3000]), v: Float64Array.from([1, 2, 3, 4, 5]) });
    stream.finish();
    expect(stream.counters()).toEqual([
      { output: "shape", step: 0, method: "quality-filter", late: 2, invalid: 0 },
      { output: "shape", step: 1, method: "swinging-door", late: 0, invalid: 0 },
    ]);
  });

  it("refuses batch-only steps with a clear error", () => {
    const visual: Profile = { name: "chart", kinds: ["analog"], outputs: [{ name: "chart", steps: [{ method: "lttb", points: 100 }] }] };
    let error: unknown;
    try {
      createProfileStream(visual, TT101);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ProfileError);
    expect(error).toMatchObject({ output: "chart", step: 0, method: "lttb" });
    expect((error as Error).message).toMatch(/lttb is batch-only/);
  });
});
