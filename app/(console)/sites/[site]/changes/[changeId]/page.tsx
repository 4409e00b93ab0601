import Link from "next/link";
import { notFound } from "next/navigation";
import { ChangeSummary, RegulatedCaution } from "@/components/review/change-summary";
import { ChangeTimeline, StateBadge } from "@/components/review/change-status";
import { GatewayDiffs } from "@/components/review/gateway-diffs";
import { AccuracyImpact, BandwidthImpact } from "@/components/review/impact-tables";
import { ReviewDecision } from "@/components/review/review-decision";
import { currentActor } from "@/lib/auth/guard";
import type { Impact } from "@/lib/data/change-review";
import { getChange } from "@/lib/data/changes";
import { listReleases } from "@/lib/data/releases";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string; changeId: string }> };

export default async function ChangePage({ params }: Readonly<Props>) {
  const { site, changeId } = await params;
  const id = Number(changeId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const actor = await currentActor();
  const change = await orNotFound(getChange(actor, site, id));
  const review = change.review;
  const released = change.state === "released" ? (await listReleases(actor, site)).find((r) => r.changeId === change.id) : undefined;
  const impact = review?.impact as Impact | undefined;
  return (
    <article aria-labelledby="change-heading" className="flex flex-col gap-6">
      <div>
        <nav aria-label="Breadcrumb" className="mb-1 text-micro text-ink-faint">
          <Link href={`/sites/${site}/releases`} className="hover:underline">
            Releases
          </Link>{" "}
          › Change {change.id}
        </nav>
        <div className="flex flex-wrap items-center gap-3">
          <h2 id="change-heading">Change {change.id}</h2>
          <StateBadge state={change.state} />
          {change.rollbackOf ? <span className="rounded bg-weir-50 px-1.5 py-0.5 text-label text-weir-700">rollback to release {change.rollbackOf}</span> : null}
          {released ? (
            <Link href={`/sites/${site}/releases#release-${released.number}`} className="text-label font-medium text-weir-700 hover:underline">
              Released as release {released.number}
            </Link>
          ) : null}
        </div>
      </div>

      <div className="grid items-start gap-4 lg:grid-cols-[1fr_minmax(18rem,24rem)]">
        <section aria-label="Who and when" className="rounded-panel border border-panel-line bg-panel p-4">
          <ChangeTimeline change={change} />
        </section>
        <ReviewDecision
          site={site}
          change={{ id: change.id, state: change.state, release: review?.release ?? null, regulated: review?.regulatedTouched ?? [], cautionId: change.cautionId }}
          canReview={!!actor && can(actor.role, "change.review")}
          isAuthor={!!actor && change.authors.some((a) => a.id === actor.id)}
        />
      </div>

      {!review ? (
        <p className="rounded-panel border border-dashed border-panel-line bg-panel p-4 text-label text-ink-soft">
          This change has not been submitted for review yet, so there is nothing to review. Its edits are on the{" "}
          <Link href={`/sites/${site}/draft`} className="text-weir-700 underline">
            Draft change
          </Link>{" "}
          page.
        </p>
      ) : (
        <>
          <section aria-labelledby="summary-heading" className="flex flex-col gap-3">
            <h3 id="summary-heading" className="text-lead font-medium">
              Summary in words
            </h3>
            {review.regulatedTouched.length ? <RegulatedCaution groups={review.regulatedTouched} /> : null}
            <ChangeSummary statements={review.summary} />
          </section>

          {impact ? (
            <section aria-labelledby="impact-heading" className="flex flex-col gap-3">
              <h3 id="impact-heading" className="text-lead font-medium">
                Impact <span className="text-label font-normal text-ink-soft">(estimates)</span>
              </h3>
              <h4 className="text-label font-medium">Accuracy on saved sample sets</h4>
              <AccuracyImpact rows={impact.accuracy} />
              <h4 className="text-label font-medium">Uplink and cloud storage</h4>
              <BandwidthImpact site={site} bandwidth={impact.bandwidth} />
            </section>
          ) : null}

          <section aria-labelledby="diff-heading" className="flex flex-col gap-3">
            <div>
              <h3 id="diff-heading" className="text-lead font-medium">
                Bundles, gateway by gateway
              </h3>
              <p className="text-label text-ink-soft">
                Release {review.release} as rendered at submission (issued {review.issued}), against {change.baseRelease ? `release ${change.baseRelease}` : "no release"}. Gateways
                affected: {review.gatewaysAffected.length ? review.gatewaysAffected.join(", ") : "none"}.
              </p>
            </div>
            <GatewayDiffs
              beforeLabel="current release"
              gateways={review.gateways.map((g) => ({ gateway: g.gateway, diff: g.diff, unchanged: g.unchanged, contentSame: !review.gatewaysAffected.includes(g.gateway) }))}
            />
          </section>
        </>
      )}
    </article>
  );
}
