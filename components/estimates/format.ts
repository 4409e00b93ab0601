/** Number formats of the estimate pages (English grouping; figures are estimates, so a few significant digits). */
export const fmtInt = (x: number) => Math.round(x).toLocaleString("en");
export const fmt = (x: number | null, digits = 3) => (x === null ? "—" : x.toLocaleString("en", { maximumSignificantDigits: digits }));
export const fmtRatio = (x: number | null) => (x === null ? "all dropped" : `${x.toLocaleString("en", { maximumSignificantDigits: 3 })}:1`);

export function fmtBytes(bytes: number): string {
  const units = ["B", "kB", "MB", "GB", "TB"];
  let i = 0;
  let x = bytes;
  while (x >= 1000 && i < units.length - 1) {
    x /= 1000;
    i++;
  }
  return `${x.toLocaleString("en", { maximumSignificantDigits: 3 })} ${units[i]}`;
}

export function fmtDuration(seconds: number | null): string {
  if (seconds === null) return "never (no spare uplink)";
  if (seconds < 60) return `${Math.round(seconds)} s`;
  if (seconds < 3600) return `${Math.round(seconds / 60)} min`;
  if (seconds < 172_800) return `${(seconds / 3600).toLocaleString("en", { maximumFractionDigits: 1 })} h`;
  return `${(seconds / 86_400).toLocaleString("en", { maximumFractionDigits: 1 })} days`;
}
