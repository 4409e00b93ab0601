/**
 * Sample data, previews and tuning for reduction profiles (issue #8): reading a sample
 * CSV, generated demo signals, running a profile with its metrics, parameter sweeps and
 * "find a setting". Pure TypeScript without I/O, DOM or Node-only APIs: the same code
 * runs on the server and in a browser web worker.
 */
export { parseSampleCsv, SAMPLE_CSV_MAX_ROWS, type CsvProblem, type TimestampFormat, type ParsedSamples } from "./csv";
export { TIME_COLUMNS, VALUE_COLUMNS, QUALITY_COLUMNS } from "./csv-header";
export { DEMO_SIGNALS, demoSignal, mulberry32, type DemoSignal, type DemoSignalOptions } from "./demo-signals";
export {
  previewProfile,
  reconstructionOf,
  DEFAULT_BYTE_MODEL,
  type ByteModel,
  type OutputMetrics,
  type OutputPreview,
} from "./run";
export { gridValues, sweepParameter, createSweep, bestPoint, findSetting, type SweepTarget, type SweepPoint, type SettingGoal } from "./sweep";
