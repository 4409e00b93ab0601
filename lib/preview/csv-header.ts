/** The header row of a sample CSV: separator and column positions (see parseSampleCsv). */
export type CsvHeader = {
  sep: string;
  time: number;
  value: number;
  /** −1 without a quality column. */
  quality: number;
  /** Offset of the first data line. */
  next: number;
  names: { time: string; value: string; quality: string | null };
};

export const TIME_COLUMNS = ["time", "timestamp", "ts", "t", "datetime"];
export const VALUE_COLUMNS = ["value", "v", "pv", "val"];
export const QUALITY_COLUMNS = ["quality", "q", "status"];
const SEPARATORS = [",", ";", "\t"];

const unquote = (name: string) => {
  const s = name.trim();
  return s.length >= 2 && s.startsWith('"') && s.endsWith('"') ? s.slice(1, -1).replace(/""/g, '"').trim() : s;
};

/**
 * Reads the header line starting at `start`: the separator is the first of `,` `;` tab
 * that splits it into a time and a value column (names as in {@link TIME_COLUMNS} and
 * {@link VALUE_COLUMNS}, case-insensitive; the first match wins). A header that names
 * neither column, or only one, is a problem on line 1 saying which is missing.
 */
export function readHeader(text: string, start: number): CsvHeader | { problem: string } {
  const nl = text.indexOf("\n", start);
  const line = text.slice(start, nl < 0 ? text.length : nl).replace(/\r$/, "");
  if (line.trim() === "") return { problem: "the first line must be a header naming the time and value columns; it is empty" };
  let best: { sep: string; names: string[]; time: number; value: number } | undefined;
  for (const sep of SEPARATORS) {
    const names = line.split(sep).map(unquote);
    const lower = names.map((n) => n.toLowerCase());
    const time = lower.findIndex((n) => TIME_COLUMNS.includes(n));
    const value = lower.findIndex((n) => VALUE_COLUMNS.includes(n));
    const found = { sep, names, time, value };
    if (time >= 0 && value >= 0) {
      best = found;
      break;
    }
    if (best === undefined || (time >= 0 ? 1 : 0) + (value >= 0 ? 1 : 0) > (best.time >= 0 ? 1 : 0) + (best.value >= 0 ? 1 : 0)) best = found;
  }
  const { sep, names, time, value } = best as NonNullable<typeof best>;
  if (time < 0 || value < 0) {
    const missing = [time < 0 ? `no time column (${TIME_COLUMNS.join(", ")})` : "", value < 0 ? `no value column (${VALUE_COLUMNS.join(", ")})` : ""];
    return { problem: `the header has ${missing.filter(Boolean).join(" and ")}; it reads "${line.slice(0, 80)}"` };
  }
  const quality = names.findIndex((n) => QUALITY_COLUMNS.includes(n.toLowerCase()));
  return {
    sep,
    time,
    value,
    quality,
    next: nl < 0 ? text.length + 1 : nl + 1,
    names: { time: names[time], value: names[value], quality: quality < 0 ? null : names[quality] },
  };
}
