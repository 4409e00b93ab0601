// Number and time formatting for the workbench (English digits, site time zone).

/** 20000 → "20,000"; null → "—". */
export const count = (n: number | null | undefined) => (n == null ? "—" : Math.round(n).toLocaleString("en"));

/** Four significant digits, no exponent for everyday sizes: 0.2963, 12.35, 1,234. */
export function num(n: number | null | undefined): string {
  if (n == null || Number.isNaN(n)) return "—";
  if (!Number.isFinite(n)) return n > 0 ? "∞" : "−∞";
  if (n !== 0 && Math.abs(n) < 1e-4) return n.toExponential(2);
  return Number(n.toPrecision(4)).toLocaleString("en", { maximumFractionDigits: 6 });
}

/** A reduction ratio: "16.3 : 1". */
export const ratio = (r: number) => (Number.isFinite(r) ? `${num(r)} : 1` : "all dropped");

/** Bytes as B, kB, MB (powers of 1000). */
export function bytes(b: number): string {
  if (b < 1000) return `${Math.round(b)} B`;
  if (b < 1e6) return `${num(b / 1000)} kB`;
  return `${num(b / 1e6)} MB`;
}

export const percent = (share: number | null) => (share == null ? "—" : `${num(share * 100)} %`);

const formatters = new Map<string, Intl.DateTimeFormat>();

/** An instant in the site's time zone: "2026-01-05 06:00:00". */
export function localTime(ms: number, timeZone: string): string {
  let f = formatters.get(timeZone);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat("sv-SE", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit" });
    } catch {
      f = new Intl.DateTimeFormat("sv-SE", { timeZone: "UTC", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit" });
    }
    formatters.set(timeZone, f);
  }
  return f.format(new Date(ms));
}

/** "2026-01-05 06:00:00 – 11:33:19" (the date once when both ends share it). */
export function formatRange(from: number, to: number, timeZone: string): string {
  const a = localTime(from, timeZone);
  const b = localTime(to, timeZone);
  return a.slice(0, 10) === b.slice(0, 10) ? `${a} – ${b.slice(11)}` : `${a} – ${b}`;
}

/** A duration in words: "42 s", "5 h 33 min", "11 d 13 h". */
export function duration(ms: number): string {
  const s = Math.round(ms / 1000);
  if (s < 120) return `${s} s`;
  const m = Math.round(s / 60);
  if (m < 120) return `${m} min`;
  const h = Math.floor(m / 60);
  if (h >= 48) return Math.round(m / 60) % 24 ? `${Math.floor(Math.round(m / 60) / 24)} d ${Math.round(m / 60) % 24} h` : `${Math.round(m / 1440)} d`;
  return m % 60 ? `${h} h ${m % 60} min` : `${h} h`;
}

/** Tick labels in the site's zone: seconds for a short span, the date for one over two days. */
export function timeLabels(splits: readonly number[], timeZone: string): string[] {
  const span = splits.length > 1 ? splits[splits.length - 1] - splits[0] : 0;
  return splits.map((ts) => {
    const s = localTime(ts, timeZone);
    if (span < 5 * 60_000) return s.slice(11);
    if (span < 2 * 86_400_000) return s.slice(11, 16);
    return s.slice(5, 16);
  });
}
