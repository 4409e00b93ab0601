/**
 * Sluice's reduction methods (batch forms): pure TypeScript on typed arrays, no I/O, no
 * DOM, no Node-only APIs — the same code runs on the server, in the browser and in the
 * gateway agent. Selection methods return kept indices; aggregations return a series.
 */
export { type Series, SeriesError, validateSeries, QUALITY_GOOD, QUALITY_UNCERTAIN, QUALITY_BAD } from "./series";
export { swingingDoor, type SwingingDoorParams } from "./swinging-door";
export { deadband, percentOfRange, type DeadbandParams } from "./deadband";
export { lttb, ltob, type BucketParams } from "./lttb";
export { rdp, type RdpParams } from "./rdp";
export { m4 } from "./m4";
export { aggregate, AGGREGATE_FNS, type AggregateFn, type AggregateParams } from "./aggregate";
export { exceedances, exceedanceEvents, timeAbove } from "./exceedance";
export type { ExceedanceParams, ExceedanceEventParams, TimeAboveParams } from "./exceedance";
export { measure, type Metrics, type MeasureParams } from "./measure";
export { windowStart, type WindowParams } from "./windows";
