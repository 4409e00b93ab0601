import { BLOCK_SHIFT, BLOCK_SIZE, type BlockEnvelopes } from "./rdp-blocks";

/** What the farthest-sample searches share during one RDP run. */
export type RdpContext = {
  t: Float64Array;
  v: Float64Array;
  env: BlockEnvelopes;
  /** Scratch: one bound per block of the current segment. */
  bounds: Float64Array;
  epsilon: number;
  /** The current segment: its ends, its slope (vertical) and rounding margin (perpendicular). */
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  slope: number;
  margin: number;
  /** Best distance so far (squared for perpendicular) and its index (−1: none yet). */
  best: number;
  index: number;
};

export function rdpContext(t: Float64Array, v: Float64Array, env: BlockEnvelopes, epsilon: number): RdpContext {
  const bounds = new Float64Array((t.length >>> BLOCK_SHIFT) + 2);
  return { t, v, env, bounds, epsilon, x1: 0, y1: 0, x2: 0, y2: 0, slope: 0, margin: 0, best: 0, index: -1 };
}

/** Ranges shorter than this are scanned sample by sample, without block bounds. */
const DIRECT_SCAN = 4 * BLOCK_SIZE;

/**
 * A generous bound on rounding error per unit of magnitude: 2⁻⁵² times a factor well
 * above what the few operations involved can accumulate.
 */
const ERROR_SCALE = 32 * 2 ** -52;

/**
 * Index of the sample in (first, last) farthest from the line first→last, measured
 * vertically, if that distance exceeds epsilon; else −1. Ties go to the lowest index.
 * Distance: |v − (v₁ + (t − t₁)·slope)| with slope = (v₂ − v₁)/(t₂ − t₁).
 */
export function farthestVertical(c: RdpContext, first: number, last: number): number {
  setSegment(c, first, last);
  c.best = c.epsilon;
  const lo = first + 1;
  const hi = last;
  if (hi - lo < DIRECT_SCAN) {
    scanVertical(c, lo, hi);
    return c.index;
  }
  // The computed line is monotone in t (each rounding step is), so a block's bound
  // against the line at its ends is exact in floating point: no margin needed.
  const top = boundBlocks(c, lo, hi, 0);
  if (c.bounds[top - (lo >>> BLOCK_SHIFT)] < c.best) return -1;
  visitBlocks(c, lo, hi, top, false);
  return c.index;
}

/**
 * Index of the sample in (first, last) farthest from the segment first→last in the
 * (t, v) plane, if its squared distance exceeds epsilon²; else −1. Ties go to the
 * lowest index. Every distance that can decide the outcome is computed with exactly the
 * operations of simplify-js (V. Agafonkin, `getSqSegDist`: projection clamped to the
 * segment), so the kept samples are identical to `simplify(points, epsilon, true)`.
 *
 * Speed comes from not computing distances that cannot decide, without changing any
 * decision: (1) the distance to the segment is at most the vertical distance (the
 * segment spans every t in between), so a block whose vertical bound plus a rounding
 * margin stays below the best distance is skipped; (2) a sample that projects inside the
 * segment and whose cross-product distance, plus the margin, stays below the best is
 * skipped without the division of the exact formula.
 */
export function farthestPerpendicular(c: RdpContext, first: number, last: number): number {
  setSegment(c, first, last);
  c.best = c.epsilon * c.epsilon;
  // |computed − true distance| for this segment, for either formula and for the bound.
  c.margin = ERROR_SCALE * (3 * (c.x2 - c.x1) + Math.max(Math.abs(c.x1), Math.abs(c.x2)) + 8 * c.env.absMax);
  const lo = first + 1;
  const hi = last;
  if (hi - lo < DIRECT_SCAN) {
    scanPerpendicular(c, lo, hi);
    return c.index;
  }
  const top = boundBlocks(c, lo, hi, c.margin);
  if (!mayHold(c.bounds[top - (lo >>> BLOCK_SHIFT)], c.best)) return -1;
  visitBlocks(c, lo, hi, top, true);
  return c.index;
}

/** Whether a block with this distance bound may hold a squared distance ≥ best. */
function mayHold(bound: number, best: number): boolean {
  return bound * bound * (1 + 1e-9) >= best;
}

function setSegment(c: RdpContext, first: number, last: number): void {
  c.x1 = c.t[first];
  c.y1 = c.v[first];
  c.x2 = c.t[last];
  c.y2 = c.v[last];
  c.slope = (c.y2 - c.y1) / (c.x2 - c.x1);
  c.index = -1;
}

function scanVertical(c: RdpContext, from: number, to: number): void {
  const { t, v, x1, y1, slope } = c;
  let best = c.best;
  let index = c.index;
  for (let i = from; i < to; i++) {
    const d = Math.abs(v[i] - (y1 + (t[i] - x1) * slope));
    if (d > best || (d === best && index >= 0 && i < index)) {
      best = d;
      index = i;
    }
  }
  c.best = best;
  c.index = index;
}

function scanPerpendicular(c: RdpContext, from: number, to: number): void {
  const { t, v, x1, y1, x2, y2, margin } = c;
  const dx = x2 - x1;
  const dy = y2 - y1;
  const den = dx * dx + dy * dy;
  const length = Math.sqrt(den);
  let best = c.best;
  let index = c.index;
  let gate = crossGate(best, margin, length);
  for (let i = from; i < to; i++) {
    const px = t[i];
    const py = v[i];
    // Fast test: projects inside the segment and |cross|/length + margin < √best.
    const rx = px - x1;
    const ry = py - y1;
    const num = rx * dx + ry * dy;
    const cross = rx * dy - ry * dx;
    if (num > 0 && num < den && cross < gate && -cross < gate) continue;
    // simplify-js getSqSegDist, operation for operation.
    let x = x1;
    let y = y1;
    const u = ((px - x) * dx + (py - y) * dy) / den;
    if (u > 1) {
      x = x2;
      y = y2;
    } else if (u > 0) {
      x += dx * u;
      y += dy * u;
    }
    const ex = px - x;
    const ey = py - y;
    const d = ex * ex + ey * ey;
    if (d > best || (d === best && index >= 0 && i < index)) {
      best = d;
      index = i;
      gate = crossGate(best, margin, length);
    }
  }
  c.best = best;
  c.index = index;
}

/**
 * |cross| below this means the distance to the line, plus three margins (the exact
 * formula's error, the cross product's, and the excess of a projection that rounding put
 * just inside the segment), is below √best — so the squared distance is below best.
 */
function crossGate(best: number, margin: number, length: number): number {
  const g = Math.sqrt(best) * (1 - 1e-12) - 3 * margin;
  return g > 0 ? g * length * (1 - 1e-12) : 0;
}

/**
 * Fills c.bounds with each block's bound on the vertical distance (scaled up by a
 * relative 1e-9 and `margin` when margin > 0) and returns the block with the largest.
 */
function boundBlocks(c: RdpContext, lo: number, hi: number, margin: number): number {
  const { t, x1, y1, slope, bounds } = c;
  const { min, max, tFirst, tLast } = c.env;
  const b0 = lo >>> BLOCK_SHIFT;
  const b1 = (hi - 1) >>> BLOCK_SHIFT;
  const scale = margin > 0 ? 1 + 1e-9 : 1;
  let top = b0;
  let topBound = -1;
  for (let b = b0; b <= b1; b++) {
    const la = y1 + ((b === b0 ? t[lo] : tFirst[b]) - x1) * slope;
    const lb = y1 + ((b === b1 ? t[hi - 1] : tLast[b]) - x1) * slope;
    const up = max[b] - (la < lb ? la : lb);
    const down = (la < lb ? lb : la) - min[b];
    const bound = (up > down ? up : down) * scale + margin;
    bounds[b - b0] = bound;
    if (bound > topBound) {
      topBound = bound;
      top = b;
    }
  }
  return top;
}

/** Scans the top block first (so the best rises early), then every block that may hold more. */
function visitBlocks(c: RdpContext, lo: number, hi: number, top: number, perpendicular: boolean): void {
  const b0 = lo >>> BLOCK_SHIFT;
  const b1 = (hi - 1) >>> BLOCK_SHIFT;
  scanBlock(c, top, b0, b1, lo, hi, perpendicular);
  const bounds = c.bounds;
  for (let b = b0; b <= b1; b++) {
    if (b === top) continue;
    const bound = bounds[b - b0];
    if (perpendicular ? mayHold(bound, c.best) : bound >= c.best) scanBlock(c, b, b0, b1, lo, hi, perpendicular);
  }
}

function scanBlock(c: RdpContext, b: number, b0: number, b1: number, lo: number, hi: number, perpendicular: boolean): void {
  const from = b === b0 ? lo : b << BLOCK_SHIFT;
  const to = b === b1 ? hi : (b + 1) << BLOCK_SHIFT;
  if (perpendicular) scanPerpendicular(c, from, to);
  else scanVertical(c, from, to);
}
