import type { Profile } from "@/lib/reduction/profile";

// Profile documents for the agreement tests: every method valid at least once, and
// invalid documents with one fault each at `path` (the field to fix). `semantic` marks
// faults only validateProfile sees (the JSON Schema cannot state them).

type Doc = Record<string, unknown>;
const one = (step: Doc, kinds: string[] = ["analog"]): Doc => ({ name: "Test", kinds, outputs: [{ name: "out", steps: [step] }] });
const outputs = (n: number) => Array.from({ length: n }, (_, i) => ({ name: `o${i}`, steps: [{ method: "pass-through" }] }));
const steps = (n: number) => Array.from({ length: n }, () => ({ method: "pass-through" }));
const degC = (value: number) => ({ value, unit: "degC" });
const at = (field: string) => `outputs[0].steps[0].${field}`;

export const VALID: { label: string; doc: Profile }[] = [
  { label: "swinging door in percent", doc: one({ method: "swinging-door", deviation: { percent: 1 } }) as Profile },
  {
    label: "quality filter keeping uncertain, deadband with max interval",
    doc: {
      name: "Deadband 0.2 degC",
      description: "Temperature loops.\nKeeps a sample at least every 10 minutes.",
      kinds: ["analog"],
      outputs: [{ name: "value", steps: [{ method: "quality-filter", keep: "good-and-uncertain" }, { method: "deadband", deadband: degC(0.2), "max-interval": 600 }] }],
    },
  },
  { label: "pass-through for every kind", doc: one({ method: "pass-through" }, ["analog", "discrete", "counter"]) as Profile },
  { label: "drop", doc: one({ method: "drop" }, ["counter"]) as Profile },
  { label: "deadband in percent", doc: one({ method: "deadband", deadband: { percent: 0.5 } }) as Profile },
  { label: "swinging door absolute, max interval", doc: one({ method: "swinging-door", deviation: { value: 0.05, unit: "bar" }, "max-interval": 3600 }) as Profile },
  { label: "swinging door deviation 0", doc: one({ method: "swinging-door", deviation: degC(0) }) as Profile },
  { label: "lttb", doc: one({ method: "lttb", points: 500 }) as Profile },
  { label: "ltob with two points", doc: one({ method: "ltob", points: 2 }) as Profile },
  { label: "rdp vertical by default", doc: one({ method: "rdp", epsilon: { value: 2, unit: "kPa" } }) as Profile },
  { label: "rdp perpendicular, percent", doc: one({ method: "rdp", epsilon: { percent: 100 }, distance: "perpendicular" }) as Profile },
  { label: "m4 with offset", doc: one({ method: "m4", window: 60, offset: 30 }) as Profile },
  { label: "change of state (discrete)", doc: one({ method: "change-of-state" }, ["discrete"]) as Profile },
  { label: "aggregate mean", doc: one({ method: "aggregate", fn: "mean", window: 60 }) as Profile },
  {
    label: "time-weighted mean, step interpolation, uncertain included",
    doc: one({ method: "aggregate", fn: "timeWeightedMean", window: 0.5, interpolation: "step", "include-uncertain": true }) as Profile,
  },
  { label: "95th percentile over 5 minutes", doc: one({ method: "aggregate", fn: "percentile", window: 300, percentile: 95 }) as Profile },
  { label: "percentile 0", doc: one({ method: "aggregate", fn: "percentile", window: 60, percentile: 0 }) as Profile },
  { label: "daily max on the local calendar", doc: one({ method: "aggregate", fn: "max", window: 86400, offset: 0, calendar: true }) as Profile },
  {
    label: "1-minute statistics: avg, lo, hi",
    doc: {
      name: "1-minute statistics",
      kinds: ["analog"],
      outputs: (["mean", "min", "max"] as const).map((fn, i) => ({
        name: ["avg", "lo", "hi"][i],
        steps: [{ method: "quality-filter", keep: "good" }, { method: "aggregate", fn, window: 60, calendar: false }],
      })),
    },
  },
  {
    label: "exceedance count downward, hysteresis in percent",
    doc: one({ method: "exceedance-count", window: 3600, threshold: degC(-40), direction: "below", hysteresis: { percent: 2 }, offset: -1800 }) as Profile,
  },
  { label: "exceedance events with limit 0", doc: one({ method: "exceedance-events", window: 600, threshold: { percent: 90 }, limit: 0 }) as Profile },
  {
    label: "exceedance events, all parameters",
    doc: one({ method: "exceedance-events", window: 600, threshold: degC(80), limit: 3, direction: "above", hysteresis: degC(1), offset: 0 }) as Profile,
  },
  { label: "time above", doc: one({ method: "time-above", window: 3600, threshold: { value: 6, unit: "bar" } }) as Profile },
  { label: "transition count for analog and discrete", doc: one({ method: "transition-count", window: 3600 }, ["analog", "discrete"]) as Profile },
  { label: "time in state 2", doc: one({ method: "time-in-state", window: 900, state: 2, offset: 60 }, ["discrete"]) as Profile },
  { label: "counter delta", doc: one({ method: "counter-delta", window: 900, rollover: 65536, "reset-share": 0.5 }, ["counter"]) as Profile },
  { label: "counter rate, reset share 1", doc: one({ method: "counter-rate", window: 60, rollover: 1e9, "reset-share": 1 }, ["counter", "analog"]) as Profile },
  { label: "16 outputs", doc: { name: "Many", kinds: ["analog"], outputs: outputs(16) } as Profile },
  { label: "16 steps", doc: { name: "Long", kinds: ["analog"], outputs: [{ name: "x", steps: steps(16) }] } as Profile },
  {
    label: "longest name, description and output name",
    doc: { name: "N".repeat(80), description: "d".repeat(2000), kinds: ["analog"], outputs: [{ name: `a${"-_9".repeat(10)}b`, steps: steps(1) }] } as Profile,
  },
];

export const INVALID: { label: string; doc: unknown; path: string; semantic?: boolean }[] = [
  { label: "not an object", doc: ["x"], path: "" },
  { label: "no name", doc: { kinds: ["analog"], outputs: outputs(1) }, path: "name" },
  { label: "blank name", doc: { name: "   ", kinds: ["analog"], outputs: outputs(1) }, path: "name" },
  { label: "name of 81 characters", doc: { name: "N".repeat(81), kinds: ["analog"], outputs: outputs(1) }, path: "name" },
  { label: "description of 2001 characters", doc: { name: "x", description: "d".repeat(2001), kinds: ["analog"], outputs: outputs(1) }, path: "description" },
  { label: "an unknown top-level key", doc: { name: "x", kinds: ["analog"], outputs: outputs(1), owner: "me" }, path: "owner" },
  { label: "no kinds", doc: { name: "x", kinds: [], outputs: outputs(1) }, path: "kinds" },
  { label: "a kind twice", doc: { name: "x", kinds: ["analog", "analog"], outputs: outputs(1) }, path: "kinds" },
  { label: "an unknown kind", doc: { name: "x", kinds: ["digital"], outputs: outputs(1) }, path: "kinds[0]" },
  { label: "no outputs", doc: { name: "x", kinds: ["analog"], outputs: [] }, path: "outputs" },
  { label: "17 outputs", doc: { name: "x", kinds: ["analog"], outputs: outputs(17) }, path: "outputs" },
  { label: "upper-case output name", doc: { name: "x", kinds: ["analog"], outputs: [{ name: "Avg", steps: steps(1) }] }, path: "outputs[0].name" },
  { label: "output name of 33 characters", doc: { name: "x", kinds: ["analog"], outputs: [{ name: "a".repeat(33), steps: steps(1) }] }, path: "outputs[0].name" },
  { label: "an unknown output key", doc: { name: "x", kinds: ["analog"], outputs: [{ name: "a", steps: steps(1), color: "red" }] }, path: "outputs[0].color" },
  { label: "no steps", doc: { name: "x", kinds: ["analog"], outputs: [{ name: "a", steps: [] }] }, path: "outputs[0].steps" },
  { label: "17 steps", doc: { name: "x", kinds: ["analog"], outputs: [{ name: "a", steps: steps(17) }] }, path: "outputs[0].steps" },
  { label: "an unknown method", doc: one({ method: "average" }), path: at("method") },
  { label: "a step without a method", doc: one({ window: 60 }), path: at("method") },
  { label: "quality filter keeping bad", doc: one({ method: "quality-filter", keep: "bad" }), path: at("keep") },
  { label: "pass-through with a parameter", doc: one({ method: "pass-through", window: 60 }), path: at("window") },
  { label: "drop with a parameter", doc: one({ method: "drop", keep: "good" }), path: at("keep") },
  { label: "deadband missing", doc: one({ method: "deadband" }), path: at("deadband") },
  { label: "negative deadband", doc: one({ method: "deadband", deadband: degC(-0.1) }), path: at("deadband.value") },
  { label: "max interval 0", doc: one({ method: "deadband", deadband: degC(1), "max-interval": 0 }), path: at("max-interval") },
  { label: "deviation 0 %", doc: one({ method: "swinging-door", deviation: { percent: 0 } }), path: at("deviation.percent") },
  { label: "deviation 101 %", doc: one({ method: "swinging-door", deviation: { percent: 101 } }), path: at("deviation.percent") },
  { label: "deviation without a unit", doc: one({ method: "swinging-door", deviation: { value: 1 } }), path: at("deviation") },
  { label: "deviation as a bare number", doc: one({ method: "swinging-door", deviation: 1 }), path: at("deviation") },
  { label: "deviation with an empty unit", doc: one({ method: "swinging-door", deviation: { value: 1, unit: "" } }), path: at("deviation.unit") },
  { label: "deviation with a unit of 33 characters", doc: one({ method: "swinging-door", deviation: { value: 1, unit: "u".repeat(33) } }), path: at("deviation.unit") },
  { label: "percent with a unit", doc: one({ method: "swinging-door", deviation: { percent: 1, unit: "K" } }), path: at("deviation.unit") },
  { label: "lttb with one point", doc: one({ method: "lttb", points: 1 }), path: at("points") },
  { label: "ltob with 2.5 points", doc: one({ method: "ltob", points: 2.5 }), path: at("points") },
  { label: "rdp with an unknown distance", doc: one({ method: "rdp", epsilon: degC(1), distance: "euclidean" }), path: at("distance") },
  { label: "m4 window 0", doc: one({ method: "m4", window: 0 }), path: at("window") },
  { label: "an infinite window (not JSON, but a JavaScript caller can pass it)", doc: one({ method: "m4", window: Infinity }), path: at("window") },
  { label: "an unknown aggregate", doc: one({ method: "aggregate", fn: "avg", window: 60 }), path: at("fn") },
  { label: "aggregate without a window", doc: one({ method: "aggregate", fn: "mean" }), path: at("window") },
  { label: "percentile 101", doc: one({ method: "aggregate", fn: "percentile", window: 60, percentile: 101 }), path: at("percentile") },
  { label: "calendar as text", doc: one({ method: "aggregate", fn: "mean", window: 3600, calendar: "yes" }), path: at("calendar") },
  { label: "exceedance count without threshold", doc: one({ method: "exceedance-count", window: 60 }), path: at("threshold") },
  { label: "exceedance count direction up", doc: one({ method: "exceedance-count", window: 60, threshold: degC(1), direction: "up" }), path: at("direction") },
  { label: "negative hysteresis", doc: one({ method: "exceedance-count", window: 60, threshold: degC(1), hysteresis: degC(-1) }), path: at("hysteresis.value") },
  { label: "exceedance events limit -1", doc: one({ method: "exceedance-events", window: 60, threshold: degC(1), limit: -1 }), path: at("limit") },
  { label: "time above with a bare threshold", doc: one({ method: "time-above", window: 60, threshold: 5 }), path: at("threshold") },
  { label: "transition count offset as text", doc: one({ method: "transition-count", window: 60, offset: "0" }), path: at("offset") },
  { label: "time in state without state", doc: one({ method: "time-in-state", window: 60 }, ["discrete"]), path: at("state") },
  { label: "counter delta rollover 0", doc: one({ method: "counter-delta", window: 60, rollover: 0 }, ["counter"]), path: at("rollover") },
  { label: "counter rate reset share 1.5", doc: one({ method: "counter-rate", window: 60, rollover: 100, "reset-share": 1.5 }, ["counter"]), path: at("reset-share") },
  { label: "counter delta reset share 0", doc: one({ method: "counter-delta", window: 60, rollover: 100, "reset-share": 0 }, ["counter"]), path: at("reset-share") },
  { label: "an output name used twice", doc: { name: "x", kinds: ["analog"], outputs: [...outputs(2), { name: "o0", steps: steps(1) }] }, path: "outputs[2].name", semantic: true },
  { label: "percentile with fn mean", doc: one({ method: "aggregate", fn: "mean", window: 60, percentile: 50 }), path: at("percentile"), semantic: true },
  { label: "fn percentile without percentile", doc: one({ method: "aggregate", fn: "percentile", window: 60 }), path: at("percentile"), semantic: true },
  { label: "interpolation with fn max", doc: one({ method: "aggregate", fn: "max", window: 60, interpolation: "linear" }), path: at("interpolation"), semantic: true },
  { label: "calendar window under an hour", doc: one({ method: "aggregate", fn: "mean", window: 600, calendar: true }), path: at("window"), semantic: true },
  { label: "deadband for discrete tags", doc: one({ method: "deadband", deadband: degC(1) }, ["discrete"]), path: at("method"), semantic: true },
  { label: "counter delta for a discrete kind too", doc: one({ method: "counter-delta", window: 60, rollover: 100 }, ["counter", "discrete"]), path: at("method"), semantic: true },
];
