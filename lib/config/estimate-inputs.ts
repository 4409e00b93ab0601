import type { EstimateTag, GroupEstimateInput, OutputRatio } from "@/lib/estimates";
import { DEFAULT_BITS_PER_SAMPLE, DEFAULT_RATIOS } from "@/lib/estimates";
import { METHODS, type Profile, type Step } from "@/lib/reduction/profile";

export { DEFAULT_BITS_PER_SAMPLE };
/** Without a measured busiest window, a selection method is assumed to keep this many times more at its peak. */
export const DEFAULT_PEAK_FACTOR = 4;

export type MeasuredOutput = { output: string; ratio: number; peakRatio: number; bitsPerSample: number };

const DAY_MS = 86_400_000;

/** Samples in ÷ samples out over the tags for an output that ends in a window of `windowS` seconds. */
function windowRatio(tags: readonly EstimateTag[], windowS: number): number {
  let samplesIn = 0;
  let samplesOut = 0;
  for (const t of tags) {
    samplesIn += DAY_MS / t.samplePeriodMs;
    // At most one output sample per window, and never more than the input has.
    samplesOut += Math.min(DAY_MS / t.samplePeriodMs, DAY_MS / (windowS * 1000));
  }
  return samplesOut === 0 ? 1 : samplesIn / samplesOut;
}

function lastWindow(steps: readonly Step[]): number | null {
  for (let i = steps.length - 1; i >= 0; i--) {
    const s = steps[i] as Step & { window?: number };
    if (METHODS[s.method].role === "aggregation" && typeof s.window === "number") return s.window;
  }
  return null;
}

/**
 * The estimate input of one group: per output, its reduction ratio and the ratio at its
 * busiest moment. An output ending in a window is exact from the window and the tags'
 * sample periods (one sample per window at most). Other outputs use the ratios measured
 * on the group's sample set when there is one, else the stated default per method
 * (`DEFAULT_RATIOS`, multiplied along the chain), with the peak assumed
 * {@link DEFAULT_PEAK_FACTOR}× denser. Without a profile, the site's default handling.
 */
export function groupEstimateInput(
  group: string,
  doc: Profile | null,
  tags: readonly EstimateTag[],
  measured: readonly MeasuredOutput[] | null,
  defaultHandling: "pass-through" | "drop",
): GroupEstimateInput {
  if (doc === null) {
    const ratio = defaultHandling === "drop" ? Infinity : 1;
    return { group, tags: [...tags], outputs: [{ output: defaultHandling, ratio, peakRatio: ratio, bitsPerSample: DEFAULT_BITS_PER_SAMPLE, source: "default" }] };
  }
  const outputs: OutputRatio[] = doc.outputs.map((o) => {
    const window = lastWindow(o.steps);
    const m = measured?.find((x) => x.output === o.name);
    if (window !== null) {
      const ratio = windowRatio(tags, window);
      return { output: o.name, ratio, peakRatio: ratio, bitsPerSample: m?.bitsPerSample ?? DEFAULT_BITS_PER_SAMPLE, source: "window" };
    }
    if (m) return { output: o.name, ratio: m.ratio, peakRatio: m.peakRatio, bitsPerSample: m.bitsPerSample, source: "measured" };
    const ratio = o.steps.reduce((r, s) => r * (DEFAULT_RATIOS[s.method] ?? 1), 1);
    return { output: o.name, ratio, peakRatio: Math.max(1, ratio / DEFAULT_PEAK_FACTOR), bitsPerSample: DEFAULT_BITS_PER_SAMPLE, source: "default" };
  });
  return { group, tags: [...tags], outputs };
}
