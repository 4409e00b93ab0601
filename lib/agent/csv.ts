import { ISO_LOCAL, ISO_OFFSET, parseIso, parseQuality } from "@/lib/preview/csv-fields";
import { LOCAL_REPEATED, LOCAL_SKIPPED, LocalTimeResolver } from "@/lib/preview/local-time";
import type { OutputRow } from "./switch";

/** The output file's header. */
export const OUTPUT_HEADER = "tag,output,time,value,quality";

/** The fields of one CSV line (RFC 4180: quoted fields, "" for a quote inside one); null for an unclosed quote. */
export function splitCsvLine(line: string): string[] | null {
  const fields: string[] = [];
  let i = 0;
  for (;;) {
    if (line[i] === '"') {
      let value = "";
      let j = i + 1;
      for (;;) {
        const q = line.indexOf('"', j);
        if (q < 0) return null;
        value += line.slice(j, q);
        if (line[q + 1] === '"') {
          value += '"';
          j = q + 2;
          continue;
        }
        j = q + 1;
        break;
      }
      fields.push(value);
      const next = line.indexOf(",", j);
      if (next < 0) return fields;
      i = next + 1;
    } else {
      const next = line.indexOf(",", i);
      fields.push((next < 0 ? line.slice(i) : line.slice(i, next)).trim());
      if (next < 0) return fields;
      i = next + 1;
    }
  }
}

export type InputColumns = { tag: number; time: number; value: number; quality: number };

/** The columns of the input header `tag,time,value[,quality]` (by name, any order, case-insensitive). Throws when one is missing. */
export function readInputHeader(line: string): InputColumns {
  const names = (splitCsvLine(line.replace(/^\uFEFF/, "").replace(/\r$/, "")) ?? []).map((n) => n.trim().toLowerCase());
  const cols = { tag: names.indexOf("tag"), time: names.indexOf("time"), value: names.indexOf("value"), quality: names.indexOf("quality") };
  const missing = (["tag", "time", "value"] as const).filter((k) => cols[k] < 0);
  if (missing.length > 0) throw new Error(`the input's header needs the columns tag,time,value[,quality]; ${missing.join(", ")} missing (got "${line.slice(0, 80)}")`);
  return cols;
}

export type InputSample = { tag: string; t: number; v: number; q: number };

const EPOCH = /^-?\d+(?:\.\d+)?$/;

/**
 * Reads data rows: `time` is epoch ms or ISO 8601 — with an offset or `Z`, or without one
 * in the site's time zone (DESIGN.md "Signals"; a skipped spring time is refused, the
 * repeated autumn hour is read by each tag's row order: the earlier instant until the
 * tag's wall time steps back inside that hour); `value` a decimal number (anything on a
 * bad sample, read as NaN); `quality` 0/1/2 or good/uncertain/bad, default 0.
 */
export class InputReader {
  private resolver: LocalTimeResolver;
  private zone: string;
  private readonly local = new Map<string, { wall: number; change: number; second: boolean }>();
  private readonly out = new Float64Array(1);

  constructor(
    private readonly cols: InputColumns,
    timeZone: string,
  ) {
    this.zone = timeZone;
    this.resolver = new LocalTimeResolver(timeZone);
  }

  /** Local times are read in this zone from now on (a new bundle may name another). */
  setTimeZone(timeZone: string) {
    if (timeZone === this.zone) return;
    this.zone = timeZone;
    this.resolver = new LocalTimeResolver(timeZone);
    this.local.clear();
  }

  /** A data line as a sample, or a problem in words. */
  read(line: string): InputSample | string {
    const f = splitCsvLine(line.replace(/\r$/, ""));
    if (f === null) return "a quoted field is not closed";
    const { tag: tc, time: timeCol, value: vc, quality: qc } = this.cols;
    const tag = f[tc];
    const time = f[timeCol];
    if (!tag) return "no tag";
    if (time === undefined || f[vc] === undefined) return "too few fields";
    const qText = qc >= 0 ? (f[qc] ?? "") : "";
    const q = qText === "" ? 0 : parseQuality(qText, 0, qText.length);
    if (q < 0) return `quality "${qText}" is not 0, 1, 2, good, uncertain or bad`;
    const t = this.time(tag, time);
    if (typeof t === "string") return t;
    const value = f[vc] === "" ? Number.NaN : Number(f[vc]);
    if (!Number.isFinite(value) && q !== 2) return `value "${f[vc]}" is not a number`;
    return { tag, t, v: Number.isFinite(value) ? value : Number.NaN, q };
  }

  private time(tag: string, text: string): number | string {
    if (EPOCH.test(text)) return Number(text);
    const kind = parseIso(text, 0, text.length, this.out);
    if (kind === ISO_OFFSET) return this.out[0];
    if (kind !== ISO_LOCAL) return `time "${text}" is neither epoch ms nor ISO 8601`;
    const wall = this.out[0];
    const r = this.resolver;
    const found = r.resolve(wall);
    if (found === LOCAL_SKIPPED) return `${text} does not exist in ${this.zone} (the clocks skip it)`;
    if (found !== LOCAL_REPEATED) {
      this.local.set(tag, { wall, change: Number.NaN, second: false });
      return r.first;
    }
    const before = this.local.get(tag);
    const second = before !== undefined && before.change === r.changeAt && (before.second || wall <= before.wall);
    this.local.set(tag, { wall, change: r.changeAt, second });
    return second ? r.second : r.first;
  }
}

const quote = (s: string) => (/[",\r\n]|^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** One output line (with its newline): ISO 8601 UTC time, the value in its shortest form (empty when not a number). */
export function formatRow(row: OutputRow): string {
  const value = Number.isFinite(row.v) ? String(row.v) : "";
  return `${quote(row.tag)},${quote(row.output)},${new Date(row.t).toISOString()},${value},${row.q}\n`;
}
