/** The parts of Sluice's Gorilla format shared by its encoder and decoder (see gorilla.ts). */

export type GorillaOptions = {
  /** Timestamp resolution in ms (default 1: epoch ms, lossless for Sluice's series; the paper uses 1000). */
  resolutionMs?: number;
  /** Block length in ms; each block starts with its own header (default 2 h, as in the paper). */
  blockMs?: number;
};

export type GorillaEncoded = {
  bytes: Uint8Array;
  bitLength: number;
  /** Samples per block, in order: framing a receiver keeps beside the bits (not counted in bitLength). */
  blockCounts: Uint32Array;
  resolutionMs: number;
  blockMs: number;
};

export const TWO_HOURS = 7_200_000;
const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;
/** Index of the high and low 32-bit word of a float64 in a Uint32Array view (platform byte order). */
export const HI_WORD = LITTLE_ENDIAN ? 1 : 0;
export const LO_WORD = 1 - HI_WORD;

/** Width of the first delta: the paper's 14 bits, or as many as a block's ticks need. */
export function firstDeltaBits(blockTicks: number): number {
  return Math.max(14, 32 - Math.clz32(blockTicks - 1));
}

/** Checks the options; returns [resolutionMs, block length in ticks]. */
export function checkOptions(o: GorillaOptions): [number, number] {
  const resolution = o.resolutionMs ?? 1;
  const blockMs = o.blockMs ?? TWO_HOURS;
  if (!(Number.isFinite(resolution) && resolution > 0)) throw new RangeError(`resolutionMs must be > 0, got ${resolution}`);
  const blockTicks = blockMs / resolution;
  if (!Number.isInteger(blockTicks) || blockTicks < 1 || blockTicks > 2 ** 31 - 1) {
    throw new RangeError(`blockMs must be a whole number (1 to 2³¹ − 1) of resolutionMs, got ${blockMs}`);
  }
  return [resolution, blockTicks];
}
