import type { Profile, ProfileTag, ResolvedStep, RunContext } from "./profile";
import { resolveSteps } from "./profile-resolve";
import { type StepEnv, stepCall } from "./profile-steps";
import { type QualifiedSeries, type Series, validateSeries } from "./series";
import { DEFAULT_GAP_FACTOR, gapThreshold } from "./signal";

/** One output of a profile run. */
export type OutputRun = {
  name: string;
  /** The series the cloud receives for this output (tag name + output name). */
  series: QualifiedSeries;
  /** When every step was a selection: the kept indices into the input (to measure reconstruction error). */
  kept?: Uint32Array;
  /** When a step aggregated: the good share of the last aggregation's window behind each output sample. */
  goodShare?: Float64Array;
};

/** The outputs of a run, by output name. */
export type ProfileRun = Record<string, OutputRun>;

/**
 * Runs a reduction profile on one tag's series (DESIGN.md "Reduction profile"): every
 * output's steps in order, each on the previous step's result, with the parameters of
 * {@link resolveSteps} (percent resolved against the tag's engineering range, units
 * converted, overrides applied) and the tag's gaps (a step longer than gapFactor × its
 * sample period, default 3). Throws a {@link ProfileError} for a profile that cannot
 * run on the tag and the input's SeriesError for a bad series.
 */
export function runProfile(series: Series, profile: Profile, tag: ProfileTag, ctx: RunContext = {}): ProfileRun {
  const resolved = resolveSteps(profile, tag, ctx);
  validateSeries(series);
  const gapMs = gapThreshold(tag.samplePeriodMs, ctx.gapFactor ?? DEFAULT_GAP_FACTOR);
  const env = { gapMs, timeZone: ctx.timeZone, graceMs: 0 };
  const run: ProfileRun = {};
  for (const output of resolved.outputs) {
    let current: Series = series;
    let kept: Uint32Array | undefined;
    let goodShare: Float64Array | undefined;
    let selectionsOnly = true;
    for (const step of output.steps) {
      const result = stepCall(step, env).batch(current);
      if (result instanceof Uint32Array) {
        current = pick(current, result);
        kept = kept === undefined ? result : compose(kept, result);
        if (goodShare !== undefined) goodShare = pickShares(goodShare, result);
      } else {
        current = result;
        goodShare = result.goodShare;
        selectionsOnly = false;
      }
    }
    const out: OutputRun = { name: output.name, series: withQuality(current) };
    if (selectionsOnly) out.kept = kept;
    if (goodShare !== undefined) out.goodShare = goodShare;
    run[output.name] = out;
  }
  return run;
}

/** The samples of the kept indices. */
export function pick(s: Series, kept: Uint32Array): Series {
  const t = new Float64Array(kept.length);
  const v = new Float64Array(kept.length);
  const q = s.q === undefined ? undefined : new Uint8Array(kept.length);
  for (let k = 0; k < kept.length; k++) {
    t[k] = s.t[kept[k]];
    v[k] = s.v[kept[k]];
    if (q !== undefined) q[k] = (s.q as Uint8Array)[kept[k]];
  }
  return { t, v, q };
}

function compose(outer: Uint32Array, inner: Uint32Array): Uint32Array {
  const out = new Uint32Array(inner.length);
  for (let k = 0; k < inner.length; k++) out[k] = outer[inner[k]];
  return out;
}

function pickShares(share: Float64Array, kept: Uint32Array): Float64Array {
  const out = new Float64Array(kept.length);
  for (let k = 0; k < kept.length; k++) out[k] = share[kept[k]];
  return out;
}

function withQuality(s: Series): QualifiedSeries {
  return { t: s.t, v: s.v, q: s.q ?? new Uint8Array(s.t.length) };
}

/** Where one output's run stands after some of its steps (see {@link runSteps}). */
export type StepsState = {
  series: Series;
  /** The kept indices into the input so far; undefined before the first selection. */
  kept: Uint32Array | undefined;
  goodShare: Float64Array | undefined;
  /** False once a step has aggregated. */
  selectionsOnly: boolean;
};

/** The state before an output's first step: the input itself. */
export function startSteps(series: Series): StepsState {
  return { series, kept: undefined, goodShare: undefined, selectionsOnly: true };
}

/** The step environment runProfile gives every step: the tag's gaps at ctx.gapFactor, the context's time zone. */
export function profileStepEnv(tag: ProfileTag, ctx: RunContext = {}): StepEnv {
  return { gapMs: gapThreshold(tag.samplePeriodMs, ctx.gapFactor ?? DEFAULT_GAP_FACTOR), timeZone: ctx.timeZone, graceMs: 0 };
}

/**
 * Runs `steps` on from `state` exactly as {@link runProfile} runs an output's steps (same
 * calls, same arithmetic), so running an output's first steps once and the rest from the
 * result gives runProfile's output. The input is not validated here (runProfile
 * validates it first). With `shareWhole`, a selection step that keeps every sample
 * passes its input series (and kept indices) on as they are instead of copying them —
 * the same samples, but the result may share arrays with the input and the state.
 */
export function runSteps(state: StepsState, steps: readonly ResolvedStep[], env: StepEnv, shareWhole = false): StepsState {
  let { series: current, kept, goodShare, selectionsOnly } = state;
  for (const step of steps) {
    const result = stepCall(step, env).batch(current);
    if (result instanceof Uint32Array) {
      // Ascending indices in range, as many as samples: every sample, in order.
      if (shareWhole && result.length === current.t.length) {
        kept ??= result;
        continue;
      }
      current = pick(current, result);
      kept = kept === undefined ? result : compose(kept, result);
      if (goodShare !== undefined) goodShare = pickShares(goodShare, result);
    } else {
      current = result;
      goodShare = result.goodShare;
      selectionsOnly = false;
    }
  }
  return { series: current, kept, goodShare, selectionsOnly };
}
