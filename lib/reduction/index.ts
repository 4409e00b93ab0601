/**
 * Sluice's reduction methods: pure TypeScript on typed arrays, no I/O, no DOM, no
 * Node-only APIs — the same code runs on the server, in the browser and in the gateway
 * agent. Selection methods return kept indices; aggregations return a series per window
 * with its quality and good share. Streaming processors, the profile runner and the
 * Gorilla byte model build on them.
 */
export { type Series, type QualifiedSeries, SeriesError, validateSeries, QUALITY_GOOD, QUALITY_UNCERTAIN, QUALITY_BAD } from "./series";
export { type SignalParams, gapThreshold, DEFAULT_GAP_FACTOR } from "./signal";
export { stretchStarts } from "./stretches";
export { swingingDoor, type SwingingDoorParams } from "./swinging-door";
export { deadband, percentOfRange, type DeadbandParams } from "./deadband";
export { lttb, ltob, type BucketParams } from "./lttb";
export { rdp, type RdpParams } from "./rdp";
export { m4, type M4Params } from "./m4";
export { qualityFilter, passThrough, drop, type QualityFilterParams } from "./quality";
export { changeOfState, transitionCount, timeInState } from "./discrete";
export type { ChangeOfStateParams, TransitionParams, TimeInStateParams } from "./discrete";
export { counterDelta, counterRate, counterIncrement, type CounterParams } from "./counter";
export { aggregate, AGGREGATE_FNS, type AggregateFn, type AggregateParams } from "./aggregate";
export { exceedances, exceedanceEvents, timeAbove } from "./exceedance";
export type { ExceedanceParams, ExceedanceEventParams, TimeAboveParams } from "./exceedance";
export type { WindowSeries } from "./window-kernel";
export { measure, type Metrics, type MeasureParams } from "./measure";
export { windowStart, windowGrid, type WindowGrid, type WindowParams } from "./windows";
export type { StreamProcessor, StreamChunk, StreamParams } from "./stream";
export {
  createSwingingDoorStream,
  createDeadbandStream,
  createChangeOfStateStream,
  createQualityFilterStream,
  createPassThroughStream,
  createDropStream,
} from "./stream-selection";
export {
  createAggregateStream,
  createExceedanceStream,
  createExceedanceEventStream,
  createTimeAboveStream,
  createTransitionCountStream,
  createTimeInStateStream,
  createCounterDeltaStream,
  createCounterRateStream,
} from "./stream-windows";
export { encodedBits, gorillaEncode, gorillaDecode, type GorillaOptions, type GorillaEncoded } from "./gorilla";
export {
  TAG_KINDS,
  OUTPUT_NAME_PATTERN,
  ProfileError,
  METHODS,
  resolveSteps,
  validateProfile,
  runProfile,
  createProfileStream,
} from "./profile";
export type {
  TagKind,
  Abs,
  Pct,
  Magnitude,
  Profile,
  ProfileOutput,
  Step,
  StepOf,
  ResolvedStep,
  StepMethod,
  ProfileTag,
  ParameterOverride,
  RunContext,
  ResolvedProfile,
  MethodInfo,
  ParamInfo,
  OutputRun,
  ProfileRun,
  ProfileStream,
  StreamCounter,
} from "./profile";
