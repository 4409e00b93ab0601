import { describe, expect, it, vi } from "vitest";
import fc from "fast-check";

vi.mock("server-only", () => ({}));
const { packSeries, unpackSeries } = await import("@/lib/samples/storage");
const { decodeSeriesWire, encodeSeriesWire } = await import("@/lib/samples/wire");

const bits = (a: Float64Array) => Array.from(new Uint32Array(a.buffer.slice(a.byteOffset, a.byteOffset + a.byteLength)));

const arbitrary = fc
  .array(fc.tuple(fc.integer({ min: 1, max: 100_000 }), fc.double(), fc.integer({ min: 0, max: 2 })), { minLength: 0, maxLength: 400 })
  .chain((rows) =>
    fc.boolean().map((fractional) => {
      let now = 1_790_000_000_000;
      const t = Float64Array.from(rows, ([dt]) => (now += dt) + (fractional ? 0.5 : 0));
      return { t, v: Float64Array.from(rows, ([, x]) => x), q: Uint8Array.from(rows, ([, , q]) => q) };
    }),
  );

describe("sample-set storage and wire format", () => {
  it("round-trips any series bit for bit (NaN, −0, ±Infinity values; whole and fractional ms) with quality", () => {
    fc.assert(
      fc.property(arbitrary, (s) => {
        const { encoding, data } = packSeries(s);
        expect(encoding).toBe(s.t.every(Number.isInteger) ? "gorilla/1" : "f64-deflate/1");
        const back = unpackSeries(encoding, data);
        expect(bits(back.t)).toEqual(bits(s.t));
        expect(bits(back.v)).toEqual(bits(s.v));
        if (s.q.length) expect(Array.from(back.q!)).toEqual(Array.from(s.q));
        const wire = decodeSeriesWire(encodeSeriesWire(s));
        expect(wire.ok).toBe(true);
        if (wire.ok) {
          expect(bits(wire.series.v)).toEqual(bits(s.v));
          expect(Array.from(wire.series.q!)).toEqual(Array.from(s.q));
        }
      }),
      { seed: 20261202, numRuns: 200 },
    );
  });

  it("stores a regular 1 s series in far fewer bytes than the raw 16 per sample (Gorilla, Pelkonen et al. 2015)", () => {
    const n = 100_000;
    const t = Float64Array.from({ length: n }, (_, i) => 1_790_000_000_000 + i * 1000);
    const v = Float64Array.from({ length: n }, (_, i) => Math.round(700 + 50 * Math.sin(i / 500)) / 10);
    const { data } = packSeries({ t, v });
    expect(data.length).toBeLessThan(0.5 * 16 * n);
  });

  it("names what is wrong with a bad wire body", () => {
    expect(decodeSeriesWire(new ArrayBuffer(3))).toEqual({ ok: false, message: "the body is shorter than the 16-byte header" });
    const good = encodeSeriesWire({ t: Float64Array.of(1, 2), v: Float64Array.of(3, 4) });
    expect(decodeSeriesWire(good.slice(0, good.byteLength - 1))).toMatchObject({ ok: false, message: expect.stringMatching(/2 samples is 48 bytes, got 47/) });
    const wrong = good.slice(0);
    new DataView(wrong).setUint32(0, 0x12345678, true);
    expect(decodeSeriesWire(wrong)).toMatchObject({ ok: false, message: "the body does not start with SLSW" });
  });
});
