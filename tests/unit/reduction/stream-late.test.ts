// Late, out-of-order and invalid samples at the edge (DESIGN.md "Signals"): streaming
// processors count and drop samples older than the last one processed — aggregations
// accept them while their window is open within a grace period — and never throw.
// Common practice; Sluice's rules are in stream.ts and stream-windows.ts.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  aggregate,
  changeOfState,
  createAggregateStream,
  createChangeOfStateStream,
  createCounterDeltaStream,
  createDeadbandStream,
  createExceedanceStream,
  createPassThroughStream,
  createQualityFilterStream,
  createSwingingDoorStream,
  createTimeAboveStream,
  createTransitionCountStream,
  counterDelta,
  deadband,
  exceedances,
  passThrough,
  qualityFilter,
  type Series,
  type StreamProcessor,
  swingingDoor,
  timeAbove,
  transitionCount,
  type WindowSeries,
} from "@/lib/reduction";
import { mulberry32 } from "./helpers";
import { arbitraryCuts, arbitrarySignal, chunksOf, joinChunks, picked, plain, qseries, runStream } from "./signal-helpers";

const SELECTIONS: [string, (s: Series) => Uint32Array, () => StreamProcessor][] = [
  ["swinging door", (s) => swingingDoor(s, { deviation: 0.5, gapMs: 3000 }), () => createSwingingDoorStream({ deviation: 0.5, gapMs: 3000 })],
  ["deadband", (s) => deadband(s, { deadband: 0.5, maxIntervalMs: 4000 }), () => createDeadbandStream({ deadband: 0.5, maxIntervalMs: 4000 })],
  ["change of state", (s) => changeOfState(s), () => createChangeOfStateStream()],
  ["quality filter", (s) => qualityFilter(s, { keep: "good" }), () => createQualityFilterStream({ keep: "good" })],
  ["pass-through", passThrough, createPassThroughStream],
];

/** Reorders a series: each sample arrives up to `maxDelay` ms after its time (seeded). */
function delayed(s: Series, maxDelay: number, seed: number): Series {
  const rand = mulberry32(seed);
  const order = Array.from(s.t, (t, i) => ({ i, at: t + Math.floor(rand() * (maxDelay + 1)) }));
  order.sort((a, b) => a.at - b.at || a.i - b.i);
  return {
    t: Float64Array.from(order, (o) => s.t[o.i]),
    v: Float64Array.from(order, (o) => s.v[o.i]),
    q: s.q ? Uint8Array.from(order, (o) => (s.q as Uint8Array)[o.i]) : undefined,
  };
}

/** The samples a selection stream accepts: those newer than every sample before them. */
function runningMax(s: Series): { accepted: Series; dropped: number } {
  const keep: number[] = [];
  let max = -Infinity;
  s.t.forEach((t, i) => {
    if (t > max) {
      keep.push(i);
      max = t;
    }
  });
  return { accepted: picked(s, Uint32Array.from(keep)), dropped: s.t.length - keep.length };
}

describe("selection streams drop and count late samples", () => {
  for (const [name, batch, stream] of SELECTIONS) {
    it(`${name}: the output is the batch result of the in-order samples (fast-check)`, () => {
      fc.assert(
        fc.property(arbitrarySignal({ quality: true }), fc.integer({ min: 0, max: 5000 }), fc.integer(), arbitraryCuts(), (s, delay, seed, cuts) => {
          const arrival = delayed(s, delay, seed);
          const { accepted, dropped } = runningMax(arrival);
          const p = stream();
          const out = runStream(p, chunksOf(arrival, cuts));
          expect(p.late).toBe(dropped);
          expect(plain(out)).toEqual(plain(picked(accepted, batch(accepted))));
        }),
        { seed: 20270101, numRuns: 50 },
      );
    });
  }

  it("a duplicate timestamp is late", () => {
    const p = createPassThroughStream();
    const out = joinChunks([p.push(qseries([1, 2, 2, 3], [0, 0, 9, 0])), p.finish()]);
    expect(Array.from(out.t)).toEqual([1, 2, 3]);
    expect(p.late).toBe(1);
  });
});

const WINDOWED: [string, (s: Series) => WindowSeries, (graceMs: number) => StreamProcessor][] = [
  ["mean", (s) => aggregate(s, { windowMs: 5000, fn: "mean" }), (graceMs) => createAggregateStream({ windowMs: 5000, fn: "mean", graceMs })],
  [
    "percentile",
    (s) => aggregate(s, { windowMs: 5000, fn: "percentile", percentile: 25 }),
    (graceMs) => createAggregateStream({ windowMs: 5000, fn: "percentile", percentile: 25, graceMs }),
  ],
  [
    "time-weighted mean, linear, gaps (reads the next sample)",
    (s) => aggregate(s, { windowMs: 5000, fn: "timeWeightedMean", gapMs: 3000 }),
    (graceMs) => createAggregateStream({ windowMs: 5000, fn: "timeWeightedMean", gapMs: 3000, graceMs }),
  ],
  ["exceedances", (s) => exceedances(s, { windowMs: 5000, threshold: 0.5 }), (graceMs) => createExceedanceStream({ windowMs: 5000, threshold: 0.5, graceMs })],
  [
    "time above, gaps",
    (s) => timeAbove(s, { windowMs: 5000, threshold: 0, gapMs: 3000 }),
    (graceMs) => createTimeAboveStream({ windowMs: 5000, threshold: 0, gapMs: 3000, graceMs }),
  ],
  ["transition count", (s) => transitionCount(s, { windowMs: 5000 }), (graceMs) => createTransitionCountStream({ windowMs: 5000, graceMs })],
  [
    "counter delta",
    (s) => counterDelta(s, { windowMs: 5000, rollover: 1000 }),
    (graceMs) => createCounterDeltaStream({ windowMs: 5000, rollover: 1000, graceMs }),
  ],
];

describe("aggregation streams accept late samples within the grace period", () => {
  for (const [name, batch, stream] of WINDOWED) {
    it(`${name}: samples at most graceMs late give exactly the batch result of the sorted input (fast-check)`, () => {
      fc.assert(
        fc.property(arbitrarySignal({ quality: true }), fc.integer({ min: 0, max: 12_000 }), fc.integer(), arbitraryCuts(), (s, grace, seed, cuts) => {
          const p = stream(grace);
          const out = runStream(p, chunksOf(delayed(s, grace, seed), cuts));
          expect(p.late).toBe(0);
          expect(plain(out)).toEqual(plain(batch(s)));
        }),
        { seed: 20270102, numRuns: 50 },
      );
    });
  }

  it("with no grace, a late sample joins the window still open and is dropped from a sealed one", () => {
    const p = createAggregateStream({ windowMs: 10, fn: "count" });
    expect(p.push(qseries([1, 5], [0, 0])).t.length).toBe(0);
    const first = p.push(qseries([12, 3, 11, 12], [0, 0, 0, 0])); // 3: [0, 10) is sealed; 11 joins [10, 20); 12 is a duplicate
    expect(plain(first)).toEqual({ t: [0], v: [2], q: [0], goodShare: [1] });
    expect(p.late).toBe(2);
    expect(plain(p.finish())).toEqual({ t: [10], v: [2], q: [0], goodShare: [1] });
  });

  it("with a grace period the window waits: a sample 4 ms late still counts", () => {
    const p = createAggregateStream({ windowMs: 10, fn: "count", graceMs: 5 });
    expect(p.push(qseries([1, 5, 12], [0, 0, 0])).t.length).toBe(0); // [0, 10) open until 15
    expect(p.push(qseries([8], [0])).t.length).toBe(0);
    expect(plain(p.push(qseries([15], [0])))).toEqual({ t: [0], v: [3], q: [0], goodShare: [1] });
    expect(p.late).toBe(0);
  });

  it("a window is emitted as soon as the stream reaches its end; one that reads the next sample waits for that sample's window", () => {
    const count = createAggregateStream({ windowMs: 10, fn: "count" });
    count.push(qseries([1, 5], [0, 0]));
    expect(Array.from(count.push(qseries([10], [0])).t)).toEqual([0]);
    const linear = createAggregateStream({ windowMs: 10, fn: "timeWeightedMean" });
    linear.push(qseries([1, 5], [0, 0]));
    expect(linear.push(qseries([12], [0])).t.length).toBe(0);
    expect(Array.from(linear.push(qseries([20], [0])).t)).toEqual([0]);
  });
});

describe("streams never throw on data", () => {
  const garbage = fc.array(
    fc.tuple(
      fc.oneof(fc.integer({ min: 0, max: 50 }), fc.constantFrom(Number.NaN, Number.POSITIVE_INFINITY, 1e300, -9e15)),
      fc.oneof(fc.double(), fc.constantFrom(Number.NaN)),
      fc.integer({ min: 0, max: 5 }),
    ),
    { maxLength: 60 },
  );
  const processors: [string, () => StreamProcessor][] = [
    ...SELECTIONS.map(([name, , stream]): [string, () => StreamProcessor] => [name, stream]),
    ...WINDOWED.map(([name, , stream]): [string, () => StreamProcessor] => [name, () => stream(3)]),
  ];

  it("late, duplicate, non-finite and bad-quality-code samples are counted, and the output stays ascending", () => {
    fc.assert(
      fc.property(garbage, arbitraryCuts(), (rows, cuts) => {
        const s = qseries(
          rows.map((r) => r[0]),
          rows.map((r) => r[1]),
          rows.map((r) => r[2]),
        );
        for (const [, create] of processors) {
          const p = create();
          const out = runStream(p, chunksOf(s, cuts));
          for (let k = 1; k < out.t.length; k++) expect(out.t[k]).toBeGreaterThan(out.t[k - 1]);
          // Invalid: a time outside the ECMAScript Date range (±8.64e15 ms), a quality code above 2, a non-finite value unless bad.
          const invalid = rows.filter(([t, v, q]) => !(Math.abs(t) <= 8.64e15) || q > 2 || (q !== 2 && !Number.isFinite(v))).length;
          expect(p.invalid).toBe(invalid);
        }
      }),
      { seed: 20270103, numRuns: 100 },
    );
  });

  it("a window shorter than the precision of its times drops its samples instead of looping", { timeout: 5_000 }, () => {
    // Near 8.6e15 ms consecutive doubles are 1 ms apart: x + 0.25 rounds to x, so the window [x, x + 0.25) is empty.
    const p = createAggregateStream({ windowMs: 0.25, fn: "mean" });
    const out = runStream(p, [qseries([8.6e15, 8.6e15 + 1, 8.6e15 + 2], [1, 2, 3])]);
    expect(out.t.length).toBe(0);
    expect(p.invalid).toBe(3);
  });

  it("misuse throws: a push after finish, a chunk of mismatched arrays", () => {
    const p = createPassThroughStream();
    expect(() => p.push({ t: new Float64Array(2), v: new Float64Array(1) })).toThrow(TypeError);
    p.finish();
    expect(() => p.push(qseries([1], [1]))).toThrow(/after finish/);
  });
});
