import type { ChangeView } from "@/lib/data/changes";

const STATES: Record<string, { label: string; tone: string }> = {
  draft: { label: "Draft", tone: "border-panel-line bg-panel-sunk text-ink-soft" },
  in_review: { label: "In review", tone: "border-weir-300 bg-weir-50 text-weir-700" },
  approved: { label: "Approved", tone: "border-ok bg-ok-soft text-ok" },
  released: { label: "Released", tone: "border-ok bg-ok text-white" },
  rejected: { label: "Rejected", tone: "border-fault bg-fault-soft text-fault" },
};

/** A change's state as a labelled badge. */
export function StateBadge({ state }: Readonly<{ state: string }>) {
  const s = STATES[state] ?? { label: state, tone: "border-panel-line" };
  return (
    <span data-testid="change-state" className={`inline-block rounded-panel border px-2 py-0.5 text-label font-medium ${s.tone}`}>
      {s.label}
    </span>
  );
}

/** UTC time to the minute, unambiguous for people at different plants. */
export const when = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

/** Who did what and when, and the authors and note. */
export function ChangeTimeline({ change }: Readonly<{ change: ChangeView }>) {
  const reviewedVerb = change.state === "rejected" ? "Rejected" : change.state === "approved" || change.state === "released" ? "Approved" : "Last reviewed";
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1.5 text-label" aria-label="Change history">
      <dt className="text-ink-faint">Authors</dt>
      <dd>{change.authors.length ? change.authors.map((a) => a.name || a.email).join(", ") : "—"}</dd>
      <dt className="text-ink-faint">Based on</dt>
      <dd>{change.baseRelease ? `release ${change.baseRelease}` : "no release (the site's first)"}</dd>
      {change.rollbackOf ? (
        <>
          <dt className="text-ink-faint">Restores</dt>
          <dd>the configuration of release {change.rollbackOf} (a rollback)</dd>
        </>
      ) : null}
      <dt className="text-ink-faint">Submitted</dt>
      <dd>{change.submittedAt ? `${when(change.submittedAt)} by ${change.submittedBy ?? "—"}` : "not yet"}</dd>
      {change.reviewedAt ? (
        <>
          <dt className="text-ink-faint">{reviewedVerb}</dt>
          <dd>
            {when(change.reviewedAt)} by {change.reviewedBy ?? "—"}
            {change.reviewComment ? <q className="mt-0.5 block italic text-ink-soft">{change.reviewComment}</q> : null}
          </dd>
        </>
      ) : null}
      <dt className="text-ink-faint">Note</dt>
      <dd className="whitespace-pre-line">{change.note || "—"}</dd>
    </dl>
  );
}
