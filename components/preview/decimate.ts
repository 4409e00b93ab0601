// Chart decimation for the preview worker: whatever the series' length, the chart gets
// about two points per pixel column of the visible range (the minimum and the maximum,
// in time order, as in M4 without the first and last), a line break at every gap of the
// raw signal, and the samples just outside the range so lines reach the edges.

/** A drawable series: x in epoch ms; y Infinity marks a line break. */
export type Drawn = { x: Float64Array; y: Float64Array; inView: number };

/** First index with t[i] ≥ x (t ascending). */
export function lowerBound(t: Float64Array, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Start times of the raw signal's gaps (steps longer than gapMs). */
export function gapStarts(t: Float64Array, gapMs: number): Float64Array {
  const out: number[] = [];
  for (let i = 1; i < t.length; i++) if (t[i] - t[i - 1] > gapMs) out.push(t[i - 1]);
  return Float64Array.from(out);
}

/**
 * Minimum and maximum per pixel column of [from, to] (`columns` columns), with a break
 * (y = Infinity) between two samples that have a raw gap start between them (`gaps`,
 * ascending), so no line is drawn across a gap.
 */
export function decimate(t: Float64Array, v: Float64Array, from: number, to: number, columns: number, gaps: Float64Array): Drawn {
  const lo = lowerBound(t, from);
  const hi = lowerBound(t, to + 1e-9);
  const a = Math.max(0, lo - 1);
  const b = Math.min(t.length, hi + 1);
  const colMs = (to - from) / columns;
  const xs: number[] = [];
  const ys: number[] = [];
  let col = Number.NaN;
  let minI = -1;
  let maxI = -1;
  const flush = () => {
    if (minI < 0) return;
    const first = minI < maxI ? minI : maxI;
    const second = minI < maxI ? maxI : minI;
    xs.push(t[first]);
    ys.push(v[first]);
    if (second !== first) {
      xs.push(t[second]);
      ys.push(v[second]);
    }
    minI = -1;
  };
  let g = lowerBound(gaps, a < t.length ? t[a] : 0);
  for (let i = a; i < b; i++) {
    const ti = t[i];
    if (i > a) {
      const prev = t[i - 1];
      while (g < gaps.length && gaps[g] < prev) g++;
      if (g < gaps.length && gaps[g] < ti) {
        flush();
        xs.push((prev + ti) / 2);
        ys.push(Number.POSITIVE_INFINITY);
      }
    }
    const c = ti < from ? -1 : ti > to ? columns : Math.min(columns - 1, Math.floor((ti - from) / colMs));
    if (c !== col || minI < 0) {
      flush();
      col = c;
      minI = maxI = i;
    } else if (v[i] < v[minI]) minI = i;
    else if (v[i] > v[maxI]) maxI = i;
  }
  flush();
  return { x: Float64Array.from(xs), y: Float64Array.from(ys), inView: hi - lo };
}

/** Markers at the given sample indices (ascending) inside [from, to], at most one per column. */
export function markers(t: Float64Array, v: Float64Array, idx: Uint32Array, from: number, to: number, columns: number): Drawn {
  const colMs = (to - from) / columns;
  const xs: number[] = [];
  const ys: number[] = [];
  let lastCol = -1;
  let inView = 0;
  for (let k = 0; k < idx.length; k++) {
    const ti = t[idx[k]];
    if (ti < from) continue;
    if (ti > to) break;
    inView++;
    const c = Math.floor((ti - from) / colMs);
    if (c === lastCol) continue;
    lastCol = c;
    xs.push(ti);
    ys.push(v[idx[k]]);
  }
  return { x: Float64Array.from(xs), y: Float64Array.from(ys), inView };
}

/** Puts the series on one ascending x array; a series has NaN where it has no point. */
export function align(series: readonly Drawn[]): { x: Float64Array; ys: Float64Array[] } {
  let total = 0;
  for (const s of series) total += s.x.length;
  const all = new Float64Array(total);
  let k = 0;
  for (const s of series) {
    all.set(s.x, k);
    k += s.x.length;
  }
  all.sort();
  let n = 0;
  for (let i = 0; i < all.length; i++) if (i === 0 || all[i] !== all[n - 1]) all[n++] = all[i];
  const x = all.slice(0, n);
  const ys = series.map((s) => {
    const y = new Float64Array(n).fill(Number.NaN);
    let j = 0;
    for (let p = 0; p < s.x.length; p++) {
      while (x[j] < s.x[p]) j++;
      y[j] = s.y[p];
    }
    return y;
  });
  return { x, ys };
}
