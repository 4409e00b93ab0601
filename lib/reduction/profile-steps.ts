import { aggregate } from "./aggregate";
import { counterDelta, counterRate } from "./counter";
import { deadband } from "./deadband";
import { changeOfState, timeInState, transitionCount } from "./discrete";
import { exceedanceEvents, exceedances, timeAbove } from "./exceedance";
import { ltob, lttb } from "./lttb";
import { m4 } from "./m4";
import type { ResolvedStep } from "./profile";
import { drop, passThrough, qualityFilter } from "./quality";
import { rdp } from "./rdp";
import type { Series } from "./series";
import type { StreamProcessor } from "./stream";
import { createChangeOfStateStream, createDeadbandStream, createDropStream, createPassThroughStream, createQualityFilterStream, createSwingingDoorStream } from "./stream-selection";
import {
  createAggregateStream,
  createCounterDeltaStream,
  createCounterRateStream,
  createExceedanceEventStream,
  createExceedanceStream,
  createTimeAboveStream,
  createTimeInStateStream,
  createTransitionCountStream,
} from "./stream-windows";
import { swingingDoor } from "./swinging-door";
import type { WindowSeries } from "./window-kernel";

/** What a step needs besides its own parameters. */
export type StepEnv = { gapMs: number; timeZone: string | undefined; graceMs: number };

/** A resolved step as calls of the methods: seconds become ms, document keys become parameters. */
export type StepCall = {
  batch: (s: Series) => Uint32Array | WindowSeries;
  /** Undefined for the batch-only methods (LTTB, LTOB, RDP, M4). */
  stream: (() => StreamProcessor) | undefined;
};

const ms = (seconds: number | undefined) => (seconds === undefined ? undefined : seconds * 1000);

/** The method calls of a resolved step (its parameters checked by resolveSteps). */
export function stepCall(step: ResolvedStep, env: StepEnv): StepCall {
  const { gapMs, graceMs } = env;
  switch (step.method) {
    case "quality-filter":
      return { batch: (s) => qualityFilter(s, { keep: step.keep }), stream: () => createQualityFilterStream({ keep: step.keep }) };
    case "pass-through":
      return { batch: passThrough, stream: createPassThroughStream };
    case "drop":
      return { batch: drop, stream: createDropStream };
    case "deadband": {
      const p = { deadband: step.deadband, maxIntervalMs: ms(step["max-interval"]), gapMs };
      return { batch: (s) => deadband(s, p), stream: () => createDeadbandStream(p) };
    }
    case "swinging-door": {
      const p = { deviation: step.deviation, maxIntervalMs: ms(step["max-interval"]), gapMs };
      return { batch: (s) => swingingDoor(s, p), stream: () => createSwingingDoorStream(p) };
    }
    case "lttb":
      return { batch: (s) => lttb(s, { points: step.points, gapMs }), stream: undefined };
    case "ltob":
      return { batch: (s) => ltob(s, { points: step.points, gapMs }), stream: undefined };
    case "rdp":
      return { batch: (s) => rdp(s, { epsilon: step.epsilon, distance: step.distance, gapMs }), stream: undefined };
    case "m4":
      return { batch: (s) => m4(s, { windowMs: step.window * 1000, offsetMs: ms(step.offset), gapMs }), stream: undefined };
    case "aggregate": {
      const p = {
        fn: step.fn,
        windowMs: step.window * 1000,
        offsetMs: ms(step.offset),
        timeZone: step.calendar ? env.timeZone : undefined,
        percentile: step.percentile,
        interpolation: step.interpolation,
        includeUncertain: step["include-uncertain"],
        gapMs,
        graceMs,
      };
      return { batch: (s) => aggregate(s, p), stream: () => createAggregateStream(p) };
    }
    case "exceedance-count": {
      const p = { ...window(step), threshold: step.threshold, direction: step.direction, hysteresis: step.hysteresis, gapMs, graceMs };
      return { batch: (s) => exceedances(s, p), stream: () => createExceedanceStream(p) };
    }
    case "exceedance-events": {
      const p = { ...window(step), threshold: step.threshold, limit: step.limit, direction: step.direction, hysteresis: step.hysteresis, gapMs, graceMs };
      return { batch: (s) => exceedanceEvents(s, p), stream: () => createExceedanceEventStream(p) };
    }
    case "time-above": {
      const p = { ...window(step), threshold: step.threshold, gapMs, graceMs };
      return { batch: (s) => timeAbove(s, p), stream: () => createTimeAboveStream(p) };
    }
    case "change-of-state":
      return { batch: (s) => changeOfState(s, { gapMs }), stream: () => createChangeOfStateStream({ gapMs }) };
    case "transition-count": {
      const p = { ...window(step), gapMs, graceMs };
      return { batch: (s) => transitionCount(s, p), stream: () => createTransitionCountStream(p) };
    }
    case "time-in-state": {
      const p = { ...window(step), state: step.state, gapMs, graceMs };
      return { batch: (s) => timeInState(s, p), stream: () => createTimeInStateStream(p) };
    }
    case "counter-delta":
    case "counter-rate": {
      const p = { ...window(step), rollover: step.rollover, resetShare: step["reset-share"], gapMs, graceMs };
      if (step.method === "counter-delta") return { batch: (s) => counterDelta(s, p), stream: () => createCounterDeltaStream(p) };
      return { batch: (s) => counterRate(s, p), stream: () => createCounterRateStream(p) };
    }
  }
}

function window(step: { window: number; offset?: number }): { windowMs: number; offsetMs: number | undefined } {
  return { windowMs: step.window * 1000, offsetMs: ms(step.offset) };
}
