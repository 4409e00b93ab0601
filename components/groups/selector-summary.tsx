import type { Selector } from "@/schemas/tag";

/** A selector in one line of words. */
export function selectorSummary(s: Selector): string {
  const parts: string[] = [];
  if (s.patterns.length) parts.push(`names ${s.patterns.join(" or ")}`);
  if (s.units.length) parts.push(`unit ${s.units.join("/")}`);
  if (s.kinds.length) parts.push(s.kinds.join("/"));
  if (s.areas.length) parts.push(`area ${s.areas.join("/")}`);
  if (s.equipment.length) parts.push(`equipment ${s.equipment.join("/")}`);
  if (s.gateways.length) parts.push(`via ${s.gateways.join("/")}`);
  if (s.minPeriodMs !== null || s.maxPeriodMs !== null) parts.push(`period ${s.minPeriodMs ?? 0}–${s.maxPeriodMs ?? "∞"} ms`);
  if (s.include.length) parts.push(`+${s.include.length} named`);
  if (s.exclude.length) parts.push(`−${s.exclude.length} excluded`);
  return parts.join(" · ") || "matches nothing yet";
}
