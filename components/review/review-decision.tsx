import Link from "next/link";
import { ApproveForm, RejectForm, ReleaseButton } from "./review-actions";

type Props = {
  site: string;
  change: { id: number; state: string; release: number | null; regulated: string[]; cautionId: string };
  canReview: boolean;
  isAuthor: boolean;
};

function Say({ children }: Readonly<{ children: React.ReactNode }>) {
  return <p className="text-label text-ink-soft">{children}</p>;
}

/** What the signed-in person can do with the change now, or whom it waits for. */
function Decision({ site, change, canReview, isAuthor }: Readonly<Props>) {
  const { id, state } = change;
  if (state === "in_review") {
    if (canReview && !isAuthor) {
      return (
        <>
          <ApproveForm site={site} changeId={id} regulated={change.regulated} cautionId={change.cautionId} />
          <hr className="border-panel-line" />
          <RejectForm site={site} changeId={id} />
        </>
      );
    }
    return (
      <Say>
        {isAuthor
          ? "You contributed to this change, so it is waiting for another reviewer (four-eyes rule: no author approves their own change)."
          : "Waiting for a reviewer to approve or reject it."}
      </Say>
    );
  }
  if (state === "approved") {
    if (!canReview) return <Say>Approved; waiting for a reviewer to release it.</Say>;
    return (
      <>
        <Say>Approved. Releasing publishes signed bundles to every gateway of the site.</Say>
        {change.release ? <ReleaseButton site={site} changeId={id} release={change.release} /> : null}
        {!isAuthor ? (
          <details className="text-label">
            <summary className="cursor-pointer">Reject instead</summary>
            <div className="mt-2">
              <RejectForm site={site} changeId={id} />
            </div>
          </details>
        ) : null}
      </>
    );
  }
  if (state === "released") return <Say>Released. A release cannot be changed; to go back, start a rollback on the Releases tab.</Say>;
  const draftLink = (
    <Link href={`/sites/${site}/draft`} className="text-weir-700 underline">
      Draft change
    </Link>
  );
  if (state === "rejected") return <Say>Rejected. Its edits stay in the draft: change them and submit again from the {draftLink} page.</Say>;
  return <Say>In draft: edited since it was reviewed, or its base release is no longer current. Submit it again from the {draftLink} page.</Say>;
}

/** The decision panel beside the change's history. */
export function ReviewDecision(props: Readonly<Props>) {
  return (
    <section aria-labelledby="decision-heading" className="flex flex-col gap-3 rounded-panel border border-panel-line bg-panel p-4">
      <h3 id="decision-heading" className="text-lead font-medium">
        Decision
      </h3>
      <Decision {...props} />
    </section>
  );
}
