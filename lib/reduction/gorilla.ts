import { BitWriter } from "./bit-stream";
import { checkOptions, firstDeltaBits, type GorillaEncoded, type GorillaOptions, HI_WORD, LO_WORD } from "./gorilla-format";
import { type Series, SeriesError } from "./series";

// Module-local copies: hot loops read them without going through import bindings.
const HI = HI_WORD;
const LO = LO_WORD;

export type { GorillaEncoded, GorillaOptions } from "./gorilla-format";
export { gorillaDecode } from "./gorilla-decode";

/**
 * The exact size in bits of a series under Gorilla compression — T. Pelkonen et al.,
 * "Gorilla: A Fast, Scalable, In-Memory Time Series Database", PVLDB 8(12), 2015,
 * section 4.1: delta-of-delta timestamps and XOR'd float values, in blocks aligned to
 * two hours. The compressed byte model of DESIGN.md ("Metrics"). Quality codes are not
 * part of the paper's format and are not counted. Lossless: see {@link gorillaDecode}.
 */
export function encodedBits(s: Series, options: GorillaOptions = {}): number {
  return encode(s, options).writer.bitLength;
}

/**
 * Gorilla encoder (Pelkonen et al. 2015, section 4.1). Per block of `blockMs` aligned to
 * the epoch: a 64-bit header holding the block start (two's complement, in ticks of
 * `resolutionMs`); the first timestamp as its delta from the header; the first value's
 * 64 bits; then per sample the delta of deltas D (the first D is taken against the
 * header delta, as the paper's Figure 2 does) and the XOR with the previous value.
 *
 * Where the paper's field widths are ambiguous, Sluice settles them as follows:
 * - the first delta takes 14 bits, as in the paper, or more when a block holds more
 *   ticks (23 bits for 2-h blocks of ms);
 * - D: '0' for 0; '10' + 7 bits for D in [−63, 64]; '110' + 9 bits for [−255, 256];
 *   '1110' + 12 bits for [−2047, 2048]; otherwise '1111' + 32 bits two's complement.
 *   The paper's ranges hold 2^7, 2^9 and 2^12 values but are not the ranges of
 *   two's complement fields ([−64, 63] …); we keep the paper's ranges and store D + 63,
 *   D + 255, D + 2047 unsigned. Within a block |D| < block ticks < 2^31, so 32 bits suffice;
 * - a value's XOR: '0' when zero; '10' + the meaningful bits when they fall within the
 *   previous window (at least its leading and trailing zeros); otherwise '11' + 5 bits of
 *   leading zeros + 6 bits of meaningful length + the meaningful bits. Leading zeros
 *   above 31 do not fit 5 bits: 31 is stored and the extra zeros are sent as meaningful
 *   bits. A meaningful length of 64 does not fit 6 bits: it is stored as 0 (a length of
 *   0 never occurs). The first window of a block is always written with '11'.
 */
export function gorillaEncode(s: Series, options: GorillaOptions = {}): GorillaEncoded {
  const { writer, blockCounts, resolutionMs, blockMs } = encode(s, options);
  return { bytes: writer.bytes(), bitLength: writer.bitLength, blockCounts, resolutionMs, blockMs };
}


function encode(s: Series, options: GorillaOptions): { writer: BitWriter; blockCounts: Uint32Array; resolutionMs: number; blockMs: number } {
  const [resolution, blockTicks] = checkOptions(options);
  const { t, v } = s;
  if (!(t instanceof Float64Array) || !(v instanceof Float64Array)) throw new TypeError("series.t and series.v must be Float64Array");
  if (t.length !== v.length) throw new SeriesError(`series.v has ${v.length} samples but series.t has ${t.length}`, Math.min(t.length, v.length));
  const n = t.length;
  const w = new BitWriter(n);
  const counts = new Uint32Array(n);
  const blocks = encodeSamples(t, new Uint32Array(v.buffer, v.byteOffset, 2 * n), resolution, blockTicks, w, counts);
  return { writer: w, blockCounts: counts.slice(0, blocks), resolutionMs: resolution, blockMs: blockTicks * resolution };
}

/**
 * Encodes every sample into `w` and counts samples per block into `counts`; returns the
 * block count. The function ends with its loop, so V8's code compiled while the loop runs
 * (on-stack replacement) stays valid when it ends (see lib/reduction/README.md).
 */
function encodeSamples(t: Float64Array, words: Uint32Array, resolution: number, blockTicks: number, w: BitWriter, counts: Uint32Array): number {
  const n = t.length;
  const firstBits = firstDeltaBits(blockTicks);
  let blocks = 0;
  let blockEnd = -Infinity;
  let prevTick = -Infinity;
  let prevDelta = 0;
  let hi = 0;
  let lo = 0;
  let lead = -1;
  let trail = 0;
  for (let i = 0; i < n; i++) {
    const tick = t[i] / resolution;
    if (!(tick > prevTick && tick <= Number.MAX_SAFE_INTEGER && tick >= -Number.MAX_SAFE_INTEGER && Math.floor(tick) === tick)) {
      throw timestampError(t, i, resolution);
    }
    const h = words[2 * i + HI];
    const l = words[2 * i + LO];
    if (tick >= blockEnd) {
      const start = Math.floor(tick / blockTicks) * blockTicks;
      blockEnd = start + blockTicks;
      counts[blocks++] = 1;
      const headHi = Math.floor(start / 2 ** 32);
      w.write(headHi >>> 0, 32);
      w.write(start - headHi * 2 ** 32, 32);
      prevDelta = tick - start;
      w.write(prevDelta, firstBits);
      w.write(h, 32);
      w.write(l, 32);
      lead = -1;
    } else {
      counts[blocks - 1]++;
      const delta = tick - prevTick;
      const d = delta - prevDelta;
      prevDelta = delta;
      if (d === 0) w.write(0, 1);
      else if (d >= -63 && d <= 64) w.write(0x100 | (d + 63), 9); // '10' + 7 bits
      else if (d >= -255 && d <= 256) w.write(0xc00 | (d + 255), 12); // '110' + 9 bits
      else if (d >= -2047 && d <= 2048) w.write(0xe000 | (d + 2047), 16); // '1110' + 12 bits
      else {
        w.write(15, 4); // '1111' + 32 bits, two's complement
        w.write(d >>> 0, 32);
      }
      const xh = (h ^ hi) >>> 0;
      const xl = (l ^ lo) >>> 0;
      if (xh === 0 && xl === 0) {
        w.write(0, 1);
      } else {
        let leading = xh !== 0 ? Math.clz32(xh) : 32 + Math.clz32(xl);
        if (leading > 31) leading = 31;
        const trailing = xl !== 0 ? 31 - Math.clz32(xl & -xl) : 32 + 31 - Math.clz32(xh & -xh);
        if (lead >= 0 && leading >= lead && trailing >= trail) {
          w.write(2, 2);
        } else {
          lead = leading;
          trail = trailing;
          const meaningful = 64 - lead - trail;
          w.write(3, 2);
          w.write(lead, 5);
          w.write(meaningful === 64 ? 0 : meaningful, 6);
        }
        writeMeaningful(w, xh, xl, 64 - lead - trail, trail);
      }
    }
    prevTick = tick;
    hi = h;
    lo = l;
  }
  return blocks;
}

/** Writes the `bits` bits of (xh, xl) above its `trail` trailing bits. */
function writeMeaningful(w: BitWriter, xh: number, xl: number, bits: number, trail: number): void {
  let sh: number;
  let sl: number;
  if (trail >= 32) {
    sh = 0;
    sl = xh >>> (trail - 32);
  } else if (trail === 0) {
    sh = xh;
    sl = xl;
  } else {
    sh = xh >>> trail;
    sl = ((xl >>> trail) | (xh << (32 - trail))) >>> 0;
  }
  if (bits > 32) {
    w.write(sh, bits - 32);
    w.write(sl, 32);
  } else {
    w.write(sl, bits);
  }
}


function timestampError(t: Float64Array, i: number, resolution: number): SeriesError {
  if (i > 0 && !(t[i] > t[i - 1])) return new SeriesError(`t[${i}] = ${t[i]} is not after t[${i - 1}] = ${t[i - 1]}`, i);
  return new SeriesError(`t[${i}] = ${t[i]} is not a whole number of ${resolution} ms ticks`, i);
}
