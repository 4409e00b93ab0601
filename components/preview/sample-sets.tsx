"use client";

import { useEffect, useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { api, ApiFailure } from "@/lib/client/api";
import type { ProfileTag } from "@/lib/reduction/profile";
import { count } from "./format";

type Group = { id: number; name: string };
type SetRow = { id: number; name: string; samples: number; tag: { name: string }; createdAt: string; createdBy: string };
type Props = {
  site: string;
  canEdit: boolean;
  hasSamples: boolean;
  tag: ProfileTag | null;
  onLoad: (id: number, name: string) => void;
  exportSamples: () => Promise<ArrayBuffer>;
};

/** Sample sets saved against a tag group: load one into the workbench, or save the loaded samples as one. */
export function SampleSets({ site, canEdit, hasSamples, tag, onLoad, exportSamples }: Readonly<Props>) {
  const id = useId();
  const [groups, setGroups] = useState<Group[]>([]);
  const [group, setGroup] = useState("");
  const [sets, setSets] = useState<SetRow[]>([]);
  const [name, setName] = useState("");
  const [message, setMessage] = useState("");
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    setGroups([]);
    setGroup("");
    if (!site) return;
    api<{ groups: Group[] }>(`/api/sites/${encodeURIComponent(site)}/groups`).then((r) => setGroups(r.groups), (e: Error) => setMessage(e.message));
  }, [site]);
  const refresh = () => {
    if (!site || !group) return setSets([]);
    api<{ sampleSets: SetRow[] }>(`/api/sites/${encodeURIComponent(site)}/groups/${group}/samples`).then((r) => setSets(r.sampleSets), (e: Error) => setMessage(e.message));
  };
  useEffect(refresh, [site, group]);

  const save = async () => {
    if (!tag) return setMessage("Fill in the tag context first: the sample set records the tag it stands for.");
    setBusy(true);
    setMessage("");
    try {
      const q = new URLSearchParams({ name: name.trim(), tag: tag.name, kind: tag.kind, unit: tag.unit, samplePeriodMs: String(tag.samplePeriodMs) });
      if (tag.euLow !== null && tag.euHigh !== null) {
        q.set("euLow", String(tag.euLow));
        q.set("euHigh", String(tag.euHigh));
      }
      const res = await fetch(`/api/sites/${encodeURIComponent(site)}/groups/${group}/samples?${q}`, {
        method: "POST",
        headers: { "content-type": "application/octet-stream" },
        body: await exportSamples(),
      });
      const body = (await res.json()) as { error?: string; samples?: number };
      if (!res.ok) throw new ApiFailure({ status: res.status, error: body.error ?? `the server answered ${res.status}` });
      setMessage(`Saved “${name.trim()}” (${count(body.samples ?? 0)} samples). Estimates and reviews of this group now use it.`);
      setName("");
      refresh();
    } catch (e) {
      setMessage(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="flex flex-col gap-3">
      <Field label="Group for sample sets" htmlFor={`${id}-group`} hint="A group's newest sample set feeds its savings estimate and the accuracy impact reviewers see.">
        <select id={`${id}-group`} className={inputClass} value={group} disabled={!site} onChange={(e) => setGroup(e.target.value)}>
          <option value="">{site ? "Choose a group" : "Choose a site first"}</option>
          {groups.map((g) => (
            <option key={g.id} value={g.id}>
              {g.name}
            </option>
          ))}
        </select>
      </Field>
      {group ? (
        sets.length === 0 ? (
          <p className="text-label text-ink-faint">No sample set saved for this group yet.</p>
        ) : (
          <ul aria-label="Saved sample sets" className="flex flex-col gap-1 text-label">
            {sets.map((s) => (
              <li key={s.id} className="flex flex-wrap items-center justify-between gap-2">
                <span>
                  {s.name} <span className="text-ink-faint">— {count(s.samples)} samples of {s.tag.name}, {s.createdBy}, {s.createdAt.slice(0, 10)}</span>
                </span>
                <Button tone="quiet" onClick={() => onLoad(s.id, s.name)}>
                  Load {s.name}
                </Button>
              </li>
            ))}
          </ul>
        )
      ) : null}
      {canEdit && group ? (
        <div className="flex flex-wrap items-end gap-2">
          <Field label="Sample set name" htmlFor={`${id}-name`}>
            <input id={`${id}-name`} className={inputClass} value={name} maxLength={120} onChange={(e) => setName(e.target.value)} />
          </Field>
          <Button tone="quiet" disabled={busy || !hasSamples || name.trim() === ""} onClick={save}>
            {busy ? "Saving…" : "Save as sample set"}
          </Button>
        </div>
      ) : null}
      {message ? (
        <p role="status" className="text-label text-ink-soft" data-testid="sample-set-status">
          {message}
        </p>
      ) : null}
    </div>
  );
}
