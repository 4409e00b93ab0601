/** How long ago a moment was, in words: "45 s ago", "3 min ago", "2 h ago", "4 d ago" ("in 5 s" for a clock ahead of ours). */
export function relativeTime(then: Date, now: Date): string {
  const diff = Math.round((now.getTime() - then.getTime()) / 1000);
  const s = Math.abs(diff);
  let text: string;
  if (s < 60) text = `${s} s`;
  else if (s < 3600) text = `${Math.floor(s / 60)} min`;
  else if (s < 172_800) text = `${Math.floor(s / 3600)} h`;
  else text = `${Math.floor(s / 86_400)} d`;
  return diff >= 0 ? `${text} ago` : `in ${text}`;
}

/** A moment as people compare it across sites: UTC to the second. */
export const utcTime = (d: Date) => d.toISOString().replace("T", " ").replace(/\.\d{3}Z$/, " UTC");

/** A reduction ratio as "12.5:1"; `null` with points in means nothing went out. */
export function ratioText(ratio: number | null, anyIn: boolean): string {
  if (ratio === null) return anyIn ? "nothing sent" : "—";
  return `${ratio.toLocaleString("en", { maximumSignificantDigits: 3 })}:1`;
}

/** The first characters of a SHA-256 digest, enough to tell bundles apart on screen. */
export const shortDigest = (d: string | null) => (d ? d.slice(0, 12) : "—");
