/**
 * Bit streams, most significant bit first, on 32-bit words: what the Gorilla encoder
 * writes and its decoder reads. Fields are at most 32 bits; wider ones are written as
 * two fields.
 */
export class BitWriter {
  private words: Uint32Array;
  private word = 0;
  private used = 0;
  bitLength = 0;

  /** `expected`: about how many 32-bit words will be written (the buffer grows past it). */
  constructor(expected = 1024) {
    this.words = new Uint32Array(Math.max(16, expected));
  }

  /** Appends the low `bits` bits of `value` (0 ≤ bits ≤ 32, value < 2^bits). */
  write(value: number, bits: number): void {
    if (bits === 0) return;
    this.bitLength += bits;
    const free = 32 - this.used;
    if (bits < free) {
      this.words[this.word] |= value << (free - bits);
      this.used += bits;
      return;
    }
    const rest = bits - free;
    this.words[this.word] |= rest === 0 ? value : value >>> rest;
    this.next();
    if (rest > 0) {
      this.words[this.word] = value << (32 - rest);
      this.used = rest;
    }
  }

  /** The bits as bytes (the last byte zero-padded). */
  bytes(): Uint8Array {
    const out = new Uint8Array(Math.ceil(this.bitLength / 8));
    for (let i = 0; i < out.length; i++) out[i] = (this.words[i >>> 2] >>> (24 - 8 * (i & 3))) & 0xff;
    return out;
  }

  private next(): void {
    this.word++;
    this.used = 0;
    if (this.word === this.words.length) {
      const grown = new Uint32Array(this.words.length * 2);
      grown.set(this.words);
      this.words = grown;
    }
  }
}

export class BitReader {
  private readonly words: Uint32Array;
  position = 0;

  constructor(
    bytes: Uint8Array,
    readonly bitLength: number,
  ) {
    this.words = new Uint32Array(Math.ceil(bytes.length / 4) + 1);
    for (let i = 0; i < bytes.length; i++) this.words[i >>> 2] |= bytes[i] << (24 - 8 * (i & 3));
  }

  /** Reads `bits` bits (0–32) as an unsigned number; throws past the end. */
  read(bits: number): number {
    if (bits === 0) return 0;
    if (this.position + bits > this.bitLength) throw new RangeError(`the bit stream ends at bit ${this.bitLength}`);
    const w = this.position >>> 5;
    const off = this.position & 31;
    this.position += bits;
    const avail = 32 - off;
    const head = off === 0 ? this.words[w] : (this.words[w] << off) >>> off;
    if (bits <= avail) return head >>> (avail - bits);
    const rest = bits - avail;
    return head * 2 ** rest + (this.words[w + 1] >>> (32 - rest));
  }
}
