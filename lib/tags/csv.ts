import Papa from "papaparse";
import { TAG_KINDS, tagSchema, type TagValues } from "@/schemas/tag";

/**
 * CSV import and export of a site's tag inventory. CSV syntax follows RFC 4180 (quoted
 * fields, doubled quotes, line breaks inside quotes); export writes CRLF line ends (RFC 4180
 * §2.1) and a final CRLF. Import also accepts LF or CR line ends and semicolon- or
 * tab-separated files (common practice in spreadsheet exports).
 */

/** The canonical columns, in export order, with a label for the column-mapping form. */
export const TAG_CSV_COLUMNS = [
  { key: "name", label: "Tag name", required: true },
  { key: "unit", label: "Engineering unit", required: true },
  { key: "sample_period_ms", label: "Sample period (ms)", required: true },
  { key: "kind", label: "Kind (analog, discrete, counter)", required: true },
  { key: "eu_low", label: "Engineering range low", required: false },
  { key: "eu_high", label: "Engineering range high", required: false },
  { key: "area", label: "Area", required: false },
  { key: "equipment", label: "Equipment", required: false },
  { key: "gateway", label: "Gateway (slug)", required: true },
] as const;
export type TagCsvField = (typeof TAG_CSV_COLUMNS)[number]["key"];
/** Canonical field → index of the file's column holding it (null or absent: not in the file). */
export type Mapping = Partial<Record<TagCsvField, number | null>>;
export type TagCsvError = { line: number; field?: TagCsvField; reason: string };
export type TagCsvResult = { headers: string[]; mapping: Mapping; rows: TagValues[]; errors: TagCsvError[] };
export type TagCsvOptions = {
  /** Column mapping; `suggestMapping(headers)` when absent. */
  mapping?: Mapping;
  /** Slugs of the site's gateways; a row naming another gateway is refused. */
  gateways: readonly string[];
  /** Most data rows accepted (default 200,000). */
  maxRows?: number;
};

export const MAX_CSV_BYTES = 20 * 1024 * 1024;
export const MAX_CSV_ROWS = 200_000;

const KEYS = TAG_CSV_COLUMNS.map((c) => c.key);
const fmt = (n: number) => new Intl.NumberFormat("en-US").format(n);

/** An error message when a file of `bytes` bytes is too large to import (over 20 MB), else null. */
export function checkCsvSize(bytes: number): string | null {
  if (bytes <= MAX_CSV_BYTES) return null;
  return `The file is ${(bytes / (1024 * 1024)).toFixed(1)} MB; the limit is 20 MB. Split it into smaller files.`;
}

const normalise = (header: string) => header.toLowerCase().replace(/[^a-z0-9]/g, "");
const SYNONYMS: Record<TagCsvField, string[]> = {
  name: ["tag", "tagname", "tagid", "signal", "signalname", "point", "pointname"],
  unit: ["units", "engunit", "engunits", "engineeringunit", "engineeringunits", "uom", "eu"],
  sample_period_ms: ["sampleperiod", "period", "periodms", "scanrate", "scanratems", "sampleinterval", "sampleintervalms", "scanperiod"],
  kind: ["type", "tagtype", "signaltype", "tagkind"],
  eu_low: ["low", "eulow", "rangelow", "min", "minimum", "engineeringlow", "eumin", "lowrange"],
  eu_high: ["high", "euhigh", "rangehigh", "max", "maximum", "engineeringhigh", "eumax", "highrange"],
  area: ["plantarea", "processarea", "processcell"],
  equipment: ["equip", "equipmentname", "asset"],
  gateway: ["gw", "collector", "edgegateway", "gatewayslug"],
};

/**
 * Suggests which column holds each canonical field, comparing headers case-insensitively
 * and ignoring spaces, underscores, dashes and brackets ("Sample period (ms)" →
 * sample_period_ms), with a few common synonyms ("Tag name", "UoM", "Scan rate", "Type",
 * "Range low", "GW"…). Exact canonical names win over synonyms; each column is used once.
 */
export function suggestMapping(headers: readonly string[]): Mapping {
  const norm = headers.map(normalise);
  const used = new Set<number>();
  const mapping: Mapping = Object.fromEntries(KEYS.map((k) => [k, null]));
  for (const candidates of [(k: TagCsvField) => [normalise(k)], (k: TagCsvField) => SYNONYMS[k]]) {
    for (const key of KEYS) {
      if (mapping[key] != null) continue;
      const names = candidates(key);
      const index = norm.findIndex((h, i) => !used.has(i) && names.includes(h));
      if (index >= 0) {
        mapping[key] = index;
        used.add(index);
      }
    }
  }
  return mapping;
}

// OWASP "CSV Injection": cells starting with these may be run as formulas by spreadsheets.
// Export prefixes "'" to text matching FORMULA (leading apostrophes included, so a value
// that itself starts with "'=" survives); import removes exactly one such "'".
const FORMULA = /^'*[=+\-@\t\r]/;
const NEUTRALISED = /^'+[=+\-@\t\r]/;
const neutralise = (s: string) => (FORMULA.test(s) ? `'${s}` : s);
const restore = (s: string) => (NEUTRALISED.test(s) ? s.slice(1) : s);

/**
 * The inventory as CSV: canonical header, rows in the order given, CRLF line ends,
 * empty cells for absent optional values. Text cells that a spreadsheet would read as a
 * formula (starting with =, +, -, @, tab or CR) get a leading apostrophe and quotes (OWASP
 * "CSV Injection"); numeric columns are plain numbers, so -40 stays -40.
 */
export function exportTagsCsv(tags: readonly TagValues[]): string {
  const text = (s: string | null) => (s === null ? null : neutralise(s));
  const data = tags.map((t) => [
    text(t.name),
    text(t.unit),
    t.samplePeriodMs,
    text(t.kind),
    t.euLow,
    t.euHigh,
    text(t.area),
    text(t.equipment),
    text(t.gateway),
  ]);
  const quotes = (value: unknown) => typeof value === "string" && NEUTRALISED.test(value);
  const csv = Papa.unparse({ fields: [...KEYS], data }, { newline: "\r\n", quotes });
  return csv.endsWith("\r\n") ? csv : `${csv}\r\n`; // papaparse ends a header-only file with CRLF itself
}

type Newline = "\r\n" | "\n" | "\r";
type Dialect = { delimiter: string; newline: Newline };

const DELIMITERS = [",", ";", "\t"] as const;

/**
 * Line ends and delimiter, read from the header (the first non-blank line): the line end
 * that closes it, and whichever of comma, semicolon or tab it holds most often outside
 * quotes (ties go to the comma). Column names rarely contain a delimiter, whereas data
 * rows often do, so the header alone decides (common practice).
 */
function detectDialect(text: string): Dialect {
  const counts = new Map<string, number>(DELIMITERS.map((d) => [d, 0]));
  let newline: Newline | null = null;
  let quoted = false;
  let content = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') i++;
        else quoted = false;
      }
    } else if (c === '"' && (i === 0 || ',;\t\r\n'.includes(text[i - 1]))) quoted = content = true;
    else if (c === "\r" || c === "\n") {
      const crlf = c === "\r" && text[i + 1] === "\n";
      newline ??= crlf ? "\r\n" : c === "\r" ? "\r" : "\n";
      if (content) break;
      for (const d of DELIMITERS) counts.set(d, 0);
      if (crlf) i++;
    } else if (counts.has(c)) counts.set(c, counts.get(c)! + 1);
    else if (c.trim() !== "") content = true;
  }
  const delimiter = DELIMITERS.reduce((best, d) => (counts.get(d)! > counts.get(best)! ? d : best));
  return { delimiter, newline: newline ?? "\n" };
}

/** Physical line breaks inside a row's values (CRLF, LF or CR each count once). */
function breaksIn(row: readonly string[]): number {
  let n = 0;
  for (const cell of row) {
    for (let i = 0; i < cell.length; i++) {
      const c = cell.charCodeAt(i);
      if (c === 10) n++;
      else if (c === 13) {
        n++;
        if (cell.charCodeAt(i + 1) === 10) i++;
      }
    }
  }
  return n;
}

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const CAMEL_TO_KEY: Record<string, TagCsvField> = { samplePeriodMs: "sample_period_ms", euLow: "eu_low", euHigh: "eu_high" };
const KINDS = `use ${TAG_KINDS.slice(0, -1).join(", ")} or ${TAG_KINDS[TAG_KINDS.length - 1]}`;
const lowerFirst = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);
const show = (s: string) => JSON.stringify(s.length > 60 ? `${s.slice(0, 57)}...` : s);

function quoteProblem(codes: Set<string>): string {
  const rest = "; the rest of the file could not be read.";
  if (!codes.has("MissingQuotes")) return 'a quoted value has a stray " inside; double it ("") or remove it.';
  if (codes.has("InvalidQuotes")) return `a quoted value has a stray " inside and is not closed${rest}`;
  return `a quoted value is not closed (a closing " is missing)${rest}`;
}

/** Turns parsed rows into tags and errors; fed the whole file at once or chunk by chunk. */
class TagCsvReader {
  headers: string[] | null = null;
  mapping: Mapping = {};
  rows: TagValues[] = [];
  errors: TagCsvError[] = [];
  stopped = false;
  private line = 1;
  private dataRows = 0;
  private readonly firstLine = new Map<string, number>();
  private readonly gateways: Set<string>;
  private readonly maxRows: number;
  private readonly known: string;

  constructor(
    private readonly opts: TagCsvOptions,
    private readonly dialect: Dialect,
  ) {
    this.gateways = new Set(opts.gateways);
    this.maxRows = opts.maxRows ?? MAX_CSV_ROWS;
    this.known = opts.gateways.length ? `this site has ${opts.gateways.join(", ")}` : "this site has no gateways yet";
  }

  /** Rows in file order; `parseErrors` index into `data`. */
  feed(data: string[][], parseErrors: readonly Papa.ParseError[]) {
    if (this.stopped) return;
    const quoteErrors = new Map<number, Set<string>>();
    for (const e of parseErrors) {
      if (e.row === undefined || e.row >= data.length) continue; // a partial row, parsed again with the next chunk
      quoteErrors.set(e.row, (quoteErrors.get(e.row) ?? new Set()).add(e.code));
    }
    // First pass: where each row starts, the header, and whether the row limit is passed (so
    // an oversized file is refused before any row is validated). -1 marks rows not to read.
    const lines = new Array<number>(data.length);
    let count = this.dataRows;
    for (let r = 0; r < data.length; r++) {
      const row = data[r];
      const line = this.line;
      const blank = row.every((cell) => cell.trim() === "");
      lines[r] = blank ? -1 : line;
      this.line += 1 + breaksIn(row);
      // A CR left at the end of a row in a file that mixes line ends is part of the line end.
      if (this.dialect.newline === "\n" && row[row.length - 1].endsWith("\r")) this.line--;
      if (blank) continue;
      if (!this.headers) {
        lines[r] = -1;
        const codes = quoteErrors.get(r);
        if (codes) this.fail(line, undefined, quoteProblem(codes));
        else this.readHeader(row, line);
        if (!this.headers) this.stopped = true;
        if (this.stopped) return;
      } else if (++count > this.maxRows) {
        this.errors = [{ line, reason: `Line ${line}: the file has more than ${fmt(this.maxRows)} rows; split it into smaller files.` }];
        this.rows = [];
        this.stopped = true;
        return;
      }
    }
    this.dataRows = count;
    for (let r = 0; r < data.length; r++) {
      const line = lines[r];
      if (line < 0) continue;
      const codes = quoteErrors.get(r);
      if (codes) this.fail(line, undefined, quoteProblem(codes));
      else this.readRow(data[r], line);
    }
  }

  result(): TagCsvResult {
    if (!this.headers && !this.stopped) this.fail(1, undefined, "the file is empty; the first line must name the columns.");
    return { headers: this.headers ?? [], mapping: this.mapping, rows: this.rows, errors: this.errors };
  }

  private fail(line: number, field: TagCsvField | undefined, reason: string) {
    this.errors.push(field ? { line, field, reason: `Line ${line}: ${reason}` } : { line, reason: `Line ${line}: ${reason}` });
  }

  private readHeader(row: string[], line: number) {
    this.headers = row.map((h) => h.trim());
    this.mapping = this.opts.mapping ?? suggestMapping(this.headers);
    const missing = TAG_CSV_COLUMNS.filter((c) => {
      const i = this.mapping[c.key];
      return c.required && (i == null || !Number.isInteger(i) || i < 0 || i >= this.headers!.length);
    });
    if (missing.length > 0) {
      const needed = TAG_CSV_COLUMNS.filter((c) => c.required).map((c) => c.key);
      this.fail(line, undefined, `no column for ${missing.map((c) => c.key).join(", ")}; the first line must name the columns (${needed.join(", ")} are required).`);
      this.stopped = true;
    }
  }

  private cell(row: readonly string[], key: TagCsvField): string {
    const i = this.mapping[key];
    return i == null ? "" : restore(row[i] ?? "").trim();
  }

  private number(row: readonly string[], key: TagCsvField, line: number): number | null {
    const raw = this.cell(row, key);
    if (raw === "") return null;
    if (NUMBER.test(raw) && Number.isFinite(Number(raw))) return Number(raw);
    const hint = /^[+-]?\d+,\d+$/.test(raw) ? " (use a point as the decimal separator)" : "";
    this.fail(line, key, `${key} ${show(raw)} is not a number${hint}.`);
    return Number.NaN;
  }

  private readRow(row: string[], line: number) {
    const columns = this.headers!.length;
    for (let i = columns; i < row.length; i++) {
      if (row[i].trim() === "") continue;
      const d = this.dialect.delimiter === "\t" ? "tab" : `"${this.dialect.delimiter}"`;
      this.fail(line, undefined, `${row.length} values but the first line names ${columns} columns; quote values that contain ${d}.`);
      return;
    }
    const before = this.errors.length;
    const fail = (field: TagCsvField, reason: string) => this.fail(line, field, reason);

    const name = this.cell(row, "name");
    if (name === "") fail("name", "the tag name is missing.");
    else if (this.firstLine.has(name)) fail("name", `duplicate name ${show(name)} (first on line ${this.firstLine.get(name)}).`);
    else this.firstLine.set(name, line);

    const unit = this.cell(row, "unit");
    if (unit === "") fail("unit", "the unit is missing; give the engineering unit (e.g. degC, kPa, m3/h; 'state' for discrete).");

    const period = this.number(row, "sample_period_ms", line);
    if (period === null) fail("sample_period_ms", "the sample period (sample_period_ms) is missing.");

    const rawKind = this.cell(row, "kind");
    const kind = rawKind.toLowerCase();
    if (kind === "") fail("kind", `the kind is missing; ${KINDS}.`);
    else if (!(TAG_KINDS as readonly string[]).includes(kind)) fail("kind", `unknown kind ${show(rawKind)}; ${KINDS}.`);

    const euLow = this.number(row, "eu_low", line);
    const euHigh = this.number(row, "eu_high", line);
    if (!Number.isNaN(euLow) && !Number.isNaN(euHigh)) {
      if ((euLow === null) !== (euHigh === null)) fail(euLow === null ? "eu_low" : "eu_high", "give both eu_low and eu_high, or leave both empty.");
      else if (euLow !== null && euHigh !== null && euLow >= euHigh) fail("eu_high", `eu_low (${euLow}) must be below eu_high (${euHigh}).`);
    }

    const rawGateway = this.cell(row, "gateway");
    const gateway = rawGateway.toLowerCase();
    if (gateway === "") fail("gateway", `the gateway is missing; ${this.known}.`);
    else if (!this.gateways.has(gateway)) fail("gateway", `unknown gateway ${show(rawGateway)}; ${this.known}.`);

    const parsed = tagSchema.safeParse({
      name,
      unit,
      samplePeriodMs: period ?? Number.NaN,
      kind,
      euLow,
      euHigh,
      area: this.cell(row, "area"),
      equipment: this.cell(row, "equipment"),
      gateway,
    });
    if (parsed.success) {
      if (this.errors.length === before) this.rows.push(parsed.data);
      return;
    }
    // Schema issues (lengths, control characters…) for fields not already reported.
    const reported = new Set(this.errors.slice(before).map((e) => e.field));
    for (const issue of parsed.error.issues) {
      const path = String(issue.path[0]);
      const field = CAMEL_TO_KEY[path] ?? (path as TagCsvField);
      if (reported.has(field)) continue;
      reported.add(field);
      fail(field, lowerFirst(issue.message) + (/[.!?]$/.test(issue.message) ? "" : "."));
    }
  }
}

function parseConfig(dialect: Dialect): Papa.ParseConfig<string[]> {
  return { delimiter: dialect.delimiter, newline: dialect.newline, header: false, skipEmptyLines: false, dynamicTyping: false };
}

const stripBom = (s: string) => (s.charCodeAt(0) === 0xfeff ? s.slice(1) : s);

/**
 * Parses a tag inventory CSV. The first non-blank line names the columns; blank lines are
 * skipped; a BOM is ignored; the delimiter (comma, semicolon or tab) is detected. Every
 * problem is reported with the 1-based physical line where its row starts (line breaks
 * inside quoted values count), and only rows without problems are returned. More than
 * `maxRows` data rows gives one error and no rows. Kind and gateway are read
 * case-insensitively; an apostrophe added against formula injection is removed. The
 * caller checks the size first (`checkCsvSize`).
 */
export function parseTagCsv(input: string, opts: TagCsvOptions): TagCsvResult {
  const text = stripBom(input);
  const dialect = detectDialect(text);
  const reader = new TagCsvReader(opts, dialect);
  const parsed = Papa.parse<string[]>(text, parseConfig(dialect));
  reader.feed(parsed.data, parsed.errors);
  return reader.result();
}

/**
 * `parseTagCsv` in chunks, for the browser: reports progress (0…1) and yields to the event
 * loop between chunks so the page stays responsive. Takes a File (or any Blob) or a
 * string; gives the same result as `parseTagCsv` on the same text.
 */
export async function parseTagCsvStreaming(
  input: string | Blob,
  opts: TagCsvOptions & { chunkSize?: number },
  onProgress?: (fraction: number) => void,
): Promise<TagCsvResult> {
  const text = stripBom(typeof input === "string" ? input : await input.text());
  const dialect = detectDialect(text);
  const reader = new TagCsvReader(opts, dialect);
  return new Promise((resolve, reject) => {
    const done = () => {
      onProgress?.(1);
      resolve(reader.result());
    };
    try {
      Papa.parse<string[]>(text, {
        ...parseConfig(dialect),
        chunkSize: opts.chunkSize ?? 512 * 1024,
        chunk(results: Papa.ParseResult<string[]>, parser: Papa.Parser) {
          reader.feed(results.data, results.errors);
          if (reader.stopped) return parser.abort();
          onProgress?.(text.length ? Math.min(results.meta.cursor / text.length, 1) : 1);
          parser.pause();
          setTimeout(() => parser.resume(), 0);
        },
        complete: done,
        error: (e: Error) => reject(e),
      });
    } catch (e) {
      reject(e);
    }
  });
}
