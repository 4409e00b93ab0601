import type { StepMethod } from "./profile";
import type { TagKind } from "./profile-names";

/** One parameter of a step, as the profile editor, the JSON Schema and the bundle renderer read it. */
export type ParamInfo = {
  /** The document key. */
  name: string;
  /**
   * `magnitude`: absolute { value, unit } or percent { percent } of the engineering range;
   * `seconds`: a duration or offset in seconds; `integer`, `number`, `boolean`; `enum`: one of `values`.
   */
  type: "magnitude" | "seconds" | "integer" | "number" | "boolean" | "enum";
  required: boolean;
  /**
   * For magnitudes: a `width` (a deadband, a deviation: percent is a share of the span
   * high − low, and units convert as a difference) or a `level` (a threshold: percent
   * counts from the range's low end, and units convert as a value, offsets included).
   */
  magnitude?: "width" | "level";
  values?: readonly string[];
  /** Bounds for numbers and seconds; `min` is exclusive when `minExclusive`. */
  min?: number;
  minExclusive?: boolean;
  max?: number;
  /** The default when absent, when there is one. */
  default?: number | string | boolean;
  help: string;
};

/** What the product needs to know about each method (see {@link METHODS}). */
export type MethodInfo = {
  method: StepMethod;
  title: string;
  /** Tag kinds the method suits (DESIGN.md "Signals": analog takes any method). */
  kinds: readonly TagKind[];
  /** `selection` keeps samples of its input; `aggregation` makes a new series, one sample per window. */
  role: "selection" | "aggregation";
  lossy: boolean;
  /** False for methods that need the whole series (LTTB, LTOB, RDP, M4): no gateway stream. */
  streaming: boolean;
  /** Reconstruction for measured error: linear or step-hold; null where the kept values are unchanged samples of any kind or a new series. */
  reconstruction: "linear" | "step" | null;
  params: readonly ParamInfo[];
  /** Names of the magnitude parameters (absolute or percent). */
  magnitudes: readonly string[];
  /** The published source (or "common practice"), for the UI's inline help. */
  source: string;
  /** What the parameters guarantee, in one sentence. */
  guarantee: string;
};

export const ALL: readonly TagKind[] = ["analog", "discrete", "counter"];
export const ANALOG: readonly TagKind[] = ["analog"];

export const windowLength = (help = "Window length in seconds."): ParamInfo => ({ name: "window", type: "seconds", required: true, min: 0, minExclusive: true, help });
export const offset: ParamInfo = { name: "offset", type: "seconds", required: false, default: 0, help: "Window alignment offset in seconds, from the epoch (or from local midnight with calendar windows)." };
export const maxInterval: ParamInfo = {
  name: "max-interval",
  type: "seconds",
  required: false,
  min: 0,
  minExclusive: true,
  help: "Keep a sample at least this often (seconds), unless two neighbours are further apart.",
};
export const threshold: ParamInfo = { name: "threshold", type: "magnitude", magnitude: "level", required: true, help: "The threshold level." };
export const direction: ParamInfo = { name: "direction", type: "enum", values: ["above", "below"], required: false, default: "above", help: "Count upward (above) or downward (below) crossings." };
export const hysteresis: ParamInfo = {
  name: "hysteresis",
  type: "magnitude",
  magnitude: "width",
  required: false,
  help: "Re-arm only after the value returns this far past the threshold (default 0).",
};
export const rollover: ParamInfo = { name: "rollover", type: "number", required: true, min: 0, minExclusive: true, help: "The value at which the counter wraps to 0 (e.g. 65536)." };
export const resetShare: ParamInfo = {
  name: "reset-share",
  type: "number",
  required: false,
  min: 0,
  minExclusive: true,
  max: 1,
  default: 0.5,
  help: "The largest share of the rollover a counter can advance between two samples; a decrease that would mean more through a rollover is a reset.",
};
export const points: ParamInfo = { name: "points", type: "integer", required: true, min: 2, help: "Number of samples to keep, first and last included." };

export function info(m: Omit<MethodInfo, "magnitudes">): MethodInfo {
  return { ...m, magnitudes: m.params.filter((p) => p.type === "magnitude").map((p) => p.name) };
}
