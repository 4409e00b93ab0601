import type { Profile, ProfileTag, RunContext } from "./profile";
import { resolveSteps } from "./profile-resolve";
import { stepCall } from "./profile-steps";
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
