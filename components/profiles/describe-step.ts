import { METHODS, type ParamInfo } from "@/lib/reduction/methods";
import type { Magnitude, Step } from "@/lib/reduction/profile";

const LABELS: Record<string, string> = {
  keep: "Keep",
  deadband: "Deadband",
  deviation: "Deviation",
  epsilon: "Epsilon",
  distance: "Distance",
  "max-interval": "Max interval",
  points: "Number of points",
  window: "Window",
  offset: "Offset",
  fn: "Statistic",
  calendar: "Local calendar windows",
  percentile: "Percentile",
  interpolation: "Interpolation",
  "include-uncertain": "Include uncertain samples",
  threshold: "Threshold",
  direction: "Direction",
  hysteresis: "Hysteresis",
  limit: "Limit",
  state: "State",
  rollover: "Rollover",
  "reset-share": "Reset share",
};

/** A parameter's name as the UI shows it ("max-interval" → "Max interval"). */
export function paramLabel(name: string): string {
  return LABELS[name] ?? name.charAt(0).toUpperCase() + name.slice(1).replace(/-/g, " ");
}

/** A magnitude in words: "0.5 degC" or "2 % of range". */
export function describeMagnitude(m: Magnitude): string {
  return "percent" in m ? `${m.percent} % of range` : `${m.value} ${m.unit}`;
}

/** One parameter value in words, with its unit. */
export function describeValue(p: ParamInfo, value: unknown): string {
  if (p.type === "magnitude" && typeof value === "object" && value !== null) return describeMagnitude(value as Magnitude);
  if (p.type === "seconds" && typeof value === "number") return `${value} s`;
  if (p.type === "boolean") return value ? "yes" : "no";
  return String(value);
}

/** A step in words, e.g. "Swinging door — deviation 0.5 degC, max interval 600 s". */
export function describeStep(step: Step): string {
  const info = METHODS[step.method];
  const values = step as unknown as Record<string, unknown>;
  const parts = info.params.filter((p) => values[p.name] !== undefined).map((p) => `${paramLabel(p.name).toLowerCase()} ${describeValue(p, values[p.name])}`);
  return parts.length ? `${info.title} — ${parts.join(", ")}` : info.title;
}

/** An ISO time as "2026-12-01 10:00 UTC" (the same on server and client). */
export function formatWhen(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

/** "1 group", "3 groups". */
export function plural(n: number, word: string): string {
  return `${n.toLocaleString("en")} ${word}${n === 1 ? "" : "s"}`;
}
