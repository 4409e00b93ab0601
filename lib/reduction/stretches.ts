import { IndexBuffer } from "./index-buffer";
import { QUALITY_BAD, type Series, validateSeries } from "./series";

// Module-local copy: hot loops read it without going through an import binding.
const BAD = QUALITY_BAD;

/**
 * The stretches of a series: it is cut before every sample that follows a gap (a step
 * longer than `gapMs`) or changes quality. Returns the start index of each stretch
 * followed by n, so stretch k is [starts[k], starts[k + 1]). Empty series: [0].
 */
export function stretchStarts(t: Float64Array, q: Uint8Array | undefined, gapMs: number): Uint32Array {
  const n = t.length;
  const starts = new IndexBuffer(64);
  if (n > 0) starts.push(0);
  for (let i = 1; i < n; i++) {
    if (t[i] - t[i - 1] > gapMs || (q !== undefined && q[i] !== q[i - 1])) starts.push(i);
  }
  starts.push(n);
  return starts.toArray();
}

/**
 * Runs a selection method on each stretch on its own (DESIGN.md "Signals": selection
 * methods keep a sample where quality changes and the samples on both sides of a gap; no
 * method interpolates across a gap). `select` receives a stretch as a series without
 * quality and returns its kept indices (first and last kept, as every selection method
 * here does). A bad stretch is not read: only its first and last samples are kept, so
 * the receiver knows when bad quality began and ended.
 *
 * @returns kept indices into `s`, ascending.
 */
export function selectByStretch(s: Series, gapMs: number, select: (stretch: Series) => Uint32Array): Uint32Array {
  validateSeries(s);
  const { t, v, q } = s;
  const starts = stretchStarts(t, q, gapMs);
  const kept = new IndexBuffer(t.length >>> 4);
  for (let k = 0; k + 1 < starts.length; k++) {
    const from = starts[k];
    const to = starts[k + 1];
    if (q !== undefined && q[from] === BAD) {
      pushEnds(kept, from, to);
      continue;
    }
    const picked = select({ t: t.subarray(from, to), v: v.subarray(from, to) });
    for (let j = 0; j < picked.length; j++) kept.push(from + picked[j]);
  }
  return kept.toArray();
}

/** Pushes the first and last index of [from, to) (one index for a one-sample stretch). */
export function pushEnds(kept: IndexBuffer, from: number, to: number): void {
  kept.push(from);
  if (to - 1 > from) kept.push(to - 1);
}

/**
 * LTTB and LTOB over stretches: the ends of every stretch are kept, and the rest of the
 * `points` budget is shared among the readable stretches longer than two samples in
 * proportion to their inner sample counts (largest remainder, earlier stretch first on a
 * tie); each runs `select` with its share plus its two ends. So `points` is exceeded
 * only when the stretch ends alone need more. Sluice's rule; the thesis has no gaps.
 */
export function selectByStretchBudget(
  s: Series,
  gapMs: number,
  points: number,
  select: (stretch: Series, points: number) => Uint32Array,
): Uint32Array {
  validateSeries(s);
  const { t, v, q } = s;
  const starts = stretchStarts(t, q, gapMs);
  const count = starts.length - 1;
  const readable = (k: number) => (q === undefined || q[starts[k]] !== BAD) && starts[k + 1] - starts[k] > 2;
  let ends = 0;
  let inner = 0;
  for (let k = 0; k < count; k++) {
    ends += Math.min(2, starts[k + 1] - starts[k]);
    if (readable(k)) inner += starts[k + 1] - starts[k] - 2;
  }
  const extra = shareBudget(starts, readable, Math.max(0, points - ends), inner);
  const kept = new IndexBuffer(Math.min(t.length, points + ends));
  for (let k = 0; k < count; k++) {
    const from = starts[k];
    const to = starts[k + 1];
    if (!readable(k) || extra[k] === 0) {
      pushEnds(kept, from, to);
      continue;
    }
    const picked = select({ t: t.subarray(from, to), v: v.subarray(from, to) }, extra[k] + 2);
    for (let j = 0; j < picked.length; j++) kept.push(from + picked[j]);
  }
  return kept.toArray();
}

/** Largest-remainder shares of `budget` in proportion to each readable stretch's inner samples. */
function shareBudget(starts: Uint32Array, readable: (k: number) => boolean, budget: number, inner: number): Uint32Array {
  const count = starts.length - 1;
  const extra = new Uint32Array(count);
  if (budget === 0 || inner === 0) return extra;
  if (budget >= inner) {
    for (let k = 0; k < count; k++) if (readable(k)) extra[k] = starts[k + 1] - starts[k] - 2;
    return extra;
  }
  const remainders: [number, number][] = [];
  let given = 0;
  for (let k = 0; k < count; k++) {
    if (!readable(k)) continue;
    const exact = (budget * (starts[k + 1] - starts[k] - 2)) / inner;
    extra[k] = Math.floor(exact);
    given += extra[k];
    remainders.push([exact - extra[k], k]);
  }
  remainders.sort((a, b) => b[0] - a[0] || a[1] - b[1]);
  for (let r = 0; r < budget - given; r++) extra[remainders[r][1]]++;
  return extra;
}
