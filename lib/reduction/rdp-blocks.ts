/**
 * Per-block value envelopes used by RDP to skip whole runs of samples: every sample of
 * a block lies inside [min, max], and a line evaluated at monotone timestamps is
 * monotone, so |v − line(t)| over a block is bounded by its envelope against the line
 * at the block's first and last timestamps. A block whose bound is below the best
 * distance found so far cannot hold the farthest sample and is not read.
 */
export const BLOCK_SHIFT = 5;
export const BLOCK_SIZE = 1 << BLOCK_SHIFT;

export type BlockEnvelopes = { min: Float64Array; max: Float64Array; absMax: number };

export function blockEnvelopes(v: Float64Array): BlockEnvelopes {
  const n = v.length;
  const count = (n + BLOCK_SIZE - 1) >>> BLOCK_SHIFT;
  const min = new Float64Array(count);
  const max = new Float64Array(count);
  let absMax = 0;
  for (let b = 0; b < count; b++) {
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
    if (-lo > absMax) absMax = -lo;
    if (hi > absMax) absMax = hi;
  }
  return { min, max, absMax };
}
