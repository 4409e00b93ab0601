// Gorilla compression — T. Pelkonen, S. Franklin, J. Teller, P. Cavallaro, Q. Huang,
// J. Meza, K. Veeraraghavan, "Gorilla: A Fast, Scalable, In-Memory Time Series
// Database", PVLDB 8(12), 2015, section 4.1 and Figure 2. Field widths the paper leaves
// open are settled as gorilla.ts documents them.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { encodedBits, gorillaDecode, gorillaEncode, type Series, SeriesError } from "@/lib/reduction";
import { series } from "./helpers";

const bitsOf = (bytes: Uint8Array, length: number) =>
  Array.from(bytes, (b) => b.toString(2).padStart(8, "0"))
    .join("")
    .slice(0, length);
const field = (value: number | bigint, width: number) => BigInt(value).toString(2).padStart(width, "0");
const float64Bits = (x: number) => {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  return field(view.getBigUint64(0), 64);
};
/** The 64 bits of each value, as two unsigned words per value (hi, lo), for bit-exact comparison. */
const words = (v: Float64Array) => {
  const view = new DataView(v.buffer, v.byteOffset, v.byteLength);
  return Array.from(v, (_, i) => [view.getUint32(8 * i, true), view.getUint32(8 * i + 4, true)]);
};

describe("Figure 2 of the paper", () => {
  // Header March 24, 2015 02:00:00 (UTC here; two-hour aligned), then three points:
  // 02:01:02 → 12, 02:02:02 → 12, 02:03:02 → 24, timestamps in seconds.
  const at = (m: number, s: number) => Date.UTC(2015, 2, 24, 2, m, s);
  const fig2 = series([at(1, 2), at(2, 2), at(3, 2)], [12, 12, 24]);
  const seconds = { resolutionMs: 1000 };

  it("encodes in 167 bits", () => {
    expect(encodedBits(fig2, seconds)).toBe(167);
  });

  it("field by field: 64 + 14 + 64 + 9 + 1 + 1 + 14 bits", () => {
    const e = gorillaEncode(fig2, seconds);
    const expected = [
      field(Date.UTC(2015, 2, 24, 2) / 1000, 64), // header: the block start, 64 bits
      field(62, 14), // first delta from the header: 62 s in 14 bits
      float64Bits(12), // first value, 64 bits
      `10${field(-2 + 63, 7)}`, // D = 60 − 62 = −2 in [−63, 64]: '10' + 7 bits (D + 63, Sluice's settlement)
      "0", // 12 XOR 12 = 0
      "0", // D = 0
      `11${field(11, 5)}${field(1, 6)}1`, // 24 XOR 12: 11 leading zeros, 1 meaningful bit; no previous window → '11'
    ].join("");
    expect(e.bitLength).toBe(167);
    expect(bitsOf(e.bytes, e.bitLength)).toBe(expected);
    expect(e.bytes.length).toBe(21);
    expect(Array.from(e.blockCounts)).toEqual([3]);
    expect(gorillaDecode(e)).toEqual(fig2);
  });
});

describe("costs of the paper's cases", () => {
  const start = Date.UTC(2026, 0, 1) + 5_000; // 5 s into a two-hour block
  const regular = (n: number, value = 3.25) =>
    series(
      Array.from({ length: n }, (_, i) => start + i * 1000),
      Array.from({ length: n }, () => value),
    );

  it("a constant value at a fixed interval costs 2 bits a sample after the first two", () => {
    const two = encodedBits(regular(2));
    // ms resolution: header 64, first delta 23 bits (2 h of ms), value 64; then D = 1000 − 5000 in '1111' + 32 bits, '0'.
    expect(two).toBe(64 + 23 + 64 + 36 + 1);
    for (const n of [3, 10, 1000, 7000]) expect(encodedBits(regular(n)) - two).toBe(2 * (n - 2));
  });

  it("delta of delta: '10' + 7 bits up to [−63, 64], '110' + 9 to [−255, 256], '1110' + 12 to [−2047, 2048], else '1111' + 32", () => {
    const cost = (d: number) => {
      const t = [start, start + 5000, start + 10_000 + d];
      return encodedBits(series(t, [1, 1, 1])) - encodedBits(series(t.slice(0, 2), [1, 1])) - 1;
    };
    expect(cost(0)).toBe(1);
    for (const d of [-63, -1, 1, 64]) expect(cost(d)).toBe(9);
    for (const d of [-255, -64, 65, 256]) expect(cost(d)).toBe(12);
    for (const d of [-2047, -256, 257, 2048]) expect(cost(d)).toBe(16);
    for (const d of [-2048, 2049, 3_000_000]) expect(cost(d)).toBe(36);
  });

  it("XOR: leading zeros above 31 are stored as 31; a 64-bit meaningful length is stored as 0", () => {
    // 1 and its successor differ in the last bit: 63 leading zeros → 31 stored, 33 meaningful bits.
    const next = 1 + 2 ** -52;
    const small = series([start, start + 1000], [1, next]);
    expect(encodedBits(small) - encodedBits(series([start], [1]))).toBe(36 + 2 + 5 + 6 + 33);
    // Sign bit and last bit differ: 0 leading, 0 trailing zeros, 64 meaningful bits.
    const v = new Float64Array(2);
    const view = new DataView(v.buffer);
    view.setFloat64(0, 1.5, true);
    view.setUint32(12, view.getUint32(4, true) ^ 0x80000000, true);
    view.setUint32(8, 1, true);
    const wide = { t: Float64Array.from([start, start + 1000]), v };
    expect(encodedBits(wide) - encodedBits(series([start], [1.5]))).toBe(36 + 2 + 5 + 6 + 64);
    for (const s of [small, wide]) expect(words(gorillaDecode(gorillaEncode(s)).v)).toEqual(words(s.v));
  });

  it("a sample in the next two-hour block starts a new block with its own header", () => {
    const block = Date.UTC(2026, 0, 1, 2);
    expect(encodedBits(series([block - 1000, block], [1, 1]))).toBe(2 * (64 + 23 + 64));
    expect(Array.from(gorillaEncode(series([block - 1000, block, block + 5], [1, 1, 1])).blockCounts)).toEqual([1, 2]);
  });

  it("an empty series costs nothing; bad timestamps and options are refused", () => {
    expect(encodedBits(series([], []))).toBe(0);
    expect(() => encodedBits(series([0, 0], [1, 1]))).toThrow(SeriesError);
    expect(() => encodedBits(series([0, 1500], [1, 1]), { resolutionMs: 1000 })).toThrow(/ticks/);
    expect(() => encodedBits(series([0], [1]), { blockMs: 1500, resolutionMs: 1000 })).toThrow(/blockMs/);
  });
});

// Values that stress the XOR coding: specials, repeats and NaNs with payloads.
const SPECIAL = [0, -0, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, Number.MIN_VALUE, -Number.MAX_VALUE, 1, 1 + 2 ** -52, 12, 24];
const valueBits = fc.oneof(
  fc.constantFrom(...SPECIAL).map((x) => ({ x, payload: undefined as number | undefined })),
  fc.double().map((x) => ({ x, payload: undefined as number | undefined })),
  fc.integer({ min: 1, max: 0xfffff }).map((payload) => ({ x: Number.NaN, payload })), // NaN with a payload (and either sign)
);

const arbitrarySeries = fc
  .tuple(
    fc.integer({ min: -2e12, max: 4e12 }), // start: before 1970 too (negative block headers)
    fc.array(fc.tuple(fc.constantFrom(1, 1, 1000, 1000, 999, 1001, 60_000, 7_200_000, 90_000_000_000), valueBits, fc.boolean()), { maxLength: 300 }),
  )
  .map(([start, rows]) => {
    let now = start;
    const t = new Float64Array(rows.length);
    const v = new Float64Array(rows.length);
    const view = new DataView(v.buffer);
    rows.forEach(([dt, { x, payload }, negative], i) => {
      now += dt;
      t[i] = now;
      v[i] = x;
      if (payload !== undefined) {
        view.setUint32(8 * i + 4, (negative ? 0xfff00000 : 0x7ff00000) | payload, true);
        view.setUint32(8 * i, 0x9e3779b9 ^ payload, true);
      }
    });
    return { t, v } as Series;
  });

describe("round trip (fast-check)", () => {
  it("decodes every series bit for bit: timestamps, −0, NaN payloads and ±Infinity", () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.constantFrom(1, 1, 1000), (s, resolutionMs) => {
        const input = resolutionMs === 1 ? s : { t: s.t.map((x) => x * 1000), v: s.v };
        const e = gorillaEncode(input, { resolutionMs });
        expect(e.bitLength).toBe(encodedBits(input, { resolutionMs }));
        expect(e.bytes.length).toBe(Math.ceil(e.bitLength / 8));
        const back = gorillaDecode(e);
        expect(Array.from(back.t)).toEqual(Array.from(input.t));
        expect(words(back.v)).toEqual(words(input.v));
      }),
      { seed: 20261210, numRuns: 300 },
    );
  });
});
