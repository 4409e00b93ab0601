"use client";

import { useEffect, useId, useState } from "react";
import { Field, inputClass } from "@/components/ui/field";
import { api } from "@/lib/client/api";
import { TAG_KINDS } from "@/lib/reduction/profile-names";
import type { ProfileTag, TagKind } from "@/lib/reduction/profile";
import { fieldsOf, type TagFields } from "./tag-fields";

export type SiteOption = { slug: string; name: string; timeZone: string };

type Props = {
  sites: readonly SiteOption[];
  site: string;
  onSite: (slug: string) => void;
  timeZone: string;
  onTimeZone: (zone: string) => void;
  fields: TagFields;
  onFields: (f: TagFields) => void;
};

type Group = { id: number; name: string; tagCount: number };

/** Kind, unit, engineering range and sample period: typed in, or taken from a tag of a site. */
export function TagContext({ sites, site, onSite, timeZone, onTimeZone, fields, onFields }: Readonly<Props>) {
  const id = useId();
  const [groups, setGroups] = useState<Group[]>([]);
  const [group, setGroup] = useState("");
  const [tags, setTags] = useState<ProfileTag[]>([]);
  const [problem, setProblem] = useState("");

  useEffect(() => {
    setGroups([]);
    setGroup("");
    setTags([]);
    if (!site) return;
    api<{ groups: Group[] }>(`/api/sites/${encodeURIComponent(site)}/groups`)
      .then((r) => setGroups(r.groups))
      .catch((e: Error) => setProblem(e.message));
  }, [site]);
  useEffect(() => {
    setTags([]);
    if (!site || !group) return;
    api<{ tags: ProfileTag[] }>(`/api/sites/${encodeURIComponent(site)}/groups/${group}/assignment`)
      .then((r) => setTags(r.tags))
      .catch((e: Error) => setProblem(e.message));
  }, [site, group]);

  const set = (k: keyof TagFields) => (e: { target: { value: string } }) => onFields({ ...fields, [k]: e.target.value });
  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="sr-only">Tag context</legend>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Site" htmlFor={`${id}-site`} hint="Its time zone reads CSV times without an offset.">
          <select
            id={`${id}-site`}
            className={inputClass}
            value={site}
            onChange={(e) => {
              onSite(e.target.value);
              const s = sites.find((x) => x.slug === e.target.value);
              if (s) onTimeZone(s.timeZone);
            }}
          >
            <option value="">No site</option>
            {sites.map((s) => (
              <option key={s.slug} value={s.slug}>
                {s.name}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Tag group" htmlFor={`${id}-group`}>
          <select id={`${id}-group`} className={inputClass} value={group} disabled={!site} onChange={(e) => setGroup(e.target.value)}>
            <option value="">{site ? "Choose a group" : "Choose a site first"}</option>
            {groups.map((g) => (
              <option key={g.id} value={g.id}>
                {g.name} ({g.tagCount})
              </option>
            ))}
          </select>
        </Field>
        <Field label="Tag" htmlFor={`${id}-tag`} hint="Fills in the fields below.">
          <select
            id={`${id}-tag`}
            className={inputClass}
            value=""
            disabled={tags.length === 0}
            onChange={(e) => {
              const t = tags.find((x) => x.name === e.target.value);
              if (t) onFields(fieldsOf(t));
            }}
          >
            <option value="">{tags.length ? "Choose a tag" : "No tags"}</option>
            {tags.slice(0, 1000).map((t) => (
              <option key={t.name} value={t.name}>
                {t.name}
              </option>
            ))}
          </select>
        </Field>
      </div>
      {problem ? (
        <p role="alert" className="text-micro text-fault">
          {problem}
        </p>
      ) : null}
      <div className="grid gap-3 grid-cols-2 sm:grid-cols-3">
        <Field label="Kind" htmlFor={`${id}-kind`}>
          <select id={`${id}-kind`} className={inputClass} value={fields.kind} onChange={(e) => onFields({ ...fields, kind: e.target.value as TagKind })}>
            {TAG_KINDS.map((k) => (
              <option key={k} value={k}>
                {k}
              </option>
            ))}
          </select>
        </Field>
        <Field label="Unit" htmlFor={`${id}-unit`}>
          <input id={`${id}-unit`} className={`${inputClass} font-mono`} value={fields.unit} onChange={set("unit")} autoComplete="off" />
        </Field>
        <Field label="Engineering low" htmlFor={`${id}-lo`}>
          <input id={`${id}-lo`} type="number" step="any" className={inputClass} value={fields.euLow} onChange={set("euLow")} />
        </Field>
        <Field label="Engineering high" htmlFor={`${id}-hi`}>
          <input id={`${id}-hi`} type="number" step="any" className={inputClass} value={fields.euHigh} onChange={set("euHigh")} />
        </Field>
        <Field label="Sample period (ms)" htmlFor={`${id}-period`}>
          <input id={`${id}-period`} type="number" min={1} step="any" className={inputClass} value={fields.samplePeriodMs} onChange={set("samplePeriodMs")} />
        </Field>
        <Field label="Time zone" htmlFor={`${id}-tz`}>
          <input id={`${id}-tz`} className={`${inputClass} font-mono`} value={timeZone} onChange={(e) => onTimeZone(e.target.value)} autoComplete="off" />
        </Field>
      </div>
    </fieldset>
  );
}
