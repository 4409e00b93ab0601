import type { RuleField } from "@/models/tag-group";
import type { Selector } from "@/schemas/tag";

type Rule = { field: RuleField; value: string };

const LISTS: [keyof Selector, RuleField][] = [
  ["patterns", "pattern"],
  ["units", "unit"],
  ["kinds", "kind"],
  ["areas", "area"],
  ["equipment", "equipment"],
  ["gateways", "gateway"],
  ["include", "include"],
  ["exclude", "exclude"],
];

/** A selector as ordered rule rows (the tag_group_rules table). */
export function selectorToRules(sel: Selector): Rule[] {
  const rules: Rule[] = [];
  for (const [key, field] of LISTS) for (const value of sel[key] as string[]) rules.push({ field, value });
  if (sel.minPeriodMs !== null) rules.push({ field: "min_period_ms", value: String(sel.minPeriodMs) });
  if (sel.maxPeriodMs !== null) rules.push({ field: "max_period_ms", value: String(sel.maxPeriodMs) });
  return rules;
}

/** Rule rows, in position order, back into a selector. */
export function rulesToSelector(rules: Rule[]): Selector {
  const sel: Selector = {
    patterns: [],
    units: [],
    kinds: [],
    areas: [],
    equipment: [],
    gateways: [],
    minPeriodMs: null,
    maxPeriodMs: null,
    include: [],
    exclude: [],
  };
  for (const r of rules) {
    if (r.field === "min_period_ms") sel.minPeriodMs = Number(r.value);
    else if (r.field === "max_period_ms") sel.maxPeriodMs = Number(r.value);
    else {
      const key = LISTS.find(([, f]) => f === r.field)![0];
      (sel[key] as string[]).push(r.value);
    }
  }
  return sel;
}
