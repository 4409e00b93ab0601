// Messages between the workbench page and its preview worker. The worker holds the
// sample series and every result; the page sends small requests and receives metrics,
// sweep points and chart-ready typed arrays (transferred, not copied).
import type { CsvProblem, TimestampFormat } from "@/lib/preview/csv";
import type { DemoSignal } from "@/lib/preview/demo-signals";
import type { ByteModel, OutputMetrics } from "@/lib/preview/run";
import type { SettingGoal, SweepPoint, SweepTarget } from "@/lib/preview/sweep";
import type { Profile, ProfileTag } from "@/lib/reduction/profile";

/** What the worker holds after loading sample data. */
export type SampleSummary = {
  source: string;
  rows: number;
  from: number;
  to: number;
  bad: number;
  format: TimestampFormat | "generated" | "saved";
  columns: string | null;
};

/** A profile run: the document (perhaps edited in place), the tag context and the site's zone. */
export type RunSpec = { profile: Profile; tag: ProfileTag; timeZone: string; byteModel: ByteModel };

export type OutputSummary = { name: string; metrics: OutputMetrics; reconstruction: "linear" | "step" | null; selection: boolean };

/**
 * Chart data for one visible time range, aligned on one x array (epoch ms): series 0 is
 * the raw signal, then each output, then the bad-quality markers. In `ys`, NaN means "no
 * sample of this series at this x" (drawn across) and Infinity means "break the line
 * here" (a gap). `inView` counts each series' real samples in the range before decimation.
 */
export type ViewData = { from: number; to: number; x: Float64Array; ys: Float64Array[]; inView: number[] };

export type Calls = {
  "load-csv": { req: { file: File; timeZone: string }; res: { summary: SampleSummary } | { problems: CsvProblem[] } };
  "load-demo": {
    req: { signal: DemoSignal; samples: number; periodMs: number; euLow?: number; euHigh?: number };
    res: { summary: SampleSummary };
  };
  preview: {
    req: { run: RunSpec; width: number; gapMs: number; range?: { from: number; to: number } };
    res: { outputs: OutputSummary[]; view: ViewData; ms: number };
  };
  view: { req: { from: number; to: number; width: number; gapMs: number }; res: ViewData };
  "load-wire": { req: { buffer: ArrayBuffer; source: string }; res: { summary: SampleSummary } | { problems: CsvProblem[] } };
  "export-wire": { req: Record<string, never>; res: { buffer: ArrayBuffer } };
  sweep: { req: { run: RunSpec; target: SweepTarget; values: number[] }; res: { points: SweepPoint[]; ms: number } };
  find: {
    req: { run: RunSpec; target: SweepTarget; grid: number[]; goal: SettingGoal };
    res: { best: SweepPoint | null; evaluated: SweepPoint[]; ms: number };
  };
};

export type CallKind = keyof Calls;
export type Request = { [K in CallKind]: { id: number; kind: K; payload: Calls[K]["req"] } }[CallKind];
/** Wiring, not calls: a worker becomes a sweep helper on `port`, or the preview worker gets a helper's port. */
export type Setup = { setup: "helper" | "attach"; port: MessagePort };
export type Reply = { id: number; ok: true; result: unknown } | { id: number; ok: false; error: string };
