import { AGGREGATE_FNS } from "./aggregate";
import type { StepMethod, TagKind } from "./profile";

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

const ALL: readonly TagKind[] = ["analog", "discrete", "counter"];
const ANALOG: readonly TagKind[] = ["analog"];

const window = (help = "Window length in seconds."): ParamInfo => ({ name: "window", type: "seconds", required: true, min: 0, minExclusive: true, help });
const offset: ParamInfo = { name: "offset", type: "seconds", required: false, default: 0, help: "Window alignment offset in seconds, from the epoch (or from local midnight with calendar windows)." };
const maxInterval: ParamInfo = {
  name: "max-interval",
  type: "seconds",
  required: false,
  min: 0,
  minExclusive: true,
  help: "Keep a sample at least this often (seconds), unless two neighbours are further apart.",
};
const threshold: ParamInfo = { name: "threshold", type: "magnitude", magnitude: "level", required: true, help: "The threshold level." };
const direction: ParamInfo = { name: "direction", type: "enum", values: ["above", "below"], required: false, default: "above", help: "Count upward (above) or downward (below) crossings." };
const hysteresis: ParamInfo = {
  name: "hysteresis",
  type: "magnitude",
  magnitude: "width",
  required: false,
  help: "Re-arm only after the value returns this far past the threshold (default 0).",
};
const rollover: ParamInfo = { name: "rollover", type: "number", required: true, min: 0, minExclusive: true, help: "The value at which the counter wraps to 0 (e.g. 65536)." };
const resetShare: ParamInfo = {
  name: "reset-share",
  type: "number",
  required: false,
  min: 0,
  minExclusive: true,
  max: 1,
  default: 0.5,
  help: "The largest share of the rollover a counter can advance between two samples; a decrease that would mean more through a rollover is a reset.",
};
const points: ParamInfo = { name: "points", type: "integer", required: true, min: 2, help: "Number of samples to keep, first and last included." };

function info(m: Omit<MethodInfo, "magnitudes">): MethodInfo {
  return { ...m, magnitudes: m.params.filter((p) => p.type === "magnitude").map((p) => p.name) };
}

/**
 * Every step method: kinds, role, lossiness, parameters, source and guarantee. The
 * profile editor, the JSON Schema and the bundle renderer read this table; the runner
 * checks documents against it.
 */
export const METHODS: Readonly<Record<StepMethod, MethodInfo>> = {
  "quality-filter": info({
    method: "quality-filter",
    title: "Quality filter",
    kinds: ALL,
    role: "selection",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [{ name: "keep", type: "enum", values: ["good", "good-and-uncertain"], required: true, help: "Which samples to keep." }],
    source: "OPC UA Part 4 (Services), StatusCode severities Good / Uncertain / Bad; filtering on them is common practice",
    guarantee: "Every kept sample has the kept quality and its value and time unchanged; every other sample is dropped.",
  }),
  "pass-through": info({
    method: "pass-through",
    title: "Pass through",
    kinds: ALL,
    role: "selection",
    lossy: false,
    streaming: true,
    reconstruction: null,
    params: [],
    source: "common practice",
    guarantee: "Every sample is sent unchanged.",
  }),
  drop: info({
    method: "drop",
    title: "Drop",
    kinds: ALL,
    role: "selection",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [],
    source: "common practice",
    guarantee: "Nothing is sent.",
  }),
  deadband: info({
    method: "deadband",
    title: "Deadband",
    kinds: ANALOG,
    role: "selection",
    lossy: true,
    streaming: true,
    reconstruction: "step",
    params: [{ name: "deadband", type: "magnitude", magnitude: "width", required: true, help: "Report a sample when it moves more than this from the last reported value." }, maxInterval],
    source: "OPC UA Part 4 (Services) DataChangeFilter, absolute deadband; OPC UA Part 8 (Data Access) percent deadband of the EURange",
    guarantee: "Every dropped sample is within ±deadband of the last kept value, so step-hold reconstruction is within ±deadband.",
  }),
  "swinging-door": info({
    method: "swinging-door",
    title: "Swinging door",
    kinds: ANALOG,
    role: "selection",
    lossy: true,
    streaming: true,
    reconstruction: "linear",
    params: [{ name: "deviation", type: "magnitude", magnitude: "width", required: true, help: "Half-width of the corridor around the line between kept samples." }, maxInterval],
    source: 'E. H. Bristol, "Swinging door trending: adaptive trend recording?", ISA National Conference, 1990',
    guarantee: "Every dropped sample stays within ±deviation of the line between the kept samples around it.",
  }),
  lttb: info({
    method: "lttb",
    title: "Largest-Triangle-Three-Buckets",
    kinds: ANALOG,
    role: "selection",
    lossy: true,
    streaming: false,
    reconstruction: "linear",
    params: [points],
    source: 'S. Steinarsson, "Downsampling Time Series for Visual Representation", MSc thesis, University of Iceland, 2013',
    guarantee: "Exactly the given number of samples is kept (more only where gaps and quality changes need their ends), chosen to keep the visual shape; there is no error bound.",
  }),
  ltob: info({
    method: "ltob",
    title: "Largest-Triangle-One-Bucket",
    kinds: ANALOG,
    role: "selection",
    lossy: true,
    streaming: false,
    reconstruction: "linear",
    params: [points],
    source: 'S. Steinarsson, "Downsampling Time Series for Visual Representation", MSc thesis, University of Iceland, 2013',
    guarantee: "Exactly the given number of samples is kept (more only where gaps and quality changes need their ends), one per bucket by effective area; there is no error bound.",
  }),
  rdp: info({
    method: "rdp",
    title: "Ramer–Douglas–Peucker",
    kinds: ANALOG,
    role: "selection",
    lossy: true,
    streaming: false,
    reconstruction: "linear",
    params: [
      { name: "epsilon", type: "magnitude", magnitude: "width", required: true, help: "Largest distance of a dropped sample from the kept line." },
      { name: "distance", type: "enum", values: ["vertical", "perpendicular"], required: false, default: "vertical", help: "Vertical (in the tag's unit) or perpendicular distance." },
    ],
    source: "U. Ramer, Computer Graphics and Image Processing 1(3), 1972; D. Douglas & T. Peucker, The Canadian Cartographer 10(2), 1973",
    guarantee: "Every dropped sample lies within epsilon of the line between the kept samples around it (vertically, in the tag's unit, by default).",
  }),
  m4: info({
    method: "m4",
    title: "M4",
    kinds: ANALOG,
    role: "selection",
    lossy: true,
    streaming: false,
    reconstruction: "linear",
    params: [window("Window length in seconds: the time span of one pixel column."), offset],
    source: 'U. Jugel, Z. Jerzak, G. Hackenbroich, V. Markl, "M4: A Visualization-Oriented Time Series Data Aggregation", PVLDB 7(10), 2014',
    guarantee: "Every window keeps its first, last, minimum and maximum sample, so a line chart with one pixel column per window draws the same pixels.",
  }),
  aggregate: info({
    method: "aggregate",
    title: "Windowed aggregate",
    kinds: ANALOG,
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [
      { name: "fn", type: "enum", values: AGGREGATE_FNS, required: true, help: "The statistic per window." },
      window(),
      offset,
      { name: "calendar", type: "boolean", required: false, default: false, help: "Align windows of an hour or more to the site's local calendar (23- and 25-hour days at DST changes)." },
      { name: "percentile", type: "number", required: false, min: 0, max: 100, help: "For fn percentile: 0–100 (Hyndman & Fan type 7)." },
      { name: "interpolation", type: "enum", values: ["step", "linear"], required: false, default: "linear", help: "For fn timeWeightedMean: step-hold or straight lines between samples." },
      { name: "include-uncertain", type: "boolean", required: false, default: false, help: "Use uncertain samples as well as good ones." },
    ],
    source: "OPC UA Part 13 (Aggregates); percentiles by Hyndman & Fan type 7, The American Statistician 50(4), 1996",
    guarantee: "Each window gives its statistic over its usable samples exactly, with the share of good samples and a window quality.",
  }),
  "exceedance-count": info({
    method: "exceedance-count",
    title: "Exceedance count",
    kinds: ANALOG,
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), threshold, direction, hysteresis, offset],
    source: "common practice (Schmitt-trigger hysteresis)",
    guarantee: "Every crossing of the threshold, re-armed past the hysteresis, is counted in the window where it completes.",
  }),
  "exceedance-events": info({
    method: "exceedance-events",
    title: "Exceedance events",
    kinds: ANALOG,
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), threshold, { name: "limit", type: "number", required: true, min: 0, help: "A window is an event when its crossing count exceeds this." }, direction, hysteresis, offset],
    source: "common practice",
    guarantee: "Every window with more crossings than the limit is reported with its count, and no other.",
  }),
  "time-above": info({
    method: "time-above",
    title: "Time above threshold",
    kinds: ANALOG,
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), threshold, offset],
    source: "common practice",
    guarantee: "Each window gives the exact step-hold time (ms) the value spent above the threshold.",
  }),
  "change-of-state": info({
    method: "change-of-state",
    title: "Change of state",
    kinds: ["analog", "discrete"],
    role: "selection",
    lossy: false,
    streaming: true,
    reconstruction: "step",
    params: [],
    source: "common practice",
    guarantee: "Every change of state is kept, so step-hold reconstruction equals the input at every sample.",
  }),
  "transition-count": info({
    method: "transition-count",
    title: "Transition count",
    kinds: ["analog", "discrete"],
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), offset],
    source: "common practice",
    guarantee: "Every change of state is counted in the window where it happens.",
  }),
  "time-in-state": info({
    method: "time-in-state",
    title: "Time in state",
    kinds: ["analog", "discrete"],
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), { name: "state", type: "number", required: true, help: "The state whose time is measured." }, offset],
    source: "common practice",
    guarantee: "Each window gives the exact step-hold time (ms) the signal spent in the state.",
  }),
  "counter-delta": info({
    method: "counter-delta",
    title: "Counter delta",
    kinds: ["analog", "counter"],
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), rollover, resetShare, offset],
    source: "common practice",
    guarantee: "Each window gives the counter's increase, across rollovers and resets, so the windows add up to the total count.",
  }),
  "counter-rate": info({
    method: "counter-rate",
    title: "Counter rate",
    kinds: ["analog", "counter"],
    role: "aggregation",
    lossy: true,
    streaming: true,
    reconstruction: null,
    params: [window(), rollover, resetShare, offset],
    source: "common practice",
    guarantee: "Each window gives the counter's increase per second of the window, across rollovers and resets.",
  }),
};
