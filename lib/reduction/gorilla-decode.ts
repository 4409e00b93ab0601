import { BitReader } from "./bit-stream";
import { checkOptions, firstDeltaBits, type GorillaEncoded, HI_WORD, LO_WORD } from "./gorilla-format";
import type { Series } from "./series";

// Module-local copies: hot loops read them without going through import bindings.
const HI = HI_WORD;
const LO = LO_WORD;

/** Decodes {@link gorillaEncode}'s output, bit for bit (NaN payloads and −0 included). */
export function gorillaDecode(e: GorillaEncoded): Series {
  const [resolution, blockTicks] = checkOptions(e);
  const firstBits = firstDeltaBits(blockTicks);
  let n = 0;
  for (const c of e.blockCounts) n += c;
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  const words = new Uint32Array(v.buffer);
  const r = new BitReader(e.bytes, e.bitLength);
  let i = 0;
  for (const count of e.blockCounts) {
    if (count === 0) continue;
    const header = (r.read(32) | 0) * 2 ** 32 + r.read(32);
    let delta = r.read(firstBits);
    let tick = header + delta;
    let hi = r.read(32);
    let lo = r.read(32);
    let lead = 0;
    let trail = 0;
    t[i] = tick * resolution;
    words[2 * i + HI] = hi;
    words[2 * i + LO] = lo;
    i++;
    for (let k = 1; k < count; k++, i++) {
      delta += readDod(r);
      tick += delta;
      t[i] = tick * resolution;
      if (r.read(1) === 1) {
        if (r.read(1) === 1) {
          lead = r.read(5);
          const meaningful = r.read(6) || 64;
          trail = 64 - lead - meaningful;
        }
        const bits = 64 - lead - trail;
        const xh = bits > 32 ? r.read(bits - 32) : 0;
        const xl = r.read(Math.min(bits, 32));
        // Shift (xh, xl) left by `trail` back into place.
        let sh: number;
        let sl: number;
        if (trail >= 32) {
          sh = xl << (trail - 32);
          sl = 0;
        } else if (trail === 0) {
          sh = xh;
          sl = xl;
        } else {
          sh = (xh << trail) | (xl >>> (32 - trail));
          sl = xl << trail;
        }
        hi = (hi ^ sh) >>> 0;
        lo = (lo ^ sl) >>> 0;
      }
      words[2 * i + HI] = hi;
      words[2 * i + LO] = lo;
    }
  }
  return { t, v };
}

function readDod(r: BitReader): number {
  if (r.read(1) === 0) return 0;
  if (r.read(1) === 0) return r.read(7) - 63;
  if (r.read(1) === 0) return r.read(9) - 255;
  if (r.read(1) === 0) return r.read(12) - 2047;
  return r.read(32) | 0;
}
