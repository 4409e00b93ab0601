import {
  DEFAULT_GAP_FACTOR,
  METHODS,
  type Profile,
  type ProfileTag,
  QUALITY_BAD,
  type ResolvedStep,
  type RunContext,
  type Series,
  encodedBits,
  gapThreshold,
  measure,
  resolveSteps,
  runProfile,
} from "@/lib/reduction";

/**
 * The plain byte model of DESIGN.md ("Metrics"): bytes per sample for timestamp, value
 * and framing (a per-site setting) plus a share of transport overhead (0.1 = 10 %).
 */
export type ByteModel = { bytesPerSample: number; transportOverhead: number };

/** Sluice's stated default when a site sets none: 8-byte timestamp + 8-byte double, 10 % transport overhead. */
export const DEFAULT_BYTE_MODEL: ByteModel = { bytesPerSample: 16, transportOverhead: 0.1 };

export type OutputMetrics = {
  samplesIn: number;
  samplesOut: number;
  /** samplesIn / samplesOut (Infinity when nothing is sent). */
  ratio: number;
  /** Null where no reconstruction applies (see {@link previewProfile}). */
  maxAbsError: number | null;
  rmse: number | null;
  extremaKeptShare: number | null;
  /** samplesOut × bytesPerSample × (1 + transportOverhead). */
  bytesPlain: number;
  /** ceil(encodedBits(reduced) / 8): Gorilla (Pelkonen et al. 2015) at 1 ms resolution. */
  bytesCompressed: number;
};

export type OutputPreview = {
  name: string;
  reduced: Series;
  /** Kept indices into the input when every step selects; null otherwise. */
  kept: Uint32Array | null;
  metrics: OutputMetrics;
  reconstruction: "linear" | "step" | null;
};

/** Aggregates whose value is a level of the signal itself, so it can stand in for the raw samples of its window. */
const LEVEL_FNS: ReadonlySet<string> = new Set(["mean", "timeWeightedMean", "min", "max", "first", "last", "median", "mode", "percentile"]);

/**
 * How an output's reduced series is reconstructed to measure its error against the input
 * (DESIGN.md "Metrics"): with selection steps only, the reconstruction in {@link METHODS}
 * of the last step that has one (linear for shape methods, step-hold for deadband and
 * change-of-state; none for pass-through, quality filter and drop alone, whose kept
 * samples are unchanged). With an aggregation whose values are levels of the signal
 * (mean, time-weighted mean, min, max, first, last, median, mode, percentile): step-hold
 * from each window's start stamp over the raw samples — a measure of how far the raw
 * signal strays from the value sent for its window, not a reconstruction the cloud would
 * make. With any other aggregation (range, sum, count, standard deviations, exceedances,
 * time above or in state, transitions, counter delta and rate): none.
 */
export function reconstructionOf(steps: readonly ResolvedStep[]): "linear" | "step" | null {
  const aggregations = steps.filter((s) => METHODS[s.method].role === "aggregation");
  if (aggregations.length > 0) return aggregations.every((s) => s.method === "aggregate" && LEVEL_FNS.has(s.fn)) ? "step" : null;
  for (let k = steps.length - 1; k >= 0; k--) {
    const r = METHODS[steps[k].method].reconstruction;
    if (r !== null) return r;
  }
  return null;
}

/**
 * The gap threshold to give measure() for a series: undefined when the series has no
 * quality and no step longer than gapMs, so measure takes its plain loops — the same
 * arithmetic (lib/reduction/README.md), hence the same metrics, in less time.
 */
export function measureGapMs(series: Series, gapMs: number): number | undefined {
  return series.q === undefined && !hasGap(series.t, gapMs) ? undefined : gapMs;
}

function hasGap(t: Float64Array, gapMs: number): boolean {
  for (let i = 1; i < t.length; i++) if (t[i] - t[i - 1] > gapMs) return true;
  return false;
}

/** Errors and ratio of one output (gapMs as from {@link measureGapMs}); bytes are 0 unless a byte model is given. */
export function measureOutput(
  series: Series,
  reduced: Series,
  kept: Uint32Array | null,
  reconstruction: "linear" | "step" | null,
  gapMs: number | undefined,
  byteModel: ByteModel | null,
): OutputMetrics {
  const samplesIn = series.t.length;
  const samplesOut = reduced.t.length;
  let maxAbsError: number | null = null;
  let rmse: number | null = null;
  let extremaKeptShare: number | null = null;
  const measurable = kept !== null || reconstruction !== null;
  if (measurable && hasUsable(reduced)) {
    // The kept samples as a series (runProfile picked them) rather than the indices: the
    // same metrics, without measure() copying them again. Quality only if the input had it.
    const r = kept !== null && series.q === undefined ? { t: reduced.t, v: reduced.v } : reduced;
    const m = measure(series, r, { reconstruction: reconstruction ?? "step", gapMs });
    extremaKeptShare = m.extremaKeptShare;
    if (reconstruction !== null) {
      maxAbsError = m.maxAbsError;
      rmse = m.rmse;
    }
  }
  return {
    samplesIn,
    samplesOut,
    ratio: samplesOut === 0 ? Infinity : samplesIn / samplesOut,
    maxAbsError,
    rmse,
    extremaKeptShare,
    bytesPlain: byteModel === null ? 0 : samplesOut * byteModel.bytesPerSample * (1 + byteModel.transportOverhead),
    bytesCompressed: byteModel === null ? 0 : Math.ceil(encodedBits(onMsTicks(reduced)) / 8),
  };
}

function hasUsable(s: Series): boolean {
  if (s.t.length === 0) return false;
  if (s.q === undefined) return true;
  for (let i = 0; i < s.q.length; i++) if (s.q[i] !== QUALITY_BAD) return true;
  return false;
}

/**
 * The series as Gorilla stores it at 1 ms resolution: times finer than a millisecond
 * (fractional epoch ms from a CSV) rounded, a time that rounding would not move past the
 * previous one set 1 ms after it. The series itself when every time is a whole ms.
 */
function onMsTicks(s: Series): Series {
  const { t } = s;
  let whole = true;
  for (let i = 0; i < t.length && whole; i++) whole = Math.floor(t[i]) === t[i];
  if (whole) return s;
  const r = new Float64Array(t.length);
  for (let i = 0; i < t.length; i++) r[i] = i > 0 ? Math.max(Math.round(t[i]), r[i - 1] + 1) : Math.round(t[i]);
  return { t: r, v: s.v };
}

function checkByteModel(b: ByteModel): ByteModel {
  if (!(Number.isFinite(b.bytesPerSample) && b.bytesPerSample > 0)) throw new RangeError(`bytesPerSample must be > 0, got ${b.bytesPerSample}`);
  if (!(Number.isFinite(b.transportOverhead) && b.transportOverhead >= 0)) {
    throw new RangeError(`transportOverhead must be ≥ 0 (0.1 = 10 %), got ${b.transportOverhead}`);
  }
  return b;
}

/**
 * Runs every output of a profile on sample data ({@link runProfile}: overrides, percent
 * and unit resolution, the tag's gaps at ctx.gapFactor × its sample period) and measures
 * each one — DESIGN.md "Metrics": samples in and out, ratio, max absolute error and RMSE
 * with {@link measure} under the reconstruction of {@link reconstructionOf} (nothing
 * interpolated across a gap, bad samples not measured), share of local extrema kept,
 * plain bytes (`byteModel`, default {@link DEFAULT_BYTE_MODEL}) and compressed bytes
 * (Gorilla, `encodedBits`). Errors are null without a reconstruction or when nothing
 * usable is sent. Throws runProfile's ProfileError or SeriesError.
 */
export function previewProfile(series: Series, profile: Profile, tag: ProfileTag, ctx: RunContext & { byteModel?: ByteModel }): OutputPreview[] {
  const byteModel = checkByteModel(ctx.byteModel ?? DEFAULT_BYTE_MODEL);
  const resolved = resolveSteps(profile, tag, ctx);
  const run = runProfile(series, profile, tag, ctx);
  const gapMs = measureGapMs(series, gapThreshold(tag.samplePeriodMs, ctx.gapFactor ?? DEFAULT_GAP_FACTOR));
  return resolved.outputs.map(({ name, steps }) => {
    const out = run[name];
    const kept = out.kept ?? null;
    const reconstruction = reconstructionOf(steps);
    return { name, reduced: out.series, kept, reconstruction, metrics: measureOutput(series, out.series, kept, reconstruction, gapMs, byteModel) };
  });
}
