"use client";

import Link from "next/link";
import { useState } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import { splitLine } from "./form-paths";

type Result = { id: number; name: string; revision: number; outcome: "created" | "revised" | "unchanged" };
type Problem = { field: string; line: number | null; message: string };

const MAX_BYTES = 256 * 1024;

const OUTCOME: Record<Result["outcome"], (r: Result) => string> = {
  created: (r) => `Created profile “${r.name}” at revision ${r.revision}.`,
  revised: (r) => `Saved revision ${r.revision} of “${r.name}”.`,
  unchanged: (r) => `“${r.name}” already has this content at revision ${r.revision}; nothing was saved.`,
};

/** Imports one profile from YAML: a new profile, a new revision of the one with that name, or nothing when it is the same. */
export function ProfileImport() {
  const [text, setText] = useState("");
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<Result | null>(null);
  const [problems, setProblems] = useState<Problem[] | null>(null);

  async function choose(file: File | null) {
    setResult(null);
    setProblems(null);
    if (!file) return;
    if (file.size > MAX_BYTES) {
      setProblems([{ field: "file", line: null, message: `The file is larger than ${MAX_BYTES / 1024} KB.` }]);
      return;
    }
    setText(await file.text());
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setResult(null);
    setProblems(null);
    if (text.trim() === "") {
      setProblems([{ field: "file", line: null, message: "Paste the YAML or choose a file first." }]);
      return;
    }
    setBusy(true);
    try {
      const r = await api<Result>(`/api/profiles/import${note.trim() ? `?note=${encodeURIComponent(note.trim())}` : ""}`, {
        method: "POST",
        headers: { "content-type": "application/yaml" },
        body: text,
      });
      setResult(r);
      toast.success(OUTCOME[r.outcome](r));
    } catch (err) {
      if (err instanceof ApiFailure) {
        const issues = err.detail.issues ?? [{ field: err.detail.field ?? "file", message: err.message }];
        setProblems(issues.map((i) => ({ field: i.field, ...splitLine(i.message) })));
        toast.error("Nothing imported: see the problems.");
      } else {
        toast.error("Nothing imported: the server did not answer.");
      }
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} noValidate aria-label="Import a profile" className="flex max-w-4xl flex-col gap-4">
      <div className="flex flex-col gap-1">
        <label htmlFor="imp-file" className="text-label font-medium text-ink-soft">
          YAML file
        </label>
        <input id="imp-file" type="file" accept=".yaml,.yml,application/yaml,text/yaml" className="text-label" onChange={(e) => void choose(e.target.files?.[0] ?? null)} />
        <p className="text-micro text-ink-faint">A file exported from Sluice, or one written by hand in the same format. Up to 256 KB.</p>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="imp-text" className="text-label font-medium text-ink-soft">
          Profile YAML
        </label>
        <textarea id="imp-text" rows={16} spellCheck={false} value={text} onChange={(e) => setText(e.target.value)} className={`${inputClass} font-mono text-label`} aria-describedby="imp-text-help" />
        <p id="imp-text-help" className="text-micro text-ink-faint">
          Paste here, or choose a file above to fill this in. A known profile name adds a revision to that profile.
        </p>
      </div>
      <div className="flex max-w-xl flex-col gap-1">
        <label htmlFor="imp-note" className="text-label font-medium text-ink-soft">
          What changed
        </label>
        <input id="imp-note" value={note} maxLength={500} onChange={(e) => setNote(e.target.value)} className={inputClass} aria-describedby="imp-note-help" />
        <p id="imp-note-help" className="text-micro text-ink-faint">
          Optional note for the revision history (default “Imported from YAML”).
        </p>
      </div>
      <div>
        <Button type="submit" disabled={busy}>
          {busy ? "Importing…" : "Import profile"}
        </Button>
      </div>
      {result ? (
        <p role="status" data-testid="import-outcome" className="rounded-panel border border-ok bg-ok-soft p-3 text-label">
          {OUTCOME[result.outcome](result)}{" "}
          <Link href={`/profiles/${result.id}`} className="font-medium underline">
            Open {result.name}
          </Link>
        </p>
      ) : null}
      {problems ? (
        <section role="alert" aria-labelledby="imp-problems" className="rounded-panel border border-fault bg-fault-soft p-4">
          <h2 id="imp-problems" className="text-lead font-medium text-fault">
            {problems.length === 1 ? "1 problem" : `${problems.length} problems`}: nothing was imported
          </h2>
          <table className="mt-2" aria-label="Import problems">
            <thead>
              <tr>
                <th scope="col">Field</th>
                <th scope="col">Line</th>
                <th scope="col">Problem</th>
              </tr>
            </thead>
            <tbody>
              {problems.map((p, i) => (
                <tr key={i}>
                  <td className="font-mono text-label">{p.field}</td>
                  <td className="font-mono text-label">{p.line ?? "—"}</td>
                  <td className="text-label">{p.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      ) : null}
    </form>
  );
}
