import type { Samples } from "./window-kernel";

/**
 * Time-weighted mean of one window [start, end) — OPC UA Part 13 (Aggregates),
 * TimeAverage: the area under the reconstructed signal divided by the time covered,
 * with the bounding values at the window edges interpolated ("interpolated bounding
 * values"). `step` holds each value until the next sample (Part 13's stepped
 * interpolation); `linear` integrates the straight lines between samples (sloped).
 *
 * Boundaries, as Sluice applies them (from memory of Part 13; the window never reads
 * data it does not have):
 * - start: the value at `start` is interpolated from the last sample before the window
 *   (held, for step). With no earlier sample, the window is covered from its first
 *   sample on.
 * - end: the value at `end` is interpolated towards the first sample after the window
 *   (held, for step). After the last sample of the series the last value is held to the
 *   window end (Part 13's stepped extrapolation) in both modes.
 *
 * Quality and gaps (DESIGN.md "Signals"): the interval from a sample to the next is
 * covered only when the sample is usable and the step is not a gap (longer than
 * `gapMs`); an uncovered interval counts neither in the area nor in the time. A covered
 * interval is a straight line (linear) only when the sample closing it is usable too;
 * otherwise the value holds. NaN when nothing is covered.
 */
export function timeWeightedMean(
  s: Samples,
  from: number,
  to: number,
  length: number,
  start: number,
  end: number,
  linear: boolean,
  usableMax: number,
  gapMs: number,
): number {
  const { t, v, q } = s;
  if (q === undefined && gapMs === Infinity) return plainTimeWeightedMean(t, v, from, to, length, start, end, linear);
  const last = to - 1;
  let area = 0;
  let covered = start;
  let uncovered = 0;
  if (from > 0 && (q === undefined || q[from - 1] <= usableMax) && !(t[from] - t[from - 1] > gapMs)) {
    const tp = t[from - 1];
    const vp = v[from - 1];
    if (linear && (q === undefined || q[from] <= usableMax)) {
      const vStart = vp + (start - tp) * ((v[from] - vp) / (t[from] - tp));
      area += 0.5 * (vStart + v[from]) * (t[from] - start);
    } else {
      area += vp * (t[from] - start);
    }
  } else {
    covered = t[from];
  }
  for (let i = from; i < last; i++) {
    const dt = t[i + 1] - t[i];
    if ((q !== undefined && q[i] > usableMax) || dt > gapMs) uncovered += dt;
    else area += linear && (q === undefined || q[i + 1] <= usableMax) ? 0.5 * (v[i] + v[i + 1]) * dt : v[i] * dt;
  }
  if (q !== undefined && q[last] > usableMax) {
    uncovered += end - t[last];
  } else if (to < length && t[to] - t[last] > gapMs) {
    uncovered += end - t[last];
  } else if (linear && to < length && (q === undefined || q[to] <= usableMax)) {
    const vEnd = v[last] + (end - t[last]) * ((v[to] - v[last]) / (t[to] - t[last]));
    area += 0.5 * (v[last] + vEnd) * (end - t[last]);
  } else {
    area += v[last] * (end - t[last]);
  }
  const time = end - covered - uncovered;
  return time > 0 ? area / time : Number.NaN;
}

/** The same without quality and gaps: every interval is covered (the arithmetic is identical). */
function plainTimeWeightedMean(
  t: Float64Array,
  v: Float64Array,
  from: number,
  to: number,
  length: number,
  start: number,
  end: number,
  linear: boolean,
): number {
  const last = to - 1;
  let area = 0;
  let covered = start;
  if (from > 0) {
    const tp = t[from - 1];
    const vp = v[from - 1];
    const vStart = linear ? vp + (start - tp) * ((v[from] - vp) / (t[from] - tp)) : vp;
    area += linear ? 0.5 * (vStart + v[from]) * (t[from] - start) : vStart * (t[from] - start);
  } else {
    covered = t[from];
  }
  for (let i = from; i < last; i++) {
    const dt = t[i + 1] - t[i];
    area += linear ? 0.5 * (v[i] + v[i + 1]) * dt : v[i] * dt;
  }
  if (linear && to < length) {
    const vEnd = v[last] + (end - t[last]) * ((v[to] - v[last]) / (t[to] - t[last]));
    area += 0.5 * (v[last] + vEnd) * (end - t[last]);
  } else {
    area += v[last] * (end - t[last]);
  }
  const time = end - covered;
  return time > 0 ? area / time : Number.NaN;
}

/**
 * Time (ms) within [start, end) during which the step-hold value matches: above
 * `level` (`equal` false) or equal to it (`equal` true). Coverage as for the step
 * {@link timeWeightedMean}: a usable value holds until the next sample unless that step
 * is a gap; the value before the window holds into it; the last sample of the series
 * holds to its window's end.
 */
export function timeMatching(
  s: Samples,
  from: number,
  to: number,
  length: number,
  start: number,
  end: number,
  level: number,
  equal: boolean,
  usableMax: number,
  gapMs: number,
): number {
  const { t, v, q } = s;
  if (q === undefined && gapMs === Infinity && !equal) return plainTimeAbove(t, v, from, to, start, end, level);
  const last = to - 1;
  let ms = 0;
  if (from > 0 && (q === undefined || q[from - 1] <= usableMax) && !(t[from] - t[from - 1] > gapMs)) {
    const x = v[from - 1];
    if (equal ? x === level : x > level) ms += t[from] - start;
  }
  for (let i = from; i < last; i++) {
    const x = v[i];
    if ((equal ? x === level : x > level) && (q === undefined || q[i] <= usableMax) && !(t[i + 1] - t[i] > gapMs)) ms += t[i + 1] - t[i];
  }
  const x = v[last];
  if ((equal ? x === level : x > level) && (q === undefined || q[last] <= usableMax) && !(to < length && t[to] - t[last] > gapMs)) {
    ms += end - t[last];
  }
  return ms;
}

/** Time above without quality and gaps (the arithmetic of timeMatching, fewer tests per sample). */
function plainTimeAbove(t: Float64Array, v: Float64Array, from: number, to: number, start: number, end: number, level: number): number {
  const last = to - 1;
  let ms = 0;
  if (from > 0 && v[from - 1] > level) ms += t[from] - start;
  for (let i = from; i < last; i++) if (v[i] > level) ms += t[i + 1] - t[i];
  if (v[last] > level) ms += end - t[last];
  return ms;
}
