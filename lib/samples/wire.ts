import type { Series } from "@/lib/reduction";

/**
 * Our binary form of a sample series between the browser and the server (no per-sample
 * objects, no text): a 16-byte header — "SLSW", version, sample count, flags (bit 0:
 * quality present), little-endian — then t (Float64 × n), v (Float64 × n) and, with
 * quality, q (Uint8 × n). Float arrays start at byte 16, so they can be viewed in place.
 */
export const WIRE_MAGIC = 0x57534c53; // "SLSW" read as a little-endian u32
const HEADER = 16;

export function encodeSeriesWire(s: Series): ArrayBuffer {
  const n = s.t.length;
  const hasQ = s.q !== undefined;
  const buf = new ArrayBuffer(HEADER + 16 * n + (hasQ ? n : 0));
  const view = new DataView(buf);
  view.setUint32(0, WIRE_MAGIC, true);
  view.setUint32(4, 1, true);
  view.setUint32(8, n, true);
  view.setUint32(12, hasQ ? 1 : 0, true);
  new Float64Array(buf, HEADER, n).set(s.t);
  new Float64Array(buf, HEADER + 8 * n, n).set(s.v);
  if (hasQ) new Uint8Array(buf, HEADER + 16 * n, n).set(s.q!);
  return buf;
}

/** The series in a wire buffer, or a message saying what is wrong with it. */
export function decodeSeriesWire(buf: ArrayBuffer): { ok: true; series: Series } | { ok: false; message: string } {
  if (buf.byteLength < HEADER) return { ok: false, message: "the body is shorter than the 16-byte header" };
  const view = new DataView(buf);
  if (view.getUint32(0, true) !== WIRE_MAGIC) return { ok: false, message: "the body does not start with SLSW" };
  if (view.getUint32(4, true) !== 1) return { ok: false, message: `unknown version ${view.getUint32(4, true)}` };
  const n = view.getUint32(8, true);
  const hasQ = (view.getUint32(12, true) & 1) === 1;
  const expected = HEADER + 16 * n + (hasQ ? n : 0);
  if (buf.byteLength !== expected) return { ok: false, message: `a body of ${n} samples is ${expected} bytes, got ${buf.byteLength}` };
  const t = new Float64Array(buf.slice(HEADER, HEADER + 8 * n));
  const v = new Float64Array(buf.slice(HEADER + 8 * n, HEADER + 16 * n));
  return { ok: true, series: hasQ ? { t, v, q: new Uint8Array(buf.slice(HEADER + 16 * n)) } : { t, v } };
}
