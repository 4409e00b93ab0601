"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import { api } from "@/lib/client/api";
import { unitsConvert } from "@/lib/units";
import type { CsvProblem } from "@/lib/preview/csv";
import type { DemoSignal } from "@/lib/preview/demo-signals";
import type { ByteModel } from "@/lib/preview/run";
import type { SettingGoal, SweepTarget } from "@/lib/preview/sweep";
import type { Profile } from "@/lib/reduction/profile";
import type { ChartOutput } from "./chart-data";
import { count, num, ratio } from "./format";
import { applyValues } from "./numeric-params";
import { StaleAnswer, usePreviewClient } from "./preview-client";
import { DEFAULT_TAG, DEMO_TAGS, readTag, type TagFields } from "./tag-fields";
import type { OutputSummary, RunSpec, SampleSummary, ViewData } from "./worker-protocol";

/** The plain byte model the workbench states beside its figures. */
export const BYTE_MODEL: ByteModel = { bytesPerSample: 16, transportOverhead: 0.1 };
const GAP_FACTOR = 3;

export type PreviewResult = { outputs: OutputSummary[]; chart: ChartOutput[]; view: ViewData; full: { from: number; to: number } };

const quiet = (e: unknown) => (e instanceof StaleAnswer ? null : e instanceof Error ? e.message : String(e));

/** State and worker calls of the workbench page; the page only lays them out. */
export function useWorkbench(initialSite: { slug: string; timeZone: string } | null) {
  const client = usePreviewClient();
  const [site, setSite] = useState(initialSite?.slug ?? "");
  const [timeZone, setTimeZone] = useState(initialSite?.timeZone ?? "UTC");
  const [tagFields, setTagFields] = useState<TagFields>(DEFAULT_TAG);
  const [pick, setPick] = useState<{ profileId: number | null; revision: number | null }>({ profileId: null, revision: null });
  const [base, setBase] = useState<Profile | null>(null);
  const [values, setValues] = useState<Record<string, string>>({});
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [sample, setSample] = useState<SampleSummary | null>(null);
  const [csvProblems, setCsvProblems] = useState<CsvProblem[]>([]);
  const [loading, setLoading] = useState(false);
  const [result, setResult] = useState<PreviewResult | null>(null);
  const [runError, setRunError] = useState("");
  const [running, setRunning] = useState(false);
  const [status, setStatus] = useState("");
  const file = useRef<File | null>(null);
  const width = useRef(1000);
  const range = useRef<{ from: number; to: number } | null>(null);
  const latest = useRef({ base, values, tagFields, timeZone, sample });
  latest.current = { base, values, tagFields, timeZone, sample };

  const spec = (profile: Profile): RunSpec | string => {
    const t = readTag(latest.current.tagFields);
    if ("problem" in t) return t.problem;
    return { profile, tag: t.tag, timeZone: latest.current.timeZone, byteModel: BYTE_MODEL };
  };

  const runWith = useCallback(
    async (profile: Profile) => {
      const s = latest.current.sample;
      if (!client || !s) return;
      const run = spec(profile);
      if (typeof run === "string") return void setRunError(run);
      setRunning(true);
      try {
        const r = await client.call("preview", { run, width: width.current, gapMs: GAP_FACTOR * run.tag.samplePeriodMs, range: range.current ?? undefined });
        performance.mark("sluice:preview-received");
        setRunError("");
        setResult({ outputs: r.outputs, chart: r.outputs.map((o) => ({ name: o.name, reconstruction: o.reconstruction })), view: r.view, full: { from: s.from, to: s.to } });
        const words = r.outputs.map((o) => `${o.name} keeps ${count(o.metrics.samplesOut)} of ${count(o.metrics.samplesIn)} samples (${ratio(o.metrics.ratio)}), max error ${num(o.metrics.maxAbsError)} ${run.tag.unit}`);
        setStatus(`Preview finished in ${(r.ms / 1000).toFixed(2)} s: ${words.join("; ")}.`);
      } catch (e) {
        const msg = quiet(e);
        if (msg === null) return;
        setRunError(msg);
        setResult(null);
        setStatus(`The preview failed: ${msg}`);
      } finally {
        setRunning(false);
      }
    },
    [client],
  );

  /** The revision as edited in place, or null (problems shown beside the fields). */
  const currentDoc = (vals = latest.current.values): Profile | null => {
    const b = latest.current.base;
    if (!b) return null;
    const r = applyValues(b, vals);
    setProblems(r.problems);
    return Object.keys(r.problems).length ? null : r.profile;
  };
  const rerun = () => {
    const doc = currentDoc();
    if (doc) void runWith(doc);
  };

  // A revision loads with its saved parameters.
  useEffect(() => {
    setBase(null);
    setValues({});
    setProblems({});
    setResult(null);
    if (pick.profileId === null || pick.revision === null) return;
    api<{ document: Profile }>(`/api/profiles/${pick.profileId}/revisions/${pick.revision}`)
      .then((r) => setBase(r.document))
      .catch((e: Error) => setRunError(e.message));
  }, [pick.profileId, pick.revision]);
  // New data or a new revision runs at once; a changed tag context after a pause.
  useEffect(rerun, [base, sample, client]);
  const tagKey = JSON.stringify([tagFields, timeZone]);
  const firstTag = useRef(true);
  useEffect(() => {
    if (firstTag.current) return void (firstTag.current = false);
    const timer = setTimeout(rerun, 400);
    return () => clearTimeout(timer);
  }, [tagKey]);

  const loaded = (summary: SampleSummary) => {
    range.current = null;
    setCsvProblems([]);
    setSample(summary);
    setStatus(`Loaded ${count(summary.rows)} samples from ${summary.source}.`);
  };
  const loadFile = async (f: File, zone = latest.current.timeZone) => {
    if (!client) return;
    setLoading(true);
    try {
      const r = await client.call("load-csv", { file: f, timeZone: zone });
      file.current = "problems" in r ? file.current : f;
      if ("problems" in r) {
        setCsvProblems(r.problems);
        setStatus(`The CSV was not loaded: ${r.problems.length} ${r.problems.length === 1 ? "problem" : "problems"}, the first on line ${r.problems[0]?.line}.`);
      } else loaded(r.summary);
    } catch (e) {
      const msg = quiet(e);
      if (msg !== null) setCsvProblems([{ line: 0, message: msg }]);
    } finally {
      setLoading(false);
    }
  };
  // CSV times without an offset are read in the site's zone: read the file again when it changes.
  useEffect(() => {
    if (!file.current || sample?.format === "generated") return;
    const timer = setTimeout(() => file.current && loadFile(file.current, timeZone), 600);
    return () => clearTimeout(timer);
  }, [timeZone]);

  const loadDemo = async (signal: DemoSignal, samples: number) => {
    if (!client) return;
    let fields = latest.current.tagFields;
    // The demo's own kind of tag when the context is of another kind or measure.
    if (fields.kind !== DEMO_TAGS[signal].kind || !unitsConvert(fields.unit, DEMO_TAGS[signal].unit)) {
      fields = { ...DEMO_TAGS[signal], samplePeriodMs: fields.samplePeriodMs };
      setTagFields(fields);
      latest.current.tagFields = fields;
    }
    const t = readTag(fields);
    const tag = "tag" in t ? t.tag : null;
    file.current = null;
    setLoading(true);
    try {
      const r = await client.call("load-demo", { signal, samples, periodMs: tag?.samplePeriodMs ?? 1000, euLow: tag?.euLow ?? undefined, euHigh: tag?.euHigh ?? undefined });
      loaded(r.summary);
    } catch (e) {
      const msg = quiet(e);
      if (msg !== null) setCsvProblems([{ line: 0, message: msg }]);
    } finally {
      setLoading(false);
    }
  };

  /** Loads a saved sample set (our binary wire format) into the worker. */
  const loadSaved = async (id: number, name: string) => {
    if (!client) return;
    setLoading(true);
    try {
      const res = await fetch(`/api/sample-sets/${id}/data`);
      if (!res.ok) throw new Error(((await res.json().catch(() => ({}))) as { error?: string }).error ?? `the server answered ${res.status}`);
      const r = await client.call("load-wire", { buffer: await res.arrayBuffer(), source: `sample set “${name}”` });
      if ("problems" in r) setCsvProblems(r.problems);
      else loaded(r.summary);
    } catch (e) {
      const msg = quiet(e);
      if (msg !== null) setCsvProblems([{ line: 0, message: msg }]);
    } finally {
      setLoading(false);
    }
  };

  /** The loaded samples in the wire format, for saving as a sample set. */
  const exportSamples = async (): Promise<ArrayBuffer> => {
    if (!client) throw new Error("The preview worker is not ready.");
    return (await client.call("export-wire", {})).buffer;
  };

  const requestRange = async (from: number, to: number, w: number) => {
    width.current = w;
    range.current = { from, to };
    const t = readTag(latest.current.tagFields);
    if (!client || !("tag" in t)) return;
    try {
      const v = await client.call("view", { from, to, width: w, gapMs: GAP_FACTOR * t.tag.samplePeriodMs });
      setResult((r) => (r && v.ys.length === r.outputs.length + 2 ? { ...r, view: v } : r));
    } catch (e) {
      if (quiet(e) !== null) setStatus(`The chart could not be updated: ${quiet(e)}`);
    }
  };

  const tuningCall = (): RunSpec => {
    const doc = currentDoc();
    if (!doc) throw new Error("Fix the parameters first.");
    const run = spec(doc);
    if (typeof run === "string") throw new Error(run);
    return run;
  };
  const sweep = async (target: SweepTarget, vals: number[]) => {
    if (!client) throw new Error("The preview worker is not ready.");
    return client.call("sweep", { run: tuningCall(), target, values: vals });
  };
  const find = async (target: SweepTarget, grid: number[], goal: SettingGoal) => {
    if (!client) throw new Error("The preview worker is not ready.");
    return client.call("find", { run: tuningCall(), target, grid, goal });
  };
  const applyFound = (key: string, value: number) => {
    const next = { ...latest.current.values, [key]: String(value) };
    setValues(next);
    const doc = currentDoc(next);
    if (doc) void runWith(doc);
  };

  const edited = base !== null && applyValues(base, values).profile !== base;
  const revert = () => {
    setValues({});
    setProblems({});
    if (base) void runWith(base);
  };
  return {
    ready: !!client && !!sample && !!base,
    site,
    setSite,
    timeZone,
    setTimeZone,
    tagFields,
    setTagFields,
    pick,
    setPick,
    base,
    values,
    setValues,
    problems,
    edited,
    revert,
    rerun,
    sample,
    csvProblems,
    loading,
    loadFile,
    loadDemo,
    loadSaved,
    exportSamples,
    result,
    runError,
    running,
    status,
    requestRange,
    sweep,
    find,
    applyFound,
    width,
  };
}
