import {
  DEFAULT_GAP_FACTOR,
  METHODS,
  type Magnitude,
  type Profile,
  ProfileError,
  type ProfileTag,
  type RunContext,
  type Series,
  QUALITY_BAD,
  gapThreshold,
  resolveSteps,
  validateSeries,
} from "@/lib/reduction";
import { applyOverrides } from "@/lib/reduction/profile-resolve";
import { type StepsState, pick, profileStepEnv, runSteps, startSteps } from "@/lib/reduction/profile-run";
import { stepCall } from "@/lib/reduction/profile-steps";
import { measureGapMs, reconstructionOf } from "./run";
import { SweepMeasure } from "./sweep-measure";

/** The parameter a sweep varies: step `step` (0-based) of output `output`. */
export type SweepTarget = { output: string; step: number; parameter: string };
/** One evaluated setting; errors are NaN for an output without a reconstruction (see reconstructionOf). */
export type SweepPoint = { value: number; ratio: number; maxAbsError: number; rmse: number };
/** Find the setting that sends least within an error bound, or the most accurate one that reaches a ratio. */
export type SettingGoal = { maxError: number } | { minRatio: number };

/**
 * `points` values from `from` to `to` (both included), evenly spaced (`linear`, default)
 * or in a constant ratio (`log`, both ends > 0) — common practice for a parameter sweep.
 */
export function gridValues(from: number, to: number, points: number, scale: "linear" | "log" = "linear"): number[] {
  if (!(Number.isFinite(from) && Number.isFinite(to))) throw new RangeError(`from and to must be finite, got ${from} and ${to}`);
  if (!(Number.isInteger(points) && points >= 1)) throw new RangeError(`points must be a whole number ≥ 1, got ${points}`);
  if (scale !== "linear" && scale !== "log") throw new RangeError(`scale must be "linear" or "log", got ${String(scale)}`);
  if (scale === "log" && !(from > 0 && to > 0)) throw new RangeError(`a log grid needs from and to > 0, got ${from} and ${to}`);
  if (points === 1) return [from];
  const last = points - 1;
  return Array.from({ length: points }, (_, k) => {
    if (k === 0) return from;
    if (k === last) return to;
    return scale === "linear" ? from + ((to - from) * k) / last : from * (to / from) ** (k / last);
  });
}

/**
 * Runs one output of a profile once per value of one parameter and measures ratio and
 * reconstruction error for each (as {@link previewProfile} does, without bytes). A
 * magnitude parameter keeps its form: the value replaces the number of `{ value, unit }`
 * or `{ percent }` (an absent one is taken in the tag's unit); an integer parameter is
 * rounded. The other outputs are not run; ctx.overrides of this output apply first.
 * Runs as {@link createSweep}, once.
 */
export function sweepParameter(series: Series, profile: Profile, tag: ProfileTag, target: SweepTarget, values: number[], ctx: RunContext): SweepPoint[] {
  return createSweep(series, profile, tag, target, ctx)(values);
}

/**
 * {@link sweepParameter} as a function of the values, for evaluating one sweep's values
 * a few at a time (e.g. {@link findSetting}): checks the target now, and gives the same
 * points as sweepParameter (tests/unit/preview/sweep-fast.test.ts holds it to
 * previewProfile value by value) in less time:
 * - the steps before the swept one do not depend on the value, so they run once (at the
 *   first value) and every value runs only the swept step and those after it;
 * - a selection step that keeps every sample passes its input on without a copy;
 * - only ratio, max error and RMSE are measured (no extrema), the input validated and its
 *   usable samples and gaps counted once, with buffers kept from one value to the next;
 * - the last step's kept samples are measured where they are, not copied.
 * The input must not change while the function is in use.
 */
export function createSweep(series: Series, profile: Profile, tag: ProfileTag, target: SweepTarget, ctx: RunContext): (values: number[]) => SweepPoint[] {
  const output = profile.outputs.find((o) => o.name === target.output);
  if (output === undefined) throw new ProfileError(`the profile has no output "${target.output}"`);
  const overrides = (ctx.overrides ?? []).filter((o) => o.output === target.output);
  const single: Profile = { ...profile, outputs: [output] };
  const step = applyOverrides(single, { overrides }).outputs[0].steps[target.step];
  if (step === undefined) throw new ProfileError(`output "${target.output}" has no step ${target.step}`, { output: target.output });
  const where = { output: target.output, step: target.step, method: step.method };
  const param = METHODS[step.method].params.find((p) => p.name === target.parameter);
  if (param === undefined || param.type === "enum" || param.type === "boolean") {
    throw new ProfileError(`"${target.parameter}" is not a numeric parameter of ${step.method}`, where);
  }
  const current = (step as Record<string, unknown>)[target.parameter] as Magnitude | number | undefined;
  const form = (x: number): Magnitude | number => {
    if (param.type === "integer") return Math.round(x);
    if (param.type !== "magnitude") return x;
    if (typeof current === "object" && "percent" in current) return { percent: x };
    return { value: x, unit: typeof current === "object" ? current.unit : tag.unit };
  };
  const gapMs = measureGapMs(series, gapThreshold(tag.samplePeriodMs, ctx.gapFactor ?? DEFAULT_GAP_FACTOR));
  const env = profileStepEnv(tag, ctx);
  let reconstruction: "linear" | "step" | null | undefined;
  let before: StepsState | undefined;
  let measure: SweepMeasure | undefined;
  const evaluate = (value: number): SweepPoint => {
    const c: RunContext = { ...ctx, overrides: [...overrides, { ...target, value: form(value) }] };
    // runProfile's order: resolve (a ProfileError for this value), then validate the input.
    const steps = resolveSteps(single, tag, c).outputs[0].steps;
    reconstruction ??= reconstructionOf(steps);
    if (before === undefined) {
      validateSeries(series);
      before = runSteps(startSteps(series), steps.slice(0, target.step), env, true);
    }
    // The steps up to the last as runProfile runs them; the last one's kept indices are
    // measured where they point, without picking the samples (or composing the indices).
    const mid = runSteps(before, steps.slice(target.step, -1), env, true);
    const result = stepCall(steps[steps.length - 1], env).batch(mid.series);
    const at = result instanceof Uint32Array && mid.selectionsOnly ? result : null;
    const reduced: Series = at !== null ? mid.series : result instanceof Uint32Array ? pick(mid.series, result) : result;
    const samplesOut = at !== null ? at.length : reduced.t.length;
    const ratio = samplesOut === 0 ? Infinity : series.t.length / samplesOut;
    // measureOutput's test: a reconstruction and a usable sample sent (the kept indices
    // alone only matter for the extrema, not measured here).
    if (reconstruction === null || !hasUsable(reduced, at)) return { value, ratio, maxAbsError: Number.NaN, rmse: Number.NaN };
    measure ??= new SweepMeasure(series, gapMs);
    // measureOutput measures the kept samples without quality when the input has none
    // (then no series here has quality: selections keep the input's).
    const [maxAbsError, rmse] = measure.errors(reduced, at, reconstruction === "linear");
    return { value, ratio, maxAbsError, rmse };
  };
  return (values) => values.map(evaluate);
}

/** Whether the series (or its samples at `at`) has a sample that is not bad. */
function hasUsable(s: Series, at: Uint32Array | null): boolean {
  const { q } = s;
  const n = at === null ? s.t.length : at.length;
  if (n === 0) return false;
  if (q === undefined) return true;
  for (let k = 0; k < n; k++) if (q[at === null ? k : at[k]] !== QUALITY_BAD) return true;
  return false;
}

/**
 * The best point for a goal, or null when none meets it (common practice):
 * - `maxError`: the highest ratio among points with maxAbsError ≤ the bound (ties: lower
 *   error, then the smaller value);
 * - `minRatio`: the lowest maxAbsError among points with ratio ≥ the target (ties: higher
 *   ratio, then the smaller value).
 * A point with a NaN error meets neither goal.
 */
export function bestPoint(points: readonly SweepPoint[], goal: SettingGoal): SweepPoint | null {
  const byError = "maxError" in goal;
  let best: SweepPoint | null = null;
  for (const p of points) {
    if (Number.isNaN(p.maxAbsError)) continue;
    if (byError ? !(p.maxAbsError <= goal.maxError) : !(p.ratio >= goal.minRatio)) continue;
    if (best === null || (byError ? betterRatio(p, best) : betterError(p, best))) best = p;
  }
  return best;
}

function betterRatio(p: SweepPoint, b: SweepPoint): boolean {
  if (p.ratio !== b.ratio) return p.ratio > b.ratio;
  if (p.maxAbsError !== b.maxAbsError) return p.maxAbsError < b.maxAbsError;
  return p.value < b.value;
}

function betterError(p: SweepPoint, b: SweepPoint): boolean {
  if (p.maxAbsError !== b.maxAbsError) return p.maxAbsError < b.maxAbsError;
  if (p.ratio !== b.ratio) return p.ratio > b.ratio;
  return p.value < b.value;
}

/**
 * "Find a setting": evaluates every grid value (never assuming error or ratio to be
 * monotone in the parameter), takes {@link bestPoint}, then refines `rounds` times
 * (default 2) with `points` (default 4) evenly spaced values strictly between the
 * current best's nearest evaluated neighbours — so every refined value lies between the
 * grid neighbours of the grid's best — and returns the best of everything evaluated
 * (never worse than the grid's best) with every evaluated point in order. Common
 * practice (a grid search with local refinement); a refinement can only find a better
 * point near the grid's best, not elsewhere.
 */
export function findSetting(
  evaluate: (value: number) => SweepPoint,
  grid: number[],
  goal: SettingGoal,
  refine: { rounds: number; points: number } = { rounds: 2, points: 4 },
): { best: SweepPoint | null; evaluated: SweepPoint[] } {
  if (!(Number.isInteger(refine.rounds) && refine.rounds >= 0 && Number.isInteger(refine.points) && refine.points >= 0)) {
    throw new RangeError(`refine rounds and points must be whole numbers ≥ 0, got ${refine.rounds} and ${refine.points}`);
  }
  const values = [...new Set(grid)].sort((a, b) => a - b);
  if (values.some((x) => !Number.isFinite(x))) throw new RangeError("grid values must be finite");
  const seen = new Map<number, SweepPoint>();
  const evaluated: SweepPoint[] = [];
  const run = (x: number) => {
    const p = evaluate(x);
    seen.set(x, p);
    evaluated.push(p);
  };
  values.forEach(run);
  let best = bestPoint(evaluated, goal);
  for (let round = 0; round < refine.rounds && best !== null; round++) {
    const at = [...seen.entries()].find(([, p]) => p === best)?.[0] as number;
    const sorted = [...seen.keys()].sort((a, b) => a - b);
    const i = sorted.indexOf(at);
    const lo = sorted[Math.max(0, i - 1)];
    const hi = sorted[Math.min(sorted.length - 1, i + 1)];
    if (!(hi > lo)) break;
    for (let k = 1; k <= refine.points; k++) {
      const x = lo + ((hi - lo) * k) / (refine.points + 1);
      if (x > lo && x < hi && !seen.has(x)) run(x);
    }
    best = bestPoint(evaluated, goal);
  }
  return { best, evaluated };
}
