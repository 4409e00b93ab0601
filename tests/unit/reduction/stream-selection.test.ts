// Streaming selection methods (DESIGN.md "Signals"): any split of the input into chunks
// gives exactly the batch result (fast-check over random signals with quality and gaps,
// and random chunkings). The batch forms are checked against their sources elsewhere
// (Bristol 1990 for swinging door, OPC UA Part 4 for deadband, …).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  changeOfState,
  createChangeOfStateStream,
  createDeadbandStream,
  createDropStream,
  createPassThroughStream,
  createQualityFilterStream,
  createSwingingDoorStream,
  deadband,
  drop,
  passThrough,
  qualityFilter,
  type Series,
  type StreamProcessor,
  swingingDoor,
} from "@/lib/reduction";
import { randomWalk } from "./helpers";
import { arbitraryCuts, arbitrarySignal, chunksOf, picked, plain, runStream } from "./signal-helpers";

type Case = { name: string; batch: (s: Series) => Uint32Array; stream: () => StreamProcessor };

const gapMs = 3000;
const CASES: Case[] = [
  { name: "swinging door", batch: (s) => swingingDoor(s, { deviation: 0.7 }), stream: () => createSwingingDoorStream({ deviation: 0.7 }) },
  {
    name: "swinging door, max interval and gaps",
    batch: (s) => swingingDoor(s, { deviation: 1.5, maxIntervalMs: 4000, gapMs }),
    stream: () => createSwingingDoorStream({ deviation: 1.5, maxIntervalMs: 4000, gapMs }),
  },
  { name: "swinging door, deviation 0", batch: (s) => swingingDoor(s, { deviation: 0 }), stream: () => createSwingingDoorStream({ deviation: 0 }) },
  { name: "deadband", batch: (s) => deadband(s, { deadband: 0.6 }), stream: () => createDeadbandStream({ deadband: 0.6 }) },
  {
    name: "deadband, max interval and gaps",
    batch: (s) => deadband(s, { deadband: 1, maxIntervalMs: 5000, gapMs }),
    stream: () => createDeadbandStream({ deadband: 1, maxIntervalMs: 5000, gapMs }),
  },
  { name: "change of state", batch: (s) => changeOfState(s), stream: () => createChangeOfStateStream() },
  { name: "change of state, gaps", batch: (s) => changeOfState(s, { gapMs }), stream: () => createChangeOfStateStream({ gapMs }) },
  { name: "quality filter good", batch: (s) => qualityFilter(s, { keep: "good" }), stream: () => createQualityFilterStream({ keep: "good" }) },
  {
    name: "quality filter good and uncertain",
    batch: (s) => qualityFilter(s, { keep: "good-and-uncertain" }),
    stream: () => createQualityFilterStream({ keep: "good-and-uncertain" }),
  },
  { name: "pass-through", batch: passThrough, stream: createPassThroughStream },
  { name: "drop", batch: drop, stream: createDropStream },
];

describe("streaming selection equals batch for random chunkings (fast-check)", () => {
  for (const c of CASES) {
    for (const shape of [
      { quality: true, values: "states" as const },
      { quality: false, values: "doubles" as const },
    ]) {
      it(`${c.name} — ${shape.values}${shape.quality ? ", with quality" : ""}`, () => {
        fc.assert(
          fc.property(arbitrarySignal(shape), arbitraryCuts(), (s, cuts) => {
            const p = c.stream();
            const out = runStream(p, chunksOf(s, cuts));
            expect(plain(out)).toEqual(plain(picked(s, c.batch(s))));
            expect(p.late + p.invalid).toBe(0);
          }),
          { seed: 20261230, numRuns: 60 },
        );
      });
    }
  }

  it("swinging door on 20,000 samples pushed one by one and in 4,096-sample chunks", () => {
    const s = randomWalk(20_000, 51);
    const expected = plain(picked(s, swingingDoor(s, { deviation: 0.2 })));
    const ones = Array.from({ length: 20_000 }, (_, i) => i / 20_000);
    expect(plain(runStream(createSwingingDoorStream({ deviation: 0.2 }), chunksOf(s, ones)))).toEqual(expected);
    const blocks = Array.from({ length: 4 }, (_, k) => ((k + 1) * 4096) / 20_000);
    expect(plain(runStream(createSwingingDoorStream({ deviation: 0.2 }), chunksOf(s, blocks)))).toEqual(expected);
  });
});
