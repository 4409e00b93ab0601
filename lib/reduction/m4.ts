import { IndexBuffer } from "./index-buffer";
import { optionalGap } from "./params";
import type { Series } from "./series";
import { hasStretches, type SignalParams } from "./signal";
import { selectByStretch } from "./stretches";
import { splitWindows, type WindowParams, windowGrid } from "./windows";

export type M4Params = WindowParams & Pick<SignalParams, "gapMs">;

/**
 * M4 — U. Jugel, Z. Jerzak, G. Hackenbroich, V. Markl, "M4: A Visualization-Oriented
 * Time Series Data Aggregation", PVLDB 7(10), 2014: per window, keep the first and last
 * samples and the samples with the minimum and maximum value (the first of equal
 * values), and nothing else. Windows are epoch-aligned (plus `offsetMs`); for pixel
 * columns, set windowMs to the time span of one column. With quality or `gapMs`, each
 * stretch between gaps and quality changes is reduced on its own (see stretches.ts).
 *
 * Batch-only by nature: the paper defines M4 on a query's whole time range split into
 * pixel columns, so it is a query over stored data, not a step of an edge stream.
 *
 * @returns kept indices, ascending (first and last of the series are always among them).
 */
export function m4(s: Series, p: M4Params): Uint32Array {
  const grid = windowGrid(p);
  const gapMs = optionalGap(p.gapMs);
  if (hasStretches(s.q, gapMs)) return selectByStretch(s, gapMs, (part) => m4(part, { windowMs: p.windowMs, offsetMs: p.offsetMs, timeZone: p.timeZone }));
  const { t, v } = s;
  const w = splitWindows(s, grid);
  const kept = new IndexBuffer(Math.min(t.length, 4 * w.count));
  keepM4(v, w.begin, w.count, kept);
  return kept.toArray();
}

/** Pushes each window's first, min, max and last; nothing follows the loop (see windows.ts). */
function keepM4(v: Float64Array, begin: Uint32Array, count: number, kept: IndexBuffer): void {
  for (let k = 0; k < count; k++) {
    const first = begin[k];
    const last = begin[k + 1] - 1;
    let lo = first;
    let hi = first;
    let vlo = v[first];
    let vhi = vlo;
    for (let i = first + 1; i <= last; i++) {
      const x = v[i];
      if (x < vlo) {
        vlo = x;
        lo = i;
      } else if (x > vhi) {
        vhi = x;
        hi = i;
      }
    }
    // first ≤ min(lo, hi) ≤ max(lo, hi) ≤ last: push in order, skipping repeats.
    const a = lo < hi ? lo : hi;
    const b = lo < hi ? hi : lo;
    kept.push(first);
    if (a !== first) kept.push(a);
    if (b !== a) kept.push(b);
    if (last !== b) kept.push(last);
  }
}
