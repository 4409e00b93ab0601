"use client";

import { useEffect, useRef } from "react";
import type { ReactNode } from "react";
import { count, formatRange, ratio } from "./format";
import { MetricsTable } from "./metrics-table";
import { numericParams } from "./numeric-params";
import { ParamEditor } from "./param-editor";
import { PreviewChart } from "./preview-chart";
import { ProfilePicker, type ProfileOption } from "./profile-picker";
import { SampleSets } from "./sample-sets";
import { SampleSource } from "./sample-source";
import { readTag, type TagFields } from "./tag-fields";
import { TagContext, type SiteOption } from "./tag-context";
import { TuningPanel } from "./tuning-panel";
import { BYTE_MODEL, useWorkbench } from "./use-workbench";

type Props = { profiles: readonly ProfileOption[]; sites: readonly SiteOption[]; canEdit?: boolean };

const tagOf = (f: TagFields) => {
  const t = readTag(f);
  return "tag" in t ? t.tag : null;
};

function Panel({ title, children }: Readonly<{ title: string; children: ReactNode }>) {
  return (
    <section aria-label={title} className="flex flex-col gap-3 rounded-panel border border-panel-line bg-panel p-4">
      <h2>{title}</h2>
      {children}
    </section>
  );
}

/**
 * Try a profile on sample data: choose a revision (or edit its numbers here), the tag it
 * would run on and the data; see the chart, the metrics, and tune one parameter. All the
 * work happens in a web worker; only a sample set saved against a group is kept.
 */
export function Workbench({ profiles, sites, canEdit = false }: Readonly<Props>) {
  const w = useWorkbench(sites[0] ?? null);
  const chartBox = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (chartBox.current) w.width.current = Math.max(300, chartBox.current.clientWidth - 70);
  }, [w.width]);
  const params = w.base ? numericParams(w.base) : [];
  const { sample, result } = w;
  const summary =
    sample && result
      ? `Raw signal: ${count(sample.rows)} samples, ${formatRange(sample.from, sample.to, w.timeZone)}${sample.bad ? `, ${count(sample.bad)} bad-quality (red marks)` : ""}. ` +
        result.outputs.map((o) => `Output ${o.name}: ${count(o.metrics.samplesOut)} samples out (${ratio(o.metrics.ratio)}).`).join(" ")
      : "";

  return (
    <div className="flex flex-col gap-5">
      <div className="grid gap-5 lg:grid-cols-2">
        <Panel title="Profile and parameters">
          <ProfilePicker profiles={profiles} profileId={w.pick.profileId} revision={w.pick.revision} onChange={(profileId, revision) => w.setPick({ profileId, revision })} />
          {w.base ? (
            <ParamEditor
              params={params}
              values={w.values}
              problems={w.problems}
              edited={w.edited}
              ready={w.ready}
              onChange={(key, text) => w.setValues({ ...w.values, [key]: text })}
              onRun={w.rerun}
              onRevert={w.revert}
            />
          ) : null}
        </Panel>
        <div className="flex flex-col gap-5">
          <Panel title="Tag context">
            <TagContext
              sites={sites}
              site={w.site}
              onSite={w.setSite}
              timeZone={w.timeZone}
              onTimeZone={w.setTimeZone}
              fields={w.tagFields}
              onFields={w.setTagFields}
            />
          </Panel>
          <Panel title="Sample data">
            <SampleSource summary={sample} problems={w.csvProblems} loading={w.loading} timeZone={w.timeZone} onFile={w.loadFile} onDemo={w.loadDemo} />
          </Panel>
          <Panel title="Sample sets">
            <SampleSets site={w.site} canEdit={canEdit} hasSamples={!!sample} tag={tagOf(w.tagFields)} onLoad={w.loadSaved} exportSamples={w.exportSamples} />
          </Panel>
        </div>
      </div>

      <p role="status" aria-live="polite" className="min-h-5 text-label text-ink-soft" data-testid="workbench-status">
        {w.running ? "Running the preview…" : w.status}
      </p>
      {w.runError ? (
        <p role="alert" className="rounded-panel border border-fault/40 bg-fault-soft px-3 py-2 text-label text-fault">
          {w.runError}
        </p>
      ) : null}

      <section aria-label="Chart" ref={chartBox} className="rounded-panel border border-panel-line bg-panel p-4">
        {result ? (
          <PreviewChart view={result.view} outputs={result.chart} unit={w.tagFields.unit} timeZone={w.timeZone} full={result.full} onRange={w.requestRange} summary={summary} />
        ) : (
          <p className="text-label text-ink-faint">
            {!w.base ? "Choose a profile." : !sample ? "Load a CSV or generate a demo signal." : "The chart appears when the preview has run."}
          </p>
        )}
      </section>

      {result ? <MetricsTable outputs={result.outputs} unit={w.tagFields.unit} byteModel={BYTE_MODEL} /> : null}

      {w.base ? <TuningPanel params={params} unit={w.tagFields.unit} ready={w.ready} sweep={w.sweep} find={w.find} onUse={w.applyFound} /> : null}
    </div>
  );
}
