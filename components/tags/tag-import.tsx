"use client";

import Papa from "papaparse";
import Link from "next/link";
import { useState } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import { checkCsvSize, parseTagCsvStreaming, suggestMapping, TAG_CSV_COLUMNS, type Mapping } from "@/lib/tags/csv";
import type { TagValues } from "@/schemas/tag";

type Props = { site: string; gateways: string[] };
type Plan = { added: string[]; updated: string[]; unchanged: number; missing: string[]; removed: string[] };
type RowError = { line: number; field?: string; reason: string };

/**
 * Import a plant's tag list: choose a file, map its columns, see every bad row with its
 * line number before anything is written, then import all or nothing.
 */
export function TagImport({ site, gateways }: Readonly<Props>) {
  const [file, setFile] = useState<File | null>(null);
  const [headers, setHeaders] = useState<string[]>([]);
  const [mapping, setMapping] = useState<Mapping | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [errors, setErrors] = useState<RowError[] | null>(null);
  const [rows, setRows] = useState<TagValues[] | null>(null);
  const [plan, setPlan] = useState<Plan | null>(null);
  const [removeMissing, setRemoveMissing] = useState(false);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<Plan | null>(null);

  function reset() {
    setErrors(null);
    setRows(null);
    setPlan(null);
    setRemoveMissing(false);
    setDone(null);
  }

  async function choose(f: File | null) {
    reset();
    setFile(f);
    setHeaders([]);
    setMapping(null);
    if (!f) return;
    const tooBig = checkCsvSize(f.size);
    if (tooBig) {
      setErrors([{ line: 0, reason: tooBig }]);
      return;
    }
    Papa.parse<string[]>(f, {
      preview: 1,
      skipEmptyLines: true,
      complete: (res) => {
        const h = (res.data[0] ?? []).map((s) => String(s).replace(/^\uFEFF/, "").trim());
        setHeaders(h);
        setMapping(suggestMapping(h));
      },
    });
  }

  async function check() {
    if (!file || !mapping) return;
    reset();
    setBusy(true);
    setProgress(0);
    try {
      const result = await parseTagCsvStreaming(file, { mapping, gateways }, (f) => setProgress(f));
      if (result.errors.length) {
        setErrors(result.errors);
        return;
      }
      setRows(result.rows);
      setPlan(await api<Plan>(`/api/sites/${site}/tags/import`, { method: "POST", json: { rows: result.rows, dryRun: true } }));
    } catch (e) {
      toast.error(e instanceof ApiFailure ? e.message : "The file could not be read.");
    } finally {
      setBusy(false);
      setProgress(null);
    }
  }

  async function runImport() {
    if (!rows || !plan) return;
    setBusy(true);
    try {
      const result = await api<Plan>(`/api/sites/${site}/tags/import`, {
        method: "POST",
        json: { rows, remove: removeMissing ? plan.missing : [] },
      });
      setDone(result);
      toast.success(`Imported: ${result.added.length} added, ${result.updated.length} updated, ${result.removed.length} removed.`);
    } catch (e) {
      toast.error(`Nothing imported: ${e instanceof ApiFailure ? e.message : "the server did not answer"}`);
    } finally {
      setBusy(false);
    }
  }

  const fieldsMissing = mapping ? TAG_CSV_COLUMNS.filter((c) => c.required && mapping[c.key] == null) : [];

  return (
    <div className="flex max-w-4xl flex-col gap-5">
      <section aria-labelledby="step-file" className="rounded-panel border border-panel-line bg-panel p-4">
        <h3 id="step-file" className="text-lead font-medium">
          1. Choose a CSV file
        </h3>
        <p className="mt-1 text-micro text-ink-faint">
          Up to 20 MB and 200,000 rows. Comma, semicolon or tab separated; the first line holds the column names.
        </p>
        <input
          type="file"
          accept=".csv,text/csv"
          aria-label="CSV file"
          className="mt-2 block text-label"
          onChange={(e) => void choose(e.target.files?.[0] ?? null)}
        />
      </section>

      {mapping && headers.length ? (
        <section aria-labelledby="step-map" className="rounded-panel border border-panel-line bg-panel p-4">
          <h3 id="step-map" className="text-lead font-medium">
            2. Match the columns
          </h3>
          <div className="mt-2 grid gap-3 sm:grid-cols-3">
            {TAG_CSV_COLUMNS.map((c) => (
              <label key={c.key} className="flex flex-col gap-1 text-label text-ink-soft">
                {c.label}
                {c.required ? " (required)" : ""}
                <select
                  className={inputClass}
                  value={mapping[c.key] ?? ""}
                  onChange={(e) => {
                    setMapping({ ...mapping, [c.key]: e.target.value === "" ? null : Number(e.target.value) });
                    reset();
                  }}
                >
                  <option value="">— not in the file —</option>
                  {headers.map((h, i) => (
                    <option key={`${h}-${i}`} value={i}>
                      {h || `column ${i + 1}`}
                    </option>
                  ))}
                </select>
              </label>
            ))}
          </div>
          {fieldsMissing.length ? (
            <p className="mt-2 text-label text-fault">Choose a column for: {fieldsMissing.map((c) => c.label).join(", ")}.</p>
          ) : null}
          <Button className="mt-3" onClick={check} disabled={busy || fieldsMissing.length > 0}>
            Check the file
          </Button>
          {progress !== null ? (
            <div className="mt-2 flex items-center gap-2 text-label" aria-live="polite">
              <progress max={1} value={progress} aria-label="Reading the file" className="w-64" /> {Math.round(progress * 100)} %
            </div>
          ) : null}
        </section>
      ) : null}

      {errors ? (
        <section role="alert" aria-labelledby="bad-rows" className="rounded-panel border border-fault bg-fault-soft p-4">
          <h3 id="bad-rows" className="text-lead font-medium text-fault">
            {errors.length} problem{errors.length === 1 ? "" : "s"} — nothing will be imported until the file is fixed
          </h3>
          <ul className="mt-2 max-h-80 overflow-y-auto text-label" aria-label="Bad rows" tabIndex={0}>
            {errors.slice(0, 1000).map((e, i) => (
              <li key={i}>
                {e.line ? <span className="font-mono">line {e.line}</span> : null}
                {e.field ? <span className="text-ink-soft"> ({e.field})</span> : null}: {e.reason}
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {plan && !done ? (
        <section aria-labelledby="step-plan" className="rounded-panel border border-panel-line bg-panel p-4">
          <h3 id="step-plan" className="text-lead font-medium">
            3. Review and import
          </h3>
          <p className="mt-1 text-label" data-testid="import-plan">
            {plan.added.length} new, {plan.updated.length} changed, {plan.unchanged} unchanged; {plan.missing.length} tag
            {plan.missing.length === 1 ? " is" : "s are"} in the inventory but not in the file.
          </p>
          {plan.missing.length ? (
            <div className="mt-2">
              <label className="flex items-center gap-2 text-label">
                <input type="checkbox" checked={removeMissing} onChange={(e) => setRemoveMissing(e.target.checked)} />
                Also remove the {plan.missing.length} tag{plan.missing.length === 1 ? "" : "s"} not in the file
              </label>
              <ul className="mt-1 max-h-40 overflow-y-auto rounded border border-panel-line p-2 font-mono text-micro" aria-label="Tags not in the file" tabIndex={0}>
                {plan.missing.map((n) => (
                  <li key={n}>{n}</li>
                ))}
              </ul>
            </div>
          ) : null}
          <Button className="mt-3" onClick={runImport} disabled={busy}>
            {busy ? "Importing…" : "Import"}
          </Button>
        </section>
      ) : null}

      {done ? (
        <section role="status" data-testid="import-done" className="rounded-panel border border-ok bg-ok-soft p-4 text-label">
          Imported: {done.added.length} added, {done.updated.length} updated, {done.removed.length} removed.{" "}
          <Link href={`/sites/${site}/tags`} className="font-medium underline">
            Back to the inventory
          </Link>
        </section>
      ) : null}
    </div>
  );
}
