/**
 * Per-block summaries used by RDP to skip whole runs of samples: every sample of a
 * block lies inside [min, max], and a line evaluated at ascending timestamps is
 * monotone, so |v − line(t)| over a block is bounded by its envelope against the line
 * at the block's first and last timestamps. A block whose bound is below the best
 * distance found so far cannot hold the farthest sample and is not read. The block's
 * first and last timestamps are copied here so that bounding a run of blocks reads
 * these small arrays rather than two cache lines of `t` per block.
 */
export const BLOCK_SHIFT = 5;
export const BLOCK_SIZE = 1 << BLOCK_SHIFT;

export type BlockEnvelopes = {
  min: Float64Array;
  max: Float64Array;
  tFirst: Float64Array;
  tLast: Float64Array;
  /** max |v| over the series, for rounding margins. */
  absMax: number;
};

export function blockEnvelopes(t: Float64Array, v: Float64Array): BlockEnvelopes {
  const n = v.length;
  const count = (n + BLOCK_SIZE - 1) >>> BLOCK_SHIFT;
  const env: BlockEnvelopes = {
    min: new Float64Array(count),
    max: new Float64Array(count),
    tFirst: new Float64Array(count),
    tLast: new Float64Array(count),
    absMax: 0,
  };
  env.absMax = fillEnvelopes(t, v, env.min, env.max, env.tFirst, env.tLast);
  return env;
}

/** Returns max |v|; nothing follows the loop (V8's mid-loop compiled code stays valid). */
function fillEnvelopes(
  t: Float64Array,
  v: Float64Array,
  min: Float64Array,
  max: Float64Array,
  tFirst: Float64Array,
  tLast: Float64Array,
): number {
  const n = v.length;
  let absMax = 0;
  for (let b = 0; b < min.length; b++) {
    const start = b << BLOCK_SHIFT;
    const end = Math.min(n, start + BLOCK_SIZE);
    let lo = v[start];
    let hi = lo;
    for (let i = start + 1; i < end; i++) {
      const x = v[i];
      if (x < lo) lo = x;
      else if (x > hi) hi = x;
    }
    min[b] = lo;
    max[b] = hi;
    tFirst[b] = t[start];
    tLast[b] = t[end - 1];
    if (-lo > absMax) absMax = -lo;
    if (hi > absMax) absMax = hi;
  }
  return absMax;
}
