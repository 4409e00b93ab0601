import { ChangeList } from "@/components/releases/change-list";
import { CompareForm } from "@/components/releases/compare-form";
import { ReleaseHistory } from "@/components/releases/release-history";
import { RollbackPanel } from "@/components/releases/rollback-panel";
import { when } from "@/components/review/change-status";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { listChanges } from "@/lib/data/changes";
import { draftSummary } from "@/lib/data/drafts";
import { listReleases } from "@/lib/data/releases";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string }> };

/** Why a rollback cannot start now, when an open change stands in its way. */
function blocker(draft: Awaited<ReturnType<typeof draftSummary>>): string | null {
  if (draft.changeId === null) return null;
  if (draft.state === "in_review" || draft.state === "approved") return `Change ${draft.changeId} is ${draft.state.replace("_", " ")}: release or reject it before rolling back.`;
  if (draft.edits.length > 0) return `The draft change holds ${draft.edits.length} edit${draft.edits.length === 1 ? "" : "s"}: discard them (or release them) before rolling back.`;
  return null;
}

export default async function ReleasesPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const [releases, changes, draft] = await Promise.all([orNotFound(listReleases(actor, site)), listChanges(actor, site), draftSummary(actor, site)]);
  const canReview = !!actor && can(actor.role, "change.review");
  const [current, ...earlier] = releases;
  return (
    <section aria-labelledby="releases-heading" className="flex flex-col gap-6">
      <div>
        <h2 id="releases-heading">Releases</h2>
        <p className="text-label text-ink-soft">
          Each release is an immutable, numbered snapshot with one signed bundle per gateway. Numbers only go up: a rollback is published under a new number.
        </p>
      </div>
      {releases.length === 0 ? (
        <EmptyState title="No release yet">Submit the draft change for review; once it is approved and released it appears here.</EmptyState>
      ) : (
        <>
          {canReview && earlier.length > 0 ? (
            <RollbackPanel
              key={current.number}
              site={site}
              current={current.number}
              earlier={earlier.map((r) => ({ number: r.number, label: `Release ${r.number} — ${when(r.releasedAt)}${r.note ? ` — ${r.note.slice(0, 60)}` : ""}` }))}
              blockedBy={blocker(draft)}
            />
          ) : null}
          {releases.length > 1 ? (
            <section aria-labelledby="compare-heading" className="flex flex-col gap-2">
              <h3 id="compare-heading" className="text-lead font-medium">
                Compare two releases
              </h3>
              <CompareForm key={current.number} site={site} numbers={releases.map((r) => r.number)} />
            </section>
          ) : null}
          <section aria-labelledby="history-heading" className="flex flex-col gap-2">
            <h3 id="history-heading" className="text-lead font-medium">
              History
            </h3>
            <ReleaseHistory site={site} releases={releases} />
          </section>
        </>
      )}
      <section aria-labelledby="changes-heading" className="flex flex-col gap-2">
        <h3 id="changes-heading" className="text-lead font-medium">
          Changes
        </h3>
        <ChangeList site={site} changes={changes} />
      </section>
    </section>
  );
}
