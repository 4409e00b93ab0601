/**
 * Statistics of one window's values v[from … to−1] (to > from). Each follows the
 * definition `simple-statistics` ≥ 7.8.9 uses, so its results are the reference in tests.
 */

export function windowMean(v: Float64Array, from: number, to: number): number {
  return windowSum(v, from, to) / (to - from);
}

export function windowSum(v: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += v[i];
  return sum;
}

export function windowMin(v: Float64Array, from: number, to: number): number {
  let m = v[from];
  for (let i = from + 1; i < to; i++) if (v[i] < m) m = v[i];
  return m;
}

export function windowMax(v: Float64Array, from: number, to: number): number {
  let m = v[from];
  for (let i = from + 1; i < to; i++) if (v[i] > m) m = v[i];
  return m;
}

export function windowRange(v: Float64Array, from: number, to: number): number {
  let lo = v[from];
  let hi = lo;
  for (let i = from + 1; i < to; i++) {
    const x = v[i];
    if (x < lo) lo = x;
    else if (x > hi) hi = x;
  }
  return hi - lo;
}

/** Sum of squared deviations from the mean (two passes: mean first, then deviations). */
function squaredDeviations(v: Float64Array, from: number, to: number): number {
  const mean = windowMean(v, from, to);
  let ss = 0;
  for (let i = from; i < to; i++) {
    const d = v[i] - mean;
    ss += d * d;
  }
  return ss;
}

/** Population standard deviation: √(Σ(x − x̄)² / n). */
export function windowStdevPopulation(v: Float64Array, from: number, to: number): number {
  return Math.sqrt(squaredDeviations(v, from, to) / (to - from));
}

/** Sample standard deviation: √(Σ(x − x̄)² / (n − 1)); NaN for a one-sample window. */
export function windowStdevSample(v: Float64Array, from: number, to: number): number {
  const n = to - from;
  return n < 2 ? NaN : Math.sqrt(squaredDeviations(v, from, to) / (n - 1));
}

/**
 * Quantile of sorted values, Hyndman & Fan type 7 (R's default, numpy "linear"):
 * h = (n − 1)·p, x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]). R. J. Hyndman, Y. Fan, "Sample
 * Quantiles in Statistical Packages", The American Statistician 50(4), 1996.
 */
export function quantileSorted(x: Float64Array, p: number): number {
  const n = x.length;
  if (p === 1) return x[n - 1];
  if (p === 0) return x[0];
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  if (lo === h) return x[h];
  return x[lo] + (h - lo) * (x[lo + 1] - x[lo]);
}

/** The most frequent value of sorted values; on a tie, the smallest. */
export function modeSorted(x: Float64Array): number {
  let mode = x[0];
  let modeCount = 0;
  let run = 0;
  for (let i = 0; i < x.length; i++) {
    run = i > 0 && x[i] === x[i - 1] ? run + 1 : 1;
    if (run > modeCount) {
      modeCount = run;
      mode = x[i];
    }
  }
  return mode;
}
