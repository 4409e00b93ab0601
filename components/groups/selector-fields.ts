import type { Selector } from "@/schemas/tag";

/** The group editor's raw form values: lists as text, one item per line or comma-separated. */
export type GroupFormValues = {
  name: string;
  description: string;
  regulated: boolean;
  patterns: string;
  units: string;
  kinds: string[];
  areas: string;
  equipment: string;
  gateways: string[];
  minPeriodMs: string;
  maxPeriodMs: string;
  include: string;
  exclude: string;
};

const lines = (s: string) => s.split("\n").map((l) => l.trim()).filter(Boolean);
const commas = (s: string) => s.split(",").map((l) => l.trim()).filter(Boolean);
const optNumber = (s: string) => (s.trim() === "" ? null : Number(s));

export function toSelector(v: GroupFormValues): Selector {
  return {
    patterns: lines(v.patterns),
    units: commas(v.units),
    kinds: v.kinds as Selector["kinds"],
    areas: commas(v.areas),
    equipment: commas(v.equipment),
    gateways: v.gateways,
    minPeriodMs: optNumber(v.minPeriodMs),
    maxPeriodMs: optNumber(v.maxPeriodMs),
    include: lines(v.include),
    exclude: lines(v.exclude),
  };
}

export function fromGroup(g: { name: string; description: string; regulated: boolean; selector: Selector } | null): GroupFormValues {
  const s = g?.selector;
  return {
    name: g?.name ?? "",
    description: g?.description ?? "",
    regulated: g?.regulated ?? false,
    patterns: s?.patterns.join("\n") ?? "",
    units: s?.units.join(", ") ?? "",
    kinds: s?.kinds ?? [],
    areas: s?.areas.join(", ") ?? "",
    equipment: s?.equipment.join(", ") ?? "",
    gateways: s?.gateways ?? [],
    minPeriodMs: s?.minPeriodMs == null ? "" : String(s.minPeriodMs),
    maxPeriodMs: s?.maxPeriodMs == null ? "" : String(s.maxPeriodMs),
    include: s?.include.join("\n") ?? "",
    exclude: s?.exclude.join("\n") ?? "",
  };
}

/** Maps an error path of the group schema (e.g. selector.patterns.2) to the form field that shows it. */
export function formField(path: string): keyof GroupFormValues {
  const parts = path.split(".");
  const key = parts[0] === "selector" ? parts[1] : parts[0];
  return (key || "name") as keyof GroupFormValues;
}
