"use client";

import { useId } from "react";
import { Field, inputClass } from "@/components/ui/field";

export type ProfileOption = { id: number; name: string; kinds: string[]; latestRevision: number };

type Props = {
  profiles: readonly ProfileOption[];
  profileId: number | null;
  revision: number | null;
  onChange: (profileId: number | null, revision: number | null) => void;
};

/** A profile of the library and one of its revisions. */
export function ProfilePicker({ profiles, profileId, revision, onChange }: Readonly<Props>) {
  const id = useId();
  const chosen = profiles.find((p) => p.id === profileId);
  const revisions = chosen ? Array.from({ length: chosen.latestRevision }, (_, i) => chosen.latestRevision - i) : [];
  return (
    <div className="grid gap-3 sm:grid-cols-[1fr_10rem]">
      <Field label="Profile" htmlFor={`${id}-profile`}>
        <select
          id={`${id}-profile`}
          className={inputClass}
          value={profileId ?? ""}
          onChange={(e) => {
            const p = profiles.find((x) => x.id === Number(e.target.value));
            onChange(p ? p.id : null, p ? p.latestRevision : null);
          }}
        >
          <option value="">Choose a profile</option>
          {profiles.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name} ({p.kinds.join(", ")})
            </option>
          ))}
        </select>
      </Field>
      <Field label="Revision" htmlFor={`${id}-rev`}>
        <select id={`${id}-rev`} className={inputClass} value={revision ?? ""} disabled={!chosen} onChange={(e) => onChange(profileId, Number(e.target.value))}>
          {revisions.map((n) => (
            <option key={n} value={n}>
              {n === chosen?.latestRevision ? `${n} (latest)` : n}
            </option>
          ))}
        </select>
      </Field>
    </div>
  );
}
