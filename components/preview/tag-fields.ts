// The tag context of a preview, as the form holds it (text) and as the runner needs it.
import type { DemoSignal } from "@/lib/preview/demo-signals";
import type { ProfileTag, TagKind } from "@/lib/reduction/profile";

export type TagFields = { name: string; kind: TagKind; unit: string; euLow: string; euHigh: string; samplePeriodMs: string };

export const DEFAULT_TAG: TagFields = { name: "SAMPLE/TT-001/PV", kind: "analog", unit: "degC", euLow: "0", euHigh: "150", samplePeriodMs: "1000" };

/** A tag of the inventory as form text. */
export function fieldsOf(t: ProfileTag): TagFields {
  return { name: t.name, kind: t.kind, unit: t.unit, euLow: t.euLow == null ? "" : String(t.euLow), euHigh: t.euHigh == null ? "" : String(t.euHigh), samplePeriodMs: String(t.samplePeriodMs) };
}

/** The form's text as a ProfileTag, or the first problem in words. */
export function readTag(f: TagFields): { tag: ProfileTag } | { problem: string } {
  const opt = (s: string) => (s.trim() === "" ? null : Number(s));
  const euLow = opt(f.euLow);
  const euHigh = opt(f.euHigh);
  const period = Number(f.samplePeriodMs);
  if (f.unit.trim() === "") return { problem: "Give the tag's engineering unit." };
  if ((euLow !== null && !Number.isFinite(euLow)) || (euHigh !== null && !Number.isFinite(euHigh))) return { problem: "The engineering range must be numbers." };
  if ((euLow === null) !== (euHigh === null)) return { problem: "Give both ends of the engineering range, or neither." };
  if (euLow !== null && euHigh !== null && !(euLow < euHigh)) return { problem: "The engineering range's low end must be below its high end." };
  if (!(Number.isFinite(period) && period > 0)) return { problem: "The sample period must be a number of milliseconds above 0." };
  return { tag: { name: f.name.trim() || "sample", kind: f.kind, unit: f.unit.trim(), euLow, euHigh, samplePeriodMs: period } };
}

/** A typical tag for each demo signal, used when the tag context is of another kind. */
export const DEMO_TAGS: Record<DemoSignal, Omit<TagFields, "samplePeriodMs">> = {
  temperature: { name: "DEMO/TT-101/PV", kind: "analog", unit: "degC", euLow: "0", euHigh: "100" },
  flow: { name: "DEMO/FT-201/PV", kind: "analog", unit: "m3/h", euLow: "0", euHigh: "50" },
  vibration: { name: "DEMO/VT-301/PV", kind: "analog", unit: "mm/s", euLow: "0", euHigh: "20" },
  valve: { name: "DEMO/XV-401/ZS", kind: "discrete", unit: "state", euLow: "", euHigh: "" },
  totaliser: { name: "DEMO/FQ-501/TOT", kind: "counter", unit: "m3", euLow: "", euHigh: "" },
};
