// Streaming aggregations (DESIGN.md "Signals"): any split of the input into chunks gives
// exactly the batch result — every aggregate function (OPC UA Part 13), exceedances,
// events, time above, transitions, time in state, counter delta and rate; with quality,
// gaps and calendar windows (fast-check, random chunkings).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  AGGREGATE_FNS,
  aggregate,
  counterDelta,
  counterRate,
  createAggregateStream,
  createCounterDeltaStream,
  createCounterRateStream,
  createExceedanceEventStream,
  createExceedanceStream,
  createTimeAboveStream,
  createTimeInStateStream,
  createTransitionCountStream,
  exceedanceEvents,
  exceedances,
  type Series,
  type StreamProcessor,
  timeAbove,
  timeInState,
  transitionCount,
  type WindowSeries,
} from "@/lib/reduction";
import { arbitraryCuts, arbitrarySignal, chunksOf, plain, runStream, type SignalShape } from "./signal-helpers";

type Case = { name: string; batch: (s: Series) => WindowSeries; stream: () => StreamProcessor; shape?: SignalShape };

const gapMs = 3000;
const w = { windowMs: 4000, offsetMs: 1500 };

const aggregateCases: Case[] = AGGREGATE_FNS.flatMap((fn) => {
  const extra = fn === "percentile" ? { percentile: 90 } : {};
  const variants: object[] =
    fn === "timeWeightedMean"
      ? [{ interpolation: "step" }, { interpolation: "linear" }, { interpolation: "step", gapMs }, { interpolation: "linear", gapMs, includeUncertain: true }]
      : [{}, { includeUncertain: true }];
  return variants.map((v) => {
    const p = { ...w, fn, ...extra, ...v };
    return { name: `aggregate ${fn} ${JSON.stringify(v)}`, batch: (s: Series) => aggregate(s, p), stream: () => createAggregateStream(p) };
  });
});

const x = { ...w, threshold: 0.5, hysteresis: 1 };
const counter = { windowMs: 7000, rollover: 1000 };
const CASES: Case[] = [
  ...aggregateCases,
  { name: "exceedances", batch: (s) => exceedances(s, x), stream: () => createExceedanceStream(x) },
  { name: "exceedances below", batch: (s) => exceedances(s, { ...x, direction: "below" }), stream: () => createExceedanceStream({ ...x, direction: "below" }) },
  { name: "exceedance events", batch: (s) => exceedanceEvents(s, { ...x, limit: 0 }), stream: () => createExceedanceEventStream({ ...x, limit: 0 }) },
  { name: "time above", batch: (s) => timeAbove(s, { ...w, threshold: 0 }), stream: () => createTimeAboveStream({ ...w, threshold: 0 }) },
  {
    name: "time above, gaps",
    batch: (s) => timeAbove(s, { ...w, threshold: 0, gapMs }),
    stream: () => createTimeAboveStream({ ...w, threshold: 0, gapMs }),
  },
  { name: "transition count", batch: (s) => transitionCount(s, w), stream: () => createTransitionCountStream(w) },
  {
    name: "time in state, gaps",
    batch: (s) => timeInState(s, { ...w, state: 1, gapMs }),
    stream: () => createTimeInStateStream({ ...w, state: 1, gapMs }),
  },
  { name: "counter delta", batch: (s) => counterDelta(s, counter), stream: () => createCounterDeltaStream(counter), shape: { values: "counter" } },
  {
    name: "counter rate, reset share 0.2",
    batch: (s) => counterRate(s, { ...counter, resetShare: 0.2 }),
    stream: () => createCounterRateStream({ ...counter, resetShare: 0.2 }),
    shape: { values: "counter" },
  },
  {
    name: "calendar: daily time-weighted mean in Europe/Berlin across the spring change",
    batch: (s) => aggregate(s, { windowMs: 86_400_000, timeZone: "Europe/Berlin", fn: "timeWeightedMean" }),
    stream: () => createAggregateStream({ windowMs: 86_400_000, timeZone: "Europe/Berlin", fn: "timeWeightedMean" }),
    shape: { stepMs: 40 * 60_000, values: "doubles" },
  },
];

describe("streaming aggregations equal batch for random chunkings (fast-check)", () => {
  // Without quality the batch forms take their plain paths; a stream always carries quality.
  for (const [c, quality] of CASES.flatMap((c) => [[c, true] as const, [c, false] as const])) {
    it(`${c.name}${quality ? ", with quality" : ""}`, () => {
      const shape = { quality, ...c.shape };
      fc.assert(
        fc.property(arbitrarySignal(shape), arbitraryCuts(), (s, cuts) => {
          if (shape.stepMs) s = { ...s, t: s.t.map((t) => t + Date.UTC(2026, 2, 27) - Date.UTC(2026, 0, 1)) };
          const p = c.stream();
          expect(plain(runStream(p, chunksOf(s, cuts)))).toEqual(plain(c.batch(s)));
          expect(p.late + p.invalid).toBe(0);
        }),
        { seed: 20261231, numRuns: c.shape?.stepMs ? 25 : 40 },
      );
    });
  }
});
