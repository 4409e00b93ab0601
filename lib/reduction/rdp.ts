import { optionalGap, requireNonNegative } from "./params";
import { blockEnvelopes } from "./rdp-blocks";
import { farthestPerpendicular, farthestVertical, type RdpContext, rdpContext } from "./rdp-farthest";
import { allIndices, indicesFromMask, type Series, validateSeries } from "./series";
import { hasStretches, type SignalParams } from "./signal";
import { selectByStretch } from "./stretches";

export type RdpParams = Pick<SignalParams, "gapMs"> & {
  /** Largest distance a dropped sample may have from the kept line. */
  epsilon: number;
  /**
   * `vertical` (default): |v − line(t)|, in the tag's engineering unit, so epsilon bounds
   * the linear reconstruction error. `perpendicular`: Euclidean distance to the segment
   * in the (t [ms], v) plane, as in the original papers and simplify-js.
   */
  distance?: "vertical" | "perpendicular";
};

/**
 * Ramer–Douglas–Peucker — U. Ramer, "An iterative procedure for the polygonal
 * approximation of plane curves", Computer Graphics and Image Processing 1(3), 1972;
 * D. Douglas & T. Peucker, "Algorithms for the reduction of the number of points
 * required to represent a digitized line or its caricature", The Canadian
 * Cartographer 10(2), 1973. Keep first and last; find the sample farthest from the line
 * between them; if it is farther than epsilon, keep it and repeat on both halves.
 *
 * Iterative (an explicit stack), so 10M samples cannot overflow the call stack.
 * `perpendicular` keeps exactly the samples of simplify-js `simplify(points, epsilon,
 * true)` (squared distance to the segment, strict >, first farthest on a tie).
 *
 * With quality or `gapMs`, each stretch between gaps and quality changes is simplified
 * on its own (see stretches.ts). Batch-only by nature: the first split depends on the
 * whole series' ends, so no sample can be decided before the end.
 *
 * @returns kept indices, ascending.
 */
export function rdp(s: Series, p: RdpParams): Uint32Array {
  const epsilon = requireNonNegative("epsilon", p.epsilon);
  const distance = p.distance ?? "vertical";
  if (distance !== "vertical" && distance !== "perpendicular") {
    throw new RangeError(`distance must be "vertical" or "perpendicular", got ${String(distance)}`);
  }
  const gapMs = optionalGap(p.gapMs);
  if (hasStretches(s.q, gapMs)) return selectByStretch(s, gapMs, (part) => rdp(part, { epsilon, distance }));
  validateSeries(s);
  const { t, v } = s;
  const n = t.length;
  if (n <= 2) return allIndices(n);

  const c = rdpContext(t, v, blockEnvelopes(t, v), epsilon);
  const keep = new Uint8Array(n);
  const count = simplifyInto(c, distance === "vertical" ? farthestVertical : farthestPerpendicular, keep);
  return indicesFromMask(keep, count);
}

/**
 * Marks the kept samples in `keep` and returns their count. Segments wait on an explicit
 * stack; nothing follows the loop, so V8's mid-loop compiled code stays valid.
 */
function simplifyInto(c: RdpContext, farthest: (c: RdpContext, first: number, last: number) => number, keep: Uint8Array): number {
  const n = keep.length;
  keep[0] = 1;
  keep[n - 1] = 1;
  let count = 2;
  let stack: Uint32Array = new Uint32Array(256);
  let top = 0;
  stack[top++] = 0;
  stack[top++] = n - 1;
  while (top > 0) {
    const last = stack[--top];
    const first = stack[--top];
    if (last - first < 2) continue;
    const index = farthest(c, first, last);
    if (index < 0) continue;
    keep[index] = 1;
    count++;
    if (top + 4 > stack.length) stack = grow(stack);
    stack[top++] = index;
    stack[top++] = last;
    stack[top++] = first;
    stack[top++] = index;
  }
  return count;
}

function grow(stack: Uint32Array): Uint32Array {
  const grown = new Uint32Array(stack.length * 2);
  grown.set(stack);
  return grown;
}
