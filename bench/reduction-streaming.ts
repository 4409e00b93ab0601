/**
 * Streaming throughput of every processor, fed in 4,096-sample chunks, against its batch
 * form on the same series (timed round-robin in pairs), and the Gorilla byte model's
 * speed. Rows for bench/index.ts.
 */
import {
  AGGREGATE_FNS,
  aggregate,
  changeOfState,
  counterDelta,
  counterRate,
  createAggregateStream,
  createChangeOfStateStream,
  createCounterDeltaStream,
  createCounterRateStream,
  createDeadbandStream,
  createExceedanceEventStream,
  createExceedanceStream,
  createPassThroughStream,
  createQualityFilterStream,
  createSwingingDoorStream,
  createTimeAboveStream,
  createTimeInStateStream,
  createTransitionCountStream,
  deadband,
  encodedBits,
  exceedanceEvents,
  exceedances,
  passThrough,
  qualityFilter,
  type Series,
  type StreamProcessor,
  swingingDoor,
  timeAbove,
  timeInState,
  transitionCount,
} from "@/lib/reduction";
import { roundRobin } from "./timing";

export const CHUNK = 4096;

type Pair = { name: string; params: string; input: Series; batch: () => unknown; stream: () => StreamProcessor };

/** The series as 4,096-sample chunks (subarrays: no copy, not timed). */
function chunks(s: Series): Series[] {
  const out: Series[] = [];
  for (let a = 0; a < s.t.length; a += CHUNK) {
    const b = Math.min(a + CHUNK, s.t.length);
    out.push({ t: s.t.subarray(a, b), v: s.v.subarray(a, b), q: s.q?.subarray(a, b) });
  }
  return out;
}

function runStream(create: () => StreamProcessor, parts: Series[]): number {
  const p = create();
  let emitted = 0;
  for (const c of parts) emitted += p.push(c).t.length;
  return emitted + p.finish().t.length;
}

/** The bench series with quality runs (1 % uncertain, 0.2 % bad), states, and a counter. */
export function variants(s: Series): { quality: Series; states: Series; counter: Series } {
  const n = s.t.length;
  const q = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const k = i % 5000;
    q[i] = k >= 4900 && k < 4950 ? 1 : k >= 4990 ? 2 : 0;
  }
  const states = s.v.map((x) => Math.round(x / 5));
  let total = 0;
  const counter = s.v.map((x) => (total = (total + Math.abs(x - 50)) % 1e6));
  return { quality: { ...s, q }, states: { t: s.t, v: states }, counter: { t: s.t, v: counter } };
}

function pairs(s: Series): Pair[] {
  const { quality, states, counter } = variants(s);
  const W = 60_000;
  const sd = { deviation: 0.62 };
  const db = { deadband: 0.55 };
  const x = { windowMs: W, threshold: 55, hysteresis: 0.5 };
  const c = { windowMs: W, rollover: 1e6 };
  const list: Pair[] = [
    { name: "swinging door", params: "deviation 0.62", input: s, batch: () => swingingDoor(s, sd), stream: () => createSwingingDoorStream(sd) },
    {
      name: "swinging door",
      params: "with quality, gaps 3 s",
      input: quality,
      batch: () => swingingDoor(quality, { ...sd, gapMs: 3000 }),
      stream: () => createSwingingDoorStream({ ...sd, gapMs: 3000 }),
    },
    { name: "deadband", params: "deadband 0.55", input: s, batch: () => deadband(s, db), stream: () => createDeadbandStream(db) },
    { name: "change of state", params: "states (v / 5 rounded)", input: states, batch: () => changeOfState(states), stream: () => createChangeOfStateStream() },
    {
      name: "quality filter",
      params: "good",
      input: quality,
      batch: () => qualityFilter(quality, { keep: "good" }),
      stream: () => createQualityFilterStream({ keep: "good" }),
    },
    { name: "pass-through", params: "", input: s, batch: () => passThrough(s), stream: createPassThroughStream },
  ];
  for (const fn of AGGREGATE_FNS) {
    const p = { windowMs: W, fn, ...(fn === "percentile" ? { percentile: 95 } : {}) };
    list.push({ name: `aggregate ${fn}`, params: "window 60 s", input: s, batch: () => aggregate(s, p), stream: () => createAggregateStream(p) });
  }
  list.push(
    {
      name: "aggregate mean",
      params: "60 s, with quality",
      input: quality,
      batch: () => aggregate(quality, { windowMs: W, fn: "mean" }),
      stream: () => createAggregateStream({ windowMs: W, fn: "mean" }),
    },
    { name: "exceedances", params: "60 s, > 55, hyst. 0.5", input: s, batch: () => exceedances(s, x), stream: () => createExceedanceStream(x) },
    {
      name: "exceedance events",
      params: "… limit 2",
      input: s,
      batch: () => exceedanceEvents(s, { ...x, limit: 2 }),
      stream: () => createExceedanceEventStream({ ...x, limit: 2 }),
    },
    {
      name: "time above",
      params: "60 s, > 55",
      input: s,
      batch: () => timeAbove(s, { windowMs: W, threshold: 55 }),
      stream: () => createTimeAboveStream({ windowMs: W, threshold: 55 }),
    },
    { name: "transition count", params: "60 s, states", input: states, batch: () => transitionCount(states, { windowMs: W }), stream: () => createTransitionCountStream({ windowMs: W }) },
    {
      name: "time in state",
      params: "60 s, state 10, states",
      input: states,
      batch: () => timeInState(states, { windowMs: W, state: 10 }),
      stream: () => createTimeInStateStream({ windowMs: W, state: 10 }),
    },
    { name: "counter delta", params: "60 s", input: counter, batch: () => counterDelta(counter, c), stream: () => createCounterDeltaStream(c) },
    { name: "counter rate", params: "60 s", input: counter, batch: () => counterRate(counter, c), stream: () => createCounterRateStream(c) },
  );
  return list;
}

/** Rows: processor, parameters, stream ms best (median), stream Msamples/s, batch ms best, stream / batch. */
export function streamingRows(s: Series, rounds: number, warmups: number): string[][] {
  const n = s.t.length;
  return pairs(s).map((p) => {
    const parts = chunks(p.input);
    const [stream, batch] = roundRobin([() => runStream(p.stream, parts), p.batch], rounds, warmups);
    return [
      p.name,
      p.params,
      `${stream.bestMs.toFixed(1)} (${stream.medianMs.toFixed(1)})`,
      (n / stream.bestMs / 1000).toFixed(1),
      `${batch.bestMs.toFixed(1)} (${batch.medianMs.toFixed(1)})`,
      `${(stream.bestMs / batch.bestMs).toFixed(2)}×`,
    ];
  });
}

/** Rows: series, samples, encodedBits ms best (median), Msamples/s, bits per sample. */
export function encodedBitsRows(s: Series, rounds: number, warmups: number): string[][] {
  const kept = swingingDoor(s, { deviation: 0.62 });
  const reduced = { t: Float64Array.from(kept, (i) => s.t[i]), v: Float64Array.from(kept, (i) => s.v[i]) };
  const cases: [string, Series][] = [
    ["raw bench series (ms timestamps)", s],
    ["its swinging door output, deviation 0.62", reduced],
  ];
  const timings = roundRobin(
    cases.map(([, series]) => () => encodedBits(series)),
    rounds,
    warmups,
  );
  return cases.map(([name, series], k) => {
    const bits = encodedBits(series);
    const m = series.t.length;
    return [name, m.toLocaleString("en"), `${timings[k].bestMs.toFixed(1)} (${timings[k].medianMs.toFixed(1)})`, (m / timings[k].bestMs / 1000).toFixed(1), (bits / m).toFixed(2)];
  });
}
