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
 */
export function timeWeightedMean(
  t: Float64Array,
  v: Float64Array,
  from: number,
  to: number,
  start: number,
  end: number,
  linear: boolean,
): number {
  const n = t.length;
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
  if (linear && to < n) {
    const vEnd = v[last] + (end - t[last]) * ((v[to] - v[last]) / (t[to] - t[last]));
    area += 0.5 * (v[last] + vEnd) * (end - t[last]);
  } else {
    area += v[last] * (end - t[last]);
  }
  return area / (end - covered);
}
