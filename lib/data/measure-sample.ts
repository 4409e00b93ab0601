import "server-only";
import { previewProfile } from "@/lib/preview";
import type { MeasuredOutput } from "@/lib/config/estimate-inputs";
import type { Series } from "@/lib/reduction";
import type { ParameterOverride, Profile, ProfileTag } from "@/lib/reduction/profile";
import { convertUnit } from "@/lib/units";

/** The busiest-window search uses windows of this length, or a tenth of the sample set when it is shorter. */
const PEAK_WINDOW_MS = 3_600_000;
/** Windows with fewer input samples than this are not used for the peak. */
const MIN_WINDOW_SAMPLES = 20;

const cache = new Map<string, MeasuredOutput[]>();
const CACHE_LIMIT = 200;

function slice(s: Series, from: number, to: number): Series {
  return { t: s.t.subarray(from, to), v: s.v.subarray(from, to), ...(s.q ? { q: s.q.subarray(from, to) } : {}) };
}

/**
 * Ratios measured on a sample set: each output's samples in ÷ out over the whole set,
 * bits per reduced sample under the Gorilla model, and the ratio of the busiest window
 * (the hour — or tenth of the set — in which the output keeps the most samples per input
 * sample). Results are memoised per (set, revision, overrides) in this process only, as a
 * speed-up: a cold instance computes the same figures.
 */
export function measureSample(key: string, series: Series, doc: Profile, tag: ProfileTag, overrides: ParameterOverride[], timeZone: string): MeasuredOutput[] {
  const hit = cache.get(key);
  if (hit) return hit;
  const ctx = { convert: convertUnit, timeZone, overrides };
  const whole = previewProfile(series, doc, tag, ctx);
  const n = series.t.length;
  const span = series.t[n - 1] - series.t[0];
  const windowMs = span >= 2 * PEAK_WINDOW_MS ? PEAK_WINDOW_MS : Math.max(span / 10, 1);
  const worst = new Map<string, number>();
  let from = 0;
  while (from < n) {
    const end = series.t[from] + windowMs;
    let to = from;
    while (to < n && series.t[to] < end) to++;
    if (to - from >= MIN_WINDOW_SAMPLES) {
      for (const o of previewProfile(slice(series, from, to), doc, tag, ctx)) {
        const r = o.metrics.samplesOut === 0 ? Infinity : o.metrics.samplesIn / o.metrics.samplesOut;
        worst.set(o.name, Math.min(worst.get(o.name) ?? Infinity, r));
      }
    }
    from = to;
  }
  const result = whole.map((o) => {
    const ratio = o.metrics.samplesOut === 0 ? Infinity : o.metrics.samplesIn / o.metrics.samplesOut;
    return {
      output: o.name,
      ratio,
      peakRatio: Math.min(ratio, worst.get(o.name) ?? ratio),
      bitsPerSample: o.metrics.samplesOut === 0 ? 0 : (o.metrics.bytesCompressed * 8) / o.metrics.samplesOut,
    };
  });
  if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value!);
  cache.set(key, result);
  return result;
}
