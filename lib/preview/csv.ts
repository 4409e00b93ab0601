import type { Series } from "@/lib/reduction";
import { ISO_BAD, ISO_LOCAL, ISO_OFFSET, parseDecimal, parseIso, parseQuality, splitFields } from "./csv-fields";
import { type CsvHeader, readHeader } from "./csv-header";
import { LOCAL_REPEATED, LOCAL_SKIPPED, LocalTimeResolver } from "./local-time";

/** The most data rows a sample CSV may hold (issue #8: a preview runs in the browser). */
export const SAMPLE_CSV_MAX_ROWS = 2_000_000;

/** A problem with a sample CSV; `line` is the 1-based line of the file (the header is line 1). */
export type CsvProblem = { line: number; message: string };
export type TimestampFormat = "iso-offset" | "iso-local" | "epoch-s" | "epoch-ms";
export type ParsedSamples =
  | { ok: true; series: Series; rows: number; format: TimestampFormat; columns: { time: string; value: string; quality: string | null } }
  | { ok: false; problems: CsvProblem[] };

const MAX_PROBLEMS = 20;
const FORMATS: TimestampFormat[] = ["iso-offset", "iso-local", "epoch-s", "epoch-ms"];
const F_UNKNOWN = -1;
const F_ISO_OFFSET = 0;
const F_ISO_LOCAL = 1;
const F_EPOCH_S = 2;
const F_EPOCH_MS = 3;
/** Epoch values below this are seconds, at or above it milliseconds (1e11 s is the year 5138, 1e11 ms is 1973). */
const EPOCH_MS_FROM = 1e11;
/** The ECMAScript time value range (ECMA-262 §21.4.1.1): ±8.64e15 ms. */
const MAX_TIME = 8.64e15;

/**
 * Reads a sample-data CSV (timestamp, value, optional quality) into a {@link Series} —
 * RFC 4180 fields (quoted fields within a line, CRLF or LF line ends), common practice for the rest:
 * - a header row names the columns (case-insensitive): time `time`/`timestamp`/`ts`/`t`/
 *   `datetime`, value `value`/`v`/`pv`/`val`, optional quality `quality`/`q`/`status`
 *   as 0/1/2 or good/uncertain/bad (OPC UA severities); other columns are ignored;
 * - the separator is `,`, `;` or tab, whichever makes the header name a time and a value
 *   column; with `;` a decimal comma is read as a decimal point (spreadsheet exports);
 * - a byte order mark, blank lines and spaces around fields are ignored;
 * - timestamps are all ISO 8601 with an offset or `Z`, all ISO 8601 without one (read
 *   in `opts.timeZone`), or all epoch numbers (below 1e11 seconds, else milliseconds,
 *   decided by the first row; fractions allowed), and must strictly ascend;
 * - a wall-clock time the zone skips (spring forward) is a problem; one it repeats
 *   (autumn) is read by row order: the first pass through the repeated hour takes the
 *   earlier instant, and once a row's wall time is not after the previous row's inside
 *   that hour, the later one (a file that starts inside the second pass cannot be told
 *   apart and is read as the first);
 * - a value is a finite decimal number, except on a bad sample, whose value may be
 *   anything (empty, NaN, a status text such as "Comm Fail"): it is read as NaN.
 *
 * Problems come with their line numbers, the first 20 of them. More than `maxRows`
 * (default {@link SAMPLE_CSV_MAX_ROWS}) data rows is a problem at the first row over.
 */
export function parseSampleCsv(text: string, opts: { timeZone: string; maxRows?: number }): ParsedSamples {
  const resolver = new LocalTimeResolver(opts.timeZone);
  const maxRows = opts.maxRows ?? SAMPLE_CSV_MAX_ROWS;
  if (!(Number.isInteger(maxRows) && maxRows > 0)) throw new RangeError(`maxRows must be a positive integer, got ${maxRows}`);
  const start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const header = readHeader(text, start);
  if ("problem" in header) return { ok: false, problems: [{ line: 1, message: header.problem }] };
  const capacity = Math.min(countLines(text, header.next), maxRows);
  const st: ScanState = {
    header,
    maxRows,
    zone: opts.timeZone,
    resolver,
    t: new Float64Array(capacity),
    v: new Float64Array(capacity),
    q: header.quality < 0 ? undefined : new Uint8Array(capacity),
    rows: 0,
    format: F_UNKNOWN,
    problems: [],
  };
  scanRows(text, st);
  if (st.problems.length === 0 && st.rows === 0) st.problems.push({ line: 2, message: "the file has a header but no data rows" });
  if (st.problems.length > 0) return { ok: false, problems: st.problems.slice(0, MAX_PROBLEMS) };
  const n = st.rows;
  // Views when the arrays are (nearly) full, as they are without blank lines; copies otherwise.
  const fit = <A extends Float64Array | Uint8Array>(a: A): A => (a.length - n <= 16 ? a.subarray(0, n) : a.slice(0, n)) as A;
  const series: Series = { t: fit(st.t), v: fit(st.v) };
  if (st.q !== undefined) series.q = fit(st.q);
  return { ok: true, series, rows: n, format: FORMATS[st.format], columns: header.names };
}

type ScanState = {
  header: CsvHeader;
  maxRows: number;
  zone: string;
  resolver: LocalTimeResolver;
  t: Float64Array;
  v: Float64Array;
  q: Uint8Array | undefined;
  rows: number;
  format: number;
  problems: CsvProblem[];
};

/** Lines from `from` on, not counting an empty last line. */
function countLines(text: string, from: number): number {
  let count = text.endsWith("\n") ? 0 : 1;
  for (let i = text.indexOf("\n", from); i >= 0; i = text.indexOf("\n", i + 1)) count++;
  return count;
}

const wallText = (w: number) => new Date(w).toISOString().slice(0, 19).replace("T", " ");

/** Scans every data row into st (ends with its loop: see lib/reduction/README.md). */
function scanRows(text: string, st: ScanState): void {
  const { t, v, q, resolver, problems, maxRows } = st;
  const { sep, time: tc, value: vc, quality: qc, next } = st.header;
  const sepCode = sep.charCodeAt(0);
  const comma = sep === ";";
  const need = Math.max(tc, vc, qc) + 1;
  const b = new Int32Array(2 * need);
  const iso = new Float64Array(1);
  const len = text.length;
  let format = st.format;
  let line = 1;
  let pos = next;
  let rows = 0;
  let prevT = -Infinity;
  let prevLine = 0;
  let prevWall = Number.NaN;
  let prevFold = Number.NaN;
  let secondPass = Number.NaN;
  const problem = (message: string): boolean => problems.push({ line, message }) >= MAX_PROBLEMS;
  while (pos <= len) {
    const nl = text.indexOf("\n", pos);
    let e = nl < 0 ? len : nl;
    const s = pos;
    pos = nl < 0 ? len + 1 : nl + 1;
    line++;
    if (e > s && text.charCodeAt(e - 1) === 13) e--;
    if (e === s) continue;
    if (++rows > maxRows) {
      problems.push({ line, message: `more than ${maxRows.toLocaleString("en")} data rows (the limit): line ${line.toLocaleString("en")} is row ${rows.toLocaleString("en")}` });
      break;
    }
    const fields = splitFields(text, s, e, sepCode, need, b);
    if (fields < need) {
      if (problem(`expected at least ${need} fields separated by "${sep === "\t" ? "tab" : sep}", found ${fields}`)) break;
      continue;
    }
    const ts = b[2 * tc];
    const te = b[2 * tc + 1];
    let time = Number.NaN;
    let why = "";
    if (format === F_UNKNOWN) format = st.format = detectFormat(text, ts, te);
    if (format === F_EPOCH_MS || format === F_EPOCH_S) {
      time = parseDecimal(text, ts, te, format === F_EPOCH_S ? 3 : 0, false);
      if (format === F_EPOCH_S ? !(Math.abs(time) < EPOCH_MS_FROM * 1000) : Math.abs(time) < EPOCH_MS_FROM) {
        const [was, is] = format === F_EPOCH_S ? ["seconds", "milliseconds"] : ["milliseconds", "seconds"];
        why = Number.isFinite(time) ? ` (looks like epoch ${is}, but the first row's is in epoch ${was})` : "";
        time = Number.NaN;
      }
    } else if (format !== F_UNKNOWN) {
      const code = parseIso(text, ts, te, iso);
      if (code === ISO_OFFSET && format === F_ISO_OFFSET) time = iso[0];
      else if (code === ISO_LOCAL && format === F_ISO_LOCAL) {
        const w = iso[0];
        if (w >= resolver.safeLo && w < resolver.safeHi) {
          time = w - resolver.safeOffset;
          prevFold = Number.NaN;
        } else {
          const found = resolver.resolve(w);
          if (found === LOCAL_SKIPPED) {
            why = ` (${wallText(w)} does not exist in ${st.zone}: the clocks jump forward at ${new Date(resolver.changeAt).toISOString()})`;
          } else if (found === LOCAL_REPEATED) {
            const fold = resolver.changeAt;
            if (secondPass !== fold && prevFold === fold && w <= prevWall) secondPass = fold;
            time = secondPass === fold ? resolver.second : resolver.first;
            prevFold = fold;
          } else {
            time = resolver.first;
            prevFold = Number.NaN;
          }
        }
        prevWall = w;
      } else if (code !== ISO_BAD) {
        why = format === F_ISO_OFFSET ? " (no UTC offset, but the first row has one)" : " (a UTC offset, but the first row has none)";
      }
    }
    if (!(Math.abs(time) <= MAX_TIME)) {
      if (problem(`bad timestamp "${text.slice(ts, te)}"${why}`)) break;
      continue;
    }
    let quality = 0;
    if (q !== undefined) {
      quality = parseQuality(text, b[2 * qc], b[2 * qc + 1]);
      if (quality < 0) {
        if (problem(`bad quality "${text.slice(b[2 * qc], b[2 * qc + 1])}" (0, 1, 2 or good, uncertain, bad)`)) break;
        continue;
      }
    }
    const vs = b[2 * vc];
    const ve = b[2 * vc + 1];
    let value = parseDecimal(text, vs, ve, 0, comma);
    if (!Number.isFinite(value)) {
      if (quality === 2) value = Number.NaN;
      else {
        const message = vs === ve ? "missing value (allowed only with bad quality)" : `bad number "${text.slice(vs, ve)}"`;
        if (problem(message)) break;
        continue;
      }
    }
    if (!(time > prevT)) {
      const message = time === prevT ? `duplicate timestamp (the same instant as line ${prevLine})` : `timestamp before line ${prevLine}'s: rows must ascend in time`;
      prevT = time;
      prevLine = line;
      if (problem(message)) break;
      continue;
    }
    prevT = time;
    prevLine = line;
    const k = rows - 1;
    t[k] = time;
    v[k] = value;
    if (q !== undefined) q[k] = quality;
    st.rows = rows;
  }
}

function detectFormat(text: string, s: number, e: number): number {
  const x = parseDecimal(text, s, e, 0, false);
  if (Number.isFinite(x)) return Math.abs(x) < EPOCH_MS_FROM ? F_EPOCH_S : F_EPOCH_MS;
  const code = parseIso(text, s, e, new Float64Array(1));
  return code === ISO_OFFSET ? F_ISO_OFFSET : code === ISO_LOCAL ? F_ISO_LOCAL : F_UNKNOWN;
}
