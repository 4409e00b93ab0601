import Link from "next/link";
import { SubmitChangeForm } from "@/components/review/submit-change-form";
import { currentActor } from "@/lib/auth/guard";
import { describeEdit } from "@/lib/config/site-config";
import type { DraftSummary } from "@/lib/data/drafts";
import { can } from "@/lib/permissions";
import { DiscardButton } from "./discard-buttons";

const UNDER_REVIEW: Record<string, string> = { in_review: "is in review", approved: "is approved and waiting to be released", rejected: "was rejected" };

type Props = { site: string; draft: DraftSummary; canEdit: boolean; linkToPage?: boolean };

/** The site's draft change: how many edits, by whom, each with a discard control for editors, and submission for review. */
export async function DraftPanel({ site, draft, canEdit, linkToPage = false }: Readonly<Props>) {
  const n = draft.edits.length;
  const actor = await currentActor();
  const canSubmit = !linkToPage && n > 0 && !!actor && can(actor.role, "change.submit") && (draft.state === "draft" || draft.state === "rejected");
  const status = draft.changeId !== null ? UNDER_REVIEW[draft.state] : undefined;
  return (
    <section id="draft" aria-labelledby="draft-heading" className="rounded-panel border border-panel-line bg-panel p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="draft-heading" className="text-lead font-medium">
          Draft change
        </h2>
        {linkToPage && n > 0 ? (
          <Link href={`/sites/${site}/draft`} className="text-label text-weir-700 hover:underline">
            Open the draft
          </Link>
        ) : null}
        {!linkToPage && canEdit && n > 0 ? <DiscardButton site={site} /> : null}
      </div>
      {status ? (
        <p className="mt-2 text-label" data-testid="draft-review-status">
          <Link href={`/sites/${site}/changes/${draft.changeId}`} className="font-medium text-weir-700 hover:underline">
            Change {draft.changeId} {status}
          </Link>
          {draft.state === "rejected" ? " — see the reviewer's comment, then edit and submit again." : " — open its review page."}
        </p>
      ) : null}
      {n === 0 ? (
        <p className="mt-1 text-label text-ink-soft">No edits since {draft.baseRelease ? `release ${draft.baseRelease}` : "the start"}.</p>
      ) : (
        <>
          <p className="mt-1 text-label text-ink-soft" data-testid="draft-count">
            {n} edit{n === 1 ? "" : "s"} since {draft.baseRelease ? `release ${draft.baseRelease}` : "the start (no release yet)"}
            {draft.authors.length ? ` by ${draft.authors.map((a) => a.name).join(", ")}` : ""}. Gateways receive them only once the change is reviewed and released.
          </p>
          <ul className="mt-2 flex flex-col gap-1 text-label" aria-label="Draft edits">
            {draft.edits.map((e) => (
              <li key={e.key} className="flex flex-wrap items-center justify-between gap-2 border-b border-panel-line py-1 last:border-0">
                <span>{describeEdit(e)}</span>
                {!linkToPage && canEdit ? <DiscardButton site={site} edit={{ key: e.key, text: describeEdit(e) }} /> : null}
              </li>
            ))}
          </ul>
          {canSubmit ? <SubmitChangeForm site={site} /> : null}
        </>
      )}
    </section>
  );
}
