import type { ByteModel } from "@/lib/preview/run";
import type { StepMethod } from "@/lib/reduction";

export type EstimateTag = { samplePeriodMs: number };
/**
 * The reduction of one output: `ratio` samples in per sample out on average, `peakRatio`
 * in the busiest stretch (≤ ratio), and the compressed size per sample out. `source`:
 * measured on sample data, a stated default, or exact from a window and the sample periods.
 */
export type OutputRatio = { output: string; ratio: number; peakRatio: number; bitsPerSample: number; source: "measured" | "default" | "window" };
export type GroupEstimateInput = { group: string; tags: EstimateTag[]; outputs: OutputRatio[] };
export type SiteEstimateInput = {
  uplinkBudgetKbps: number;
  /** Share of the budget kept free (0.2 = 20 %). */
  headroom: number;
  storagePricePerGbMonth: number;
  retentionMonths: number;
  byteModel: ByteModel;
};
export type GroupEstimate = {
  group: string;
  samplesPerDayIn: number;
  samplesPerDayOut: number;
  bytesPerDayPlain: number;
  bytesPerDayCompressed: number;
  gbPerMonthPlain: number;
  meanKbps: number;
  peakKbps: number;
};
export type SiteEstimate = {
  groups: GroupEstimate[];
  totals: Omit<GroupEstimate, "group">;
  /** Stored once retention is reached: plain GB per month × retention months. */
  storageGbAtRetention: number;
  storageCostPerMonthAtRetention: number;
  budgetKbps: number;
  usableKbps: number;
  overBudgetMean: boolean;
  overBudgetPeak: boolean;
  /** Seconds to send the backlog of an outage of `outageSeconds` at the mean rate; Infinity when usable ≤ mean (0 for no outage). */
  catchUpSeconds: (outageSeconds: number) => number;
};

const DAY_MS = 86_400_000;
const DAY_S = 86_400;
/** A month is a twelfth of a Julian year: 365.25 / 12 = 30.4375 days. */
export const DAYS_PER_MONTH = 30.4375;
/** Decimal gigabytes, as cloud storage is priced: 1 GB = 1e9 bytes. */
export const BYTES_PER_GB = 1e9;

/**
 * Sluice's stated default ratios (samples in per sample out) for an output whose ratio
 * has not been measured on sample data — assumptions for a first estimate, labelled
 * "default" in the UI, not published figures. Aggregations and M4 are not listed: their
 * ratio follows from the window and the tag's sample period ({@link defaultRatio}). LTTB
 * and LTOB keep a fixed count per run, so their ratio depends on the data's length.
 */
export const DEFAULT_RATIOS: Record<string, number> = {
  "pass-through": 1,
  "quality-filter": 1,
  drop: Infinity,
  deadband: 5,
  "swinging-door": 10,
  rdp: 10,
  lttb: 10,
  ltob: 10,
  "change-of-state": 20,
} satisfies Partial<Record<StepMethod, number>>;

/**
 * Sluice's stated default for compressed bits per sample out when none was measured: 80.
 * A Gorilla-encoded reduced series (irregular times, changing values) took 45–130 bits
 * per sample, about 80 in the middle, on the demo signals under swinging door and
 * deadband at 0.5 % of range; the paper's 1.37 bytes per point (Pelkonen et al. 2015) is
 * for regular, slowly changing data at rest and does not apply.
 */
export const DEFAULT_BITS_PER_SAMPLE = 80;

/**
 * The default ratio of an output's chain of steps for a tag: the product of each step's
 * ratio — {@link DEFAULT_RATIOS} for selections; window ÷ sample period for a window
 * aggregation (one sample per window), 4 per window for M4; at least 1 per step. Steps
 * are the document's (window in seconds).
 */
export function defaultRatio(steps: readonly { method: string; window?: number }[], samplePeriodMs: number): number {
  let ratio = 1;
  for (const step of steps) {
    if (step.window !== undefined) ratio *= Math.max(1, (step.window * 1000) / samplePeriodMs / (step.method === "m4" ? 4 : 1));
    else ratio *= DEFAULT_RATIOS[step.method] ?? 1;
  }
  return ratio;
}

/**
 * The smallest ratio over windows of `windowMs` (epoch-aligned): input samples per output
 * sample where the output is densest — the `peakRatio` of a measured output (common
 * practice). Windows without output do not count; Infinity when nothing is sent.
 */
export function measuredPeakRatio(inputT: Float64Array, outputT: Float64Array, windowMs: number): number {
  let best = Infinity;
  let i = 0;
  let k = 0;
  while (k < outputT.length) {
    const start = Math.floor(outputT[k] / windowMs) * windowMs;
    const end = start + windowMs;
    let out = 0;
    while (k < outputT.length && outputT[k] < end) {
      out++;
      k++;
    }
    while (i < inputT.length && inputT[i] < start) i++;
    let n = 0;
    while (i < inputT.length && inputT[i] < end) {
      n++;
      i++;
    }
    best = Math.min(best, Math.max(n, 1) / out);
  }
  return best;
}

function positive(name: string, x: number, orZero = false): number {
  if (!(Number.isFinite(x) && (orZero ? x >= 0 : x > 0))) throw new RangeError(`${name} must be ${orZero ? "≥ 0" : "> 0"}, got ${x}`);
  return x;
}

/**
 * Daily volume and rate of one tag group (common practice; the arithmetic is the
 * estimate's stated assumptions, shown beside it in the UI):
 * - samples/day in = Σ over tags 86,400,000 / samplePeriodMs;
 * - out = in / ratio for each output (each output is a series of its own), summed;
 * - plain bytes/day = out × bytesPerSample × (1 + transportOverhead);
 * - compressed bytes/day = Σ out × bitsPerSample / 8;
 * - GB/month = plain bytes/day × 30.4375 / 1e9;
 * - mean kbit/s = plain bytes/day × 8 / 86,400 / 1000; peak likewise with peakRatio.
 */
export function estimateGroup(g: GroupEstimateInput, site: SiteEstimateInput): GroupEstimate {
  const { bytesPerSample, transportOverhead } = site.byteModel;
  positive("bytesPerSample", bytesPerSample);
  positive("transportOverhead", transportOverhead, true);
  let samplesPerDayIn = 0;
  for (const tag of g.tags) samplesPerDayIn += DAY_MS / positive("samplePeriodMs", tag.samplePeriodMs);
  let samplesPerDayOut = 0;
  let peakPerDayOut = 0;
  let bytesPerDayCompressed = 0;
  for (const o of g.outputs) {
    // A ratio of Infinity (drop) sends nothing.
    const out = o.ratio === Infinity ? 0 : samplesPerDayIn / positive(`ratio of ${o.output}`, o.ratio);
    samplesPerDayOut += out;
    peakPerDayOut += o.peakRatio === Infinity ? 0 : samplesPerDayIn / positive(`peakRatio of ${o.output}`, o.peakRatio);
    bytesPerDayCompressed += (out * positive(`bitsPerSample of ${o.output}`, o.bitsPerSample, true)) / 8;
  }
  const perSample = bytesPerSample * (1 + transportOverhead);
  const bytesPerDayPlain = samplesPerDayOut * perSample;
  const kbps = (bytesPerDay: number) => (bytesPerDay * 8) / DAY_S / 1000;
  return {
    group: g.group,
    samplesPerDayIn,
    samplesPerDayOut,
    bytesPerDayPlain,
    bytesPerDayCompressed,
    gbPerMonthPlain: (bytesPerDayPlain * DAYS_PER_MONTH) / BYTES_PER_GB,
    meanKbps: kbps(bytesPerDayPlain),
    peakKbps: kbps(peakPerDayOut * perSample),
  };
}

/**
 * A site's estimate: every group, their totals (sums; the peak is the sum of the groups'
 * peaks, as if they coincide), storage once retention is reached (plain GB/month ×
 * retention months, priced per GB-month), the usable uplink (budget × (1 − headroom)),
 * whether the mean or the peak rate exceeds it, and the catch-up time after an outage of
 * T seconds: the backlog (mean × T) sent with what the live data leaves free (usable −
 * mean), so mean × T / (usable − mean); Infinity when usable ≤ mean (common practice).
 */
export function estimateSite(groups: GroupEstimateInput[], site: SiteEstimateInput): SiteEstimate {
  positive("uplinkBudgetKbps", site.uplinkBudgetKbps, true);
  if (!(site.headroom >= 0 && site.headroom < 1)) throw new RangeError(`headroom must be in [0, 1), got ${site.headroom}`);
  positive("storagePricePerGbMonth", site.storagePricePerGbMonth, true);
  positive("retentionMonths", site.retentionMonths, true);
  const each = groups.map((g) => estimateGroup(g, site));
  const totals: Omit<GroupEstimate, "group"> = {
    samplesPerDayIn: 0,
    samplesPerDayOut: 0,
    bytesPerDayPlain: 0,
    bytesPerDayCompressed: 0,
    gbPerMonthPlain: 0,
    meanKbps: 0,
    peakKbps: 0,
  };
  for (const g of each) for (const key of Object.keys(totals) as (keyof typeof totals)[]) totals[key] += g[key];
  const storageGbAtRetention = totals.gbPerMonthPlain * site.retentionMonths;
  const usableKbps = site.uplinkBudgetKbps * (1 - site.headroom);
  const mean = totals.meanKbps;
  return {
    groups: each,
    totals,
    storageGbAtRetention,
    storageCostPerMonthAtRetention: storageGbAtRetention * site.storagePricePerGbMonth,
    budgetKbps: site.uplinkBudgetKbps,
    usableKbps,
    overBudgetMean: mean > usableKbps,
    overBudgetPeak: totals.peakKbps > usableKbps,
    catchUpSeconds: (outageSeconds) => {
      if (positive("outageSeconds", outageSeconds, true) === 0) return 0;
      if (usableKbps <= mean) return Infinity;
      return (mean * outageSeconds) / (usableKbps - mean);
    },
  };
}
