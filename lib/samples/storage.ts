import "server-only";
import { deflateRawSync, inflateRawSync } from "node:zlib";
import { gorillaDecode, gorillaEncode, type Series } from "@/lib/reduction";

/**
 * How a saved sample set is stored: `gorilla/1` when every timestamp is a whole number
 * of ms (times and values Gorilla-encoded, lossless — Pelkonen et al., PVLDB 8(12),
 * 2015, as lib/reduction implements it), otherwise `f64-deflate/1` (the raw arrays,
 * deflated). Quality, when present, follows as runs (u32 length, u8 value), deflated.
 */
export function packSeries(s: Series): { encoding: string; data: Buffer } {
  const integral = s.t.every((x) => Number.isInteger(x));
  const quality = packQuality(s.q);
  if (integral) {
    const e = gorillaEncode({ t: s.t, v: s.v });
    const head = Buffer.alloc(16);
    head.writeUInt32LE(e.bitLength, 0);
    head.writeUInt32LE(e.blockCounts.length, 4);
    head.writeUInt32LE(e.bytes.length, 8);
    head.writeUInt32LE(quality.length, 12);
    const counts = Buffer.from(e.blockCounts.buffer, e.blockCounts.byteOffset, e.blockCounts.byteLength);
    return { encoding: "gorilla/1", data: Buffer.concat([head, counts, Buffer.from(e.bytes), quality]) };
  }
  const raw = Buffer.concat([Buffer.from(s.t.buffer, s.t.byteOffset, s.t.byteLength), Buffer.from(s.v.buffer, s.v.byteOffset, s.v.byteLength)]);
  const packed = deflateRawSync(raw);
  const head = Buffer.alloc(12);
  head.writeUInt32LE(s.t.length, 0);
  head.writeUInt32LE(packed.length, 4);
  head.writeUInt32LE(quality.length, 8);
  return { encoding: "f64-deflate/1", data: Buffer.concat([head, packed, quality]) };
}

export function unpackSeries(encoding: string, data: Buffer): Series {
  let series: Series;
  let rest: Buffer;
  if (encoding === "gorilla/1") {
    const bitLength = data.readUInt32LE(0);
    const blocks = data.readUInt32LE(4);
    const bytes = data.readUInt32LE(8);
    let at = 16;
    const blockCounts = new Uint32Array(data.buffer.slice(data.byteOffset + at, data.byteOffset + at + 4 * blocks));
    at += 4 * blocks;
    const encoded = new Uint8Array(data.subarray(at, at + bytes));
    at += bytes;
    series = gorillaDecode({ bytes: encoded, bitLength, blockCounts, resolutionMs: 1, blockMs: 7_200_000 });
    rest = data.subarray(at);
  } else if (encoding === "f64-deflate/1") {
    const n = data.readUInt32LE(0);
    const packed = data.readUInt32LE(4);
    const raw = inflateRawSync(data.subarray(12, 12 + packed));
    const copy = new Uint8Array(raw).buffer;
    series = { t: new Float64Array(copy, 0, n), v: new Float64Array(copy, 8 * n, n) };
    rest = data.subarray(12 + packed);
  } else {
    throw new Error(`unknown sample-set encoding ${encoding}`);
  }
  if (rest.length > 0) series.q = unpackQuality(rest, series.t.length);
  return series;
}

function packQuality(q: Uint8Array | undefined): Buffer {
  if (!q || q.length === 0) return Buffer.alloc(0);
  const runs: number[] = [];
  let value = q[0];
  let length = 1;
  for (let i = 1; i < q.length; i++) {
    if (q[i] === value) length++;
    else {
      runs.push(length, value);
      value = q[i];
      length = 1;
    }
  }
  runs.push(length, value);
  const out = Buffer.alloc((runs.length / 2) * 5);
  for (let k = 0; k < runs.length; k += 2) {
    out.writeUInt32LE(runs[k], (k / 2) * 5);
    out.writeUInt8(runs[k + 1], (k / 2) * 5 + 4);
  }
  return deflateRawSync(out);
}

function unpackQuality(packed: Buffer, n: number): Uint8Array {
  const runs = inflateRawSync(packed);
  const q = new Uint8Array(n);
  let i = 0;
  for (let at = 0; at < runs.length; at += 5) {
    const length = runs.readUInt32LE(at);
    q.fill(runs.readUInt8(at + 4), i, i + length);
    i += length;
  }
  return q;
}
