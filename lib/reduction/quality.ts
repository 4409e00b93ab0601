import { IndexBuffer } from "./index-buffer";
import { allIndices, QUALITY_GOOD, QUALITY_UNCERTAIN, type Series, validateSeries } from "./series";

export type QualityFilterParams = {
  /** `good` keeps good samples; `good-and-uncertain` keeps uncertain ones too. */
  keep: "good" | "good-and-uncertain";
};

/** The highest quality code a quality filter keeps. */
export function keptQuality(p: QualityFilterParams): number {
  if (p.keep === "good") return QUALITY_GOOD;
  if (p.keep === "good-and-uncertain") return QUALITY_UNCERTAIN;
  throw new RangeError(`keep must be "good" or "good-and-uncertain", got ${String(p.keep)}`);
}

/**
 * Quality filter — common practice, on OPC UA's good / uncertain / bad severities (Part
 * 4 StatusCode): keeps the good samples (and the uncertain ones with
 * `good-and-uncertain`), drops the rest. A series without quality is all good. Unlike
 * the other selection methods it need not keep the first and last samples. Streaming
 * form: {@link createQualityFilterStream}.
 *
 * @returns kept indices, ascending.
 */
export function qualityFilter(s: Series, p: QualityFilterParams): Uint32Array {
  const highest = keptQuality(p);
  validateSeries(s);
  const { q } = s;
  if (q === undefined) return allIndices(s.t.length);
  const kept = new IndexBuffer(q.length);
  for (let i = 0; i < q.length; i++) if (q[i] <= highest) kept.push(i);
  return kept.toArray();
}

/** Pass-through — keeps every sample (common practice). @returns all indices. */
export function passThrough(s: Series): Uint32Array {
  validateSeries(s);
  return allIndices(s.t.length);
}

/** Drop — keeps nothing: the tag is not sent (common practice). @returns no indices. */
export function drop(s: Series): Uint32Array {
  validateSeries(s);
  return new Uint32Array(0);
}
