"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import useSWR from "swr";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { Field, inputClass } from "@/components/ui/field";
import { api, ApiFailure, fetcher, type ApiError } from "@/lib/client/api";
import type { AssignmentView } from "@/lib/data/assignments";
import { METHODS } from "@/lib/reduction/methods";
import type { Profile } from "@/lib/reduction/profile";
import { assignmentSchema } from "@/schemas/assignment";
import { CautionNote } from "./caution-note";
import { OverrideRowFields } from "./override-row-fields";
import { overrideFromRow, paramChoices, rowFromOverride, type OverrideRow } from "./override-rows";

export type ProfileChoice = { id: number; name: string; latestRevision: number; kinds: string[] };
type TagInfo = { name: string; unit: string };
type Props = {
  site: string;
  groupId: number;
  regulated: boolean;
  canEdit: boolean;
  tags: TagInfo[];
  profiles: ProfileChoice[];
  current: AssignmentView | null;
  cautionId: string;
  upgrade: { to: number; summary: string[] } | null;
};
type TagRows = { tag: string; rows: OverrideRow[] };

/** Pins a profile revision to a group, with group and per-tag overrides and the caution where it applies. */
export function AssignmentEditor(props: Readonly<Props>) {
  const { site, groupId, regulated, canEdit, tags, profiles, current, cautionId, upgrade } = props;
  const router = useRouter();
  const [profileId, setProfileId] = useState<number | "">(current?.profileId ?? "");
  const chosen = profiles.find((p) => p.id === profileId);
  const [revision, setRevision] = useState<number>(current?.revision ?? chosen?.latestRevision ?? 1);
  const [rows, setRows] = useState<OverrideRow[]>(current?.overrides.map(rowFromOverride) ?? []);
  const [tagRows, setTagRows] = useState<TagRows[]>(current?.tags.map((t) => ({ tag: t.tag, rows: t.overrides.map(rowFromOverride) })) ?? []);
  const [ack, setAck] = useState(false);
  const [failure, setFailure] = useState<ApiError | null>(null);
  const [busy, setBusy] = useState(false);
  const { data } = useSWR<{ document: Profile }>(profileId ? `/api/profiles/${profileId}/revisions/${revision}` : null, fetcher);
  const doc = data?.document;
  const choices = useMemo(() => paramChoices(doc), [doc]);
  const defaultUnit = tags[0]?.unit ?? "";
  const lossy = !!doc && doc.outputs.some((o) => o.steps.some((s) => METHODS[s.method].lossy));
  const samePin = current !== null && current.profileId === profileId && current.revision === revision;
  const needsAck = regulated && lossy && !samePin;

  const pickProfile = (id: number | "") => {
    setProfileId(id);
    setRevision(profiles.find((p) => p.id === id)?.latestRevision ?? 1);
    setRows([]);
    setTagRows([]);
  };

  const save = async () => {
    setFailure(null);
    const body = {
      profileId: profileId === "" ? 0 : profileId,
      revision,
      overrides: rows.filter((r) => r.target).map((r) => overrideFromRow(r, choices)),
      tagOverrides: tagRows
        .map((t) => ({ tag: t.tag.trim(), overrides: t.rows.filter((r) => r.target).map((r) => overrideFromRow(r, choices)) }))
        .filter((t) => t.tag !== "" || t.overrides.length > 0),
      ...(needsAck && ack ? { acknowledge: cautionId } : {}),
    };
    const parsed = assignmentSchema.safeParse(body);
    if (!parsed.success) {
      const i = parsed.error.issues[0];
      setFailure({ status: 0, error: i.message, field: i.path.join(".") });
      return;
    }
    setBusy(true);
    try {
      await api(`/api/sites/${site}/groups/${groupId}/assignment`, { method: "PUT", json: parsed.data });
      toast.success("Assignment saved to the draft change");
      router.push(`/sites/${site}/assignments`);
      router.refresh();
    } catch (e) {
      setFailure(e instanceof ApiFailure ? e.detail : { status: 0, error: "Could not save" });
    } finally {
      setBusy(false);
    }
  };

  const remove = async () => {
    try {
      await api(`/api/sites/${site}/groups/${groupId}/assignment`, { method: "DELETE" });
      toast.success("Assignment removed in the draft change");
      router.push(`/sites/${site}/assignments`);
      router.refresh();
      return true;
    } catch (e) {
      toast.error(e instanceof ApiFailure ? e.message : "Could not remove");
      return false;
    }
  };

  return (
    <div className="flex flex-col gap-5">
      {upgrade && current ? (
        <section id="upgrade" aria-labelledby="upgrade-heading" className="rounded-panel border border-weir-300 bg-weir-50 p-3 text-label">
          <h3 id="upgrade-heading" className="font-medium">
            Revision {upgrade.to} of {current.profile} is available (this group runs revision {current.revision})
          </h3>
          <ul className="mt-1 list-disc pl-5" aria-label="What the upgrade changes">
            {upgrade.summary.map((s) => (
              <li key={s}>{s}</li>
            ))}
          </ul>
          <p className="mt-1">
            <Link href={`/profiles/${current.profileId}/compare?from=${current.revision}&to=${upgrade.to}`} className="text-weir-700 hover:underline">
              Line-by-line comparison
            </Link>
          </p>
          {canEdit ? (
            <Button className="mt-2" tone="quiet" onClick={() => setRevision(upgrade.to)} disabled={revision === upgrade.to}>
              Use revision {upgrade.to}
            </Button>
          ) : null}
        </section>
      ) : null}

      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Profile" htmlFor="assign-profile" hint="Only profiles whose kinds cover this group's tags are offered.">
          <select id="assign-profile" className={inputClass} disabled={!canEdit} value={profileId} onChange={(e) => pickProfile(e.target.value ? Number(e.target.value) : "")}>
            <option value="">Choose a profile…</option>
            {profiles.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name} ({p.kinds.join(", ")})
              </option>
            ))}
          </select>
        </Field>
        <Field label="Revision" htmlFor="assign-revision" hint="The group stays on this revision until someone here upgrades it.">
          <select id="assign-revision" className={inputClass} disabled={!canEdit || !chosen} value={revision} onChange={(e) => setRevision(Number(e.target.value))}>
            {Array.from({ length: chosen?.latestRevision ?? 0 }, (_, i) => i + 1)
              .reverse()
              .map((n) => (
                <option key={n} value={n}>
                  revision {n}
                  {n === chosen?.latestRevision ? " (latest)" : ""}
                </option>
              ))}
          </select>
        </Field>
      </div>

      {doc ? (
        <p className="text-label text-ink-soft" data-testid="assignment-outputs">
          Outputs: {doc.outputs.map((o) => `${o.name} (${o.steps.map((s) => METHODS[s.method].title).join(" → ")})`).join("; ")}. {lossy ? "Lossy." : "Lossless."}
        </p>
      ) : null}

      <section aria-labelledby="group-overrides-heading" className="flex flex-col gap-2">
        <h3 id="group-overrides-heading" className="font-medium">
          Group overrides
        </h3>
        {rows.map((r, i) => (
          <OverrideRowFields
            key={i}
            name={`group override ${i + 1}`}
            row={r}
            choices={choices}
            defaultUnit={defaultUnit}
            onChange={(row) => setRows(rows.map((x, j) => (j === i ? row : x)))}
            onRemove={() => setRows(rows.filter((_, j) => j !== i))}
          />
        ))}
        {canEdit ? (
          <Button tone="quiet" className="self-start" disabled={!doc} onClick={() => setRows([...rows, { target: "", mode: "plain", value: "", unit: "" }])}>
            Add group override
          </Button>
        ) : null}
      </section>

      <section aria-labelledby="tag-overrides-heading" className="flex flex-col gap-2">
        <h3 id="tag-overrides-heading" className="font-medium">
          Tag overrides
        </h3>
        <datalist id="group-tag-names">
          {tags.slice(0, 5000).map((t) => (
            <option key={t.name} value={t.name} />
          ))}
        </datalist>
        {tagRows.map((t, i) => (
          <div key={i} className="flex flex-col gap-2 rounded-panel border border-panel-line bg-panel-sunk p-2">
            <Field label={`Tag (tag override ${i + 1})`} htmlFor={`tag-override-${i}`}>
              <input id={`tag-override-${i}`} list="group-tag-names" className={inputClass} value={t.tag} onChange={(e) => setTagRows(tagRows.map((x, j) => (j === i ? { ...x, tag: e.target.value } : x)))} />
            </Field>
            {t.rows.map((r, k) => (
              <OverrideRowFields
                key={k}
                name={`tag override ${i + 1}${t.rows.length > 1 ? `.${k + 1}` : ""}`}
                row={r}
                choices={choices}
                defaultUnit={tags.find((x) => x.name === t.tag)?.unit ?? defaultUnit}
                onChange={(row) => setTagRows(tagRows.map((x, j) => (j === i ? { ...x, rows: x.rows.map((y, m) => (m === k ? row : y)) } : x)))}
                onRemove={() => setTagRows(tagRows.map((x, j) => (j === i ? { ...x, rows: x.rows.filter((_, m) => m !== k) } : x)).filter((x) => x.rows.length > 0))}
              />
            ))}
            {canEdit ? (
              <Button tone="quiet" className="self-start" onClick={() => setTagRows(tagRows.map((x, j) => (j === i ? { ...x, rows: [...x.rows, { target: "", mode: "plain", value: "", unit: "" }] } : x)))}>
                Add parameter for this tag
              </Button>
            ) : null}
          </div>
        ))}
        {canEdit ? (
          <Button tone="quiet" className="self-start" disabled={!doc || tags.length === 0} onClick={() => setTagRows([...tagRows, { tag: "", rows: [{ target: "", mode: "plain", value: "", unit: "" }] }])}>
            Add tag override
          </Button>
        ) : null}
      </section>

      {regulated ? (
        <CautionNote>
          {needsAck && canEdit ? (
            <label className="mt-2 flex items-start gap-2 font-medium">
              <input type="checkbox" checked={ack} onChange={(e) => setAck(e.target.checked)} className="mt-1" />
              I have read this caution and acknowledge it for this lossy profile
            </label>
          ) : null}
        </CautionNote>
      ) : null}

      {failure ? (
        <div role="alert" className="rounded-panel border border-fault bg-fault-soft p-3 text-label text-fault">
          <p>
            {failure.field ? <strong>{failure.field}: </strong> : null}
            {failure.error.replace(`${failure.field}: `, "")}
          </p>
          {failure.issues && failure.issues.length > 1 ? (
            <ul className="mt-1 list-disc pl-5">
              {failure.issues.slice(1).map((i, k) => (
                <li key={k}>
                  {i.field}: {i.message}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}

      {canEdit ? (
        <div className="flex flex-wrap gap-2">
          <Button onClick={save} disabled={busy || profileId === "" || (needsAck && !ack)}>
            {busy ? "Saving…" : "Save assignment to draft"}
          </Button>
          {current ? (
            <ConfirmButton label="Remove assignment" title="Remove this assignment?" confirmLabel="Remove" onConfirm={remove}>
              The group&apos;s tags will follow the site&apos;s default handling once this change is released.
            </ConfirmButton>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
