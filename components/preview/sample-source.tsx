"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import type { CsvProblem } from "@/lib/preview/csv";
import { DEMO_SIGNALS, type DemoSignal } from "@/lib/preview/demo-signals";
import { count, duration, formatRange } from "./format";
import type { SampleSummary } from "./worker-protocol";

type Props = {
  summary: SampleSummary | null;
  problems: readonly CsvProblem[];
  loading: boolean;
  timeZone: string;
  onFile: (file: File) => void;
  onDemo: (signal: DemoSignal, samples: number) => void;
};

const MAX_DEMO = 2_000_000;

/** Sample data: a CSV of timestamp, value and optional quality, or a generated demo signal. */
export function SampleSource({ summary, problems, loading, timeZone, onFile, onDemo }: Readonly<Props>) {
  const id = useId();
  const [signal, setSignal] = useState<DemoSignal>("temperature");
  const [samples, setSamples] = useState("20000");
  const n = Number(samples);
  const samplesOk = Number.isInteger(n) && n >= 10 && n <= MAX_DEMO;
  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 md:grid-cols-2">
        <Field
          label="Sample data CSV"
          htmlFor={`${id}-csv`}
          hint={`Columns time (ISO 8601 or epoch s/ms; without an offset read in ${timeZone}), value and optional quality (good, uncertain, bad or 0/1/2).`}
        >
          <input
            id={`${id}-csv`}
            type="file"
            accept=".csv,.tsv,.txt,text/csv"
            className="text-label file:mr-2 file:rounded-panel file:border file:border-panel-line file:bg-panel file:px-2 file:py-1"
            onChange={(e) => {
              const file = e.target.files?.[0];
              if (!file) return;
              performance.mark("sluice:file-chosen");
              onFile(file);
              e.target.value = "";
            }}
          />
        </Field>
        <div className="flex flex-wrap items-end gap-2">
          <Field label="Demo signal" htmlFor={`${id}-demo`}>
            <select id={`${id}-demo`} className={inputClass} value={signal} onChange={(e) => setSignal(e.target.value as DemoSignal)}>
              {DEMO_SIGNALS.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </Field>
          <Field label="Samples" htmlFor={`${id}-n`} error={samplesOk || samples === "" ? undefined : `From 10 to ${count(MAX_DEMO)}.`}>
            <input id={`${id}-n`} type="number" min={10} max={MAX_DEMO} step={1} className={`${inputClass} w-32`} value={samples} onChange={(e) => setSamples(e.target.value)} />
          </Field>
          <Button tone="quiet" disabled={!samplesOk || loading} onClick={() => onDemo(signal, n)}>
            Generate
          </Button>
        </div>
      </div>
      {loading ? <p className="text-label text-ink-soft">Reading sample data…</p> : null}
      {problems.length > 0 ? (
        <div role="alert" className="rounded-panel border border-fault/40 bg-fault-soft px-3 py-2 text-label">
          <p className="font-medium text-fault">The CSV was not loaded:</p>
          <ul className="mt-1 list-disc pl-5" aria-label="Problems in the CSV" data-testid="csv-problems">
            {problems.map((p, i) => (
              <li key={i}>
                {p.line > 0 ? `line ${p.line}: ` : ""}
                {p.message}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {summary ? (
        <p className="text-label text-ink-soft" data-testid="sample-summary">
          <strong className="text-ink">{summary.source}</strong>: {count(summary.rows)} samples, {formatRange(summary.from, summary.to, timeZone)} (
          {duration(summary.to - summary.from)}){summary.bad ? `, ${count(summary.bad)} bad-quality` : ""}
          {summary.columns ? `; columns ${summary.columns}` : ""}.
        </p>
      ) : null}
    </div>
  );
}
