/**
 * A reduction profile as a document (DESIGN.md "Reduction profile"): one or more named
 * outputs, each an ordered chain of steps. This is the shape `schemas/profile.schema.json`
 * describes and bundles carry (keys kebab-case); `window`, `offset` and `max-interval`
 * are seconds. The runner, `resolveSteps` and the streaming runner are re-exported here.
 */
import type { AggregateFn } from "./aggregate";
import type { TagKind } from "./profile-names";

export { OUTPUT_NAME_PATTERN, TAG_KINDS, type TagKind } from "./profile-names";

/** An absolute parameter in an engineering unit. */
export type Abs = { value: number; unit: string };
/** A parameter as a percent of the tag's engineering range (0 < percent ≤ 100). */
export type Pct = { percent: number };
export type Magnitude = Abs | Pct;

export type Profile = {
  name: string;
  description?: string;
  /** Signal kinds the profile is meant for. */
  kinds: TagKind[];
  /** Output names match OUTPUT_NAME_PATTERN and are unique. */
  outputs: ProfileOutput[];
};

export type ProfileOutput = { name: string; steps: Step[] };

/** The steps of a document; `M` is a magnitude (Magnitude in a profile, number once resolved for a tag). */
export type StepOf<M> =
  | { method: "quality-filter"; keep: "good" | "good-and-uncertain" }
  | { method: "pass-through" }
  | { method: "drop" }
  | { method: "deadband"; deadband: M; "max-interval"?: number }
  | { method: "swinging-door"; deviation: M; "max-interval"?: number }
  | { method: "lttb"; points: number }
  | { method: "ltob"; points: number }
  | { method: "rdp"; epsilon: M; distance?: "vertical" | "perpendicular" }
  | { method: "m4"; window: number; offset?: number }
  | {
      method: "aggregate";
      fn: AggregateFn;
      window: number;
      offset?: number;
      calendar?: boolean;
      percentile?: number;
      interpolation?: "step" | "linear";
      "include-uncertain"?: boolean;
    }
  | { method: "exceedance-count"; window: number; threshold: M; direction?: "above" | "below"; hysteresis?: M; offset?: number }
  | {
      method: "exceedance-events";
      window: number;
      threshold: M;
      limit: number;
      direction?: "above" | "below";
      hysteresis?: M;
      offset?: number;
    }
  | { method: "time-above"; window: number; threshold: M; offset?: number }
  | { method: "change-of-state" }
  | { method: "transition-count"; window: number; offset?: number }
  | { method: "time-in-state"; window: number; state: number; offset?: number }
  | { method: "counter-delta"; window: number; rollover: number; "reset-share"?: number; offset?: number }
  | { method: "counter-rate"; window: number; rollover: number; "reset-share"?: number; offset?: number };

export type Step = StepOf<Magnitude>;
/** A step with its magnitudes resolved to numbers in the tag's engineering unit (what a bundle carries). */
export type ResolvedStep = StepOf<number>;
export type StepMethod = Step["method"];

/** The tag a profile runs on (DESIGN.md "Tag"). */
export type ProfileTag = {
  name: string;
  kind: TagKind;
  unit: string;
  euLow: number | null;
  euHigh: number | null;
  samplePeriodMs: number;
};

/** One parameter override of an assignment (group or single tag); later entries win. */
export type ParameterOverride = {
  output: string;
  /** Index of the step in the output (0-based). */
  step: number;
  parameter: string;
  value: Magnitude | number | string | boolean;
};

export type RunContext = {
  /** The site's IANA time zone, for steps with `calendar: true`. */
  timeZone?: string;
  /** Converts a value between engineering units (the app passes a units library). */
  convert?: (value: number, from: string, to: string) => number;
  /** A step longer than gapFactor × the tag's sample period is a gap (default 3). */
  gapFactor?: number;
  overrides?: readonly ParameterOverride[];
};

export type ResolvedProfile = {
  profile: string;
  tag: string;
  /** The engineering unit every resolved magnitude is in. */
  unit: string;
  outputs: { name: string; steps: ResolvedStep[] }[];
};

export { ProfileError } from "./profile-error";
export { METHODS, type MethodInfo, type ParamInfo } from "./methods";
export { resolveSteps } from "./profile-resolve";
export { validateProfile } from "./profile-validate";
export { runProfile, type OutputRun, type ProfileRun } from "./profile-run";
export { createProfileStream, type ProfileStream, type StreamCounter } from "./profile-stream";
