import Link from "next/link";
import { notFound } from "next/navigation";
import { ArchiveButton } from "@/components/profiles/archive-button";
import { ArchivedBadge, KindList, LossyBadge } from "@/components/profiles/badges";
import { DuplicateButton } from "@/components/profiles/duplicate-button";
import { ProfileOutputs } from "@/components/profiles/profile-outputs";
import { ProfileUsageTable } from "@/components/profiles/profile-usage";
import { RevisionHistory } from "@/components/profiles/revision-history";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { getProfile } from "@/lib/data/profiles";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ profileId: string }> };

export default async function ProfilePage({ params }: Readonly<Props>) {
  const { profileId } = await params;
  const id = Number(profileId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const actor = await currentActor();
  const profile = await orNotFound(getProfile(actor, id));
  const canEdit = !!actor && can(actor.role, "config.edit");
  return (
    <>
      <PageHeader
        title={profile.name}
        crumbs={[{ href: "/", label: "Overview" }, { href: "/profiles", label: "Profiles" }, { label: profile.name }]}
        lead={profile.description || undefined}
        actions={
          <>
            <a href={`/api/profiles/${id}/export`} download className="inline-flex min-h-9 items-center rounded-panel border border-panel-line bg-panel px-3 text-label font-medium hover:bg-panel-sunk">
              Export YAML
            </a>
            {canEdit ? (
              <>
                <DuplicateButton profileId={id} name={profile.name} />
                <ArchiveButton profileId={id} name={profile.name} archived={profile.archived} usage={profile.usage} />
                <Link href={`/profiles/${id}/edit`} className="inline-flex min-h-9 items-center rounded-panel bg-weir-600 px-3 text-label font-medium text-white hover:bg-weir-700">
                  Edit
                </Link>
              </>
            ) : null}
          </>
        }
      />
      <div className="mb-6 flex flex-wrap items-center gap-3 text-label">
        <span className="flex items-center gap-1.5">
          <span className="text-ink-faint">For</span> <KindList kinds={profile.kinds} />
        </span>
        <span>
          <span className="text-ink-faint">Revision</span> r{profile.latestRevision}
        </span>
        <LossyBadge lossy={profile.lossy} />
        {profile.archived ? <ArchivedBadge /> : null}
      </div>
      {profile.archived ? (
        <p role="status" className="mb-4 rounded-panel border border-panel-line bg-panel px-3 py-2 text-label text-ink-soft">
          Archived: not offered for new assignments. Groups already pinned to it keep working.
        </p>
      ) : null}
      {profile.lossy ? (
        <aside aria-label="Caution" className="mb-6 rounded-panel border border-caution/50 bg-caution-soft p-3">
          <p className="text-label font-medium">Lossy profile</p>
          <p className="mt-1 text-micro text-ink-soft">{REGULATED_RECORD_CAUTION.text}</p>
        </aside>
      ) : null}

      <section aria-labelledby="outputs-heading" className="mb-8">
        <h2 id="outputs-heading" className="mb-3">
          Outputs
        </h2>
        <ProfileOutputs profile={profile.document} />
      </section>

      <section aria-labelledby="usage-heading" className="mb-8">
        <h2 id="usage-heading" className="mb-1">
          Where it is used
        </h2>
        <p className="mb-3 text-label text-ink-soft">Each group pins one revision; a newer revision reaches a site only through that site&apos;s own change.</p>
        <ProfileUsageTable sites={profile.sites} latest={profile.latestRevision} />
      </section>

      <section aria-labelledby="history-heading">
        <h2 id="history-heading" className="mb-3">
          Revision history
        </h2>
        <RevisionHistory profileId={id} revisions={profile.revisions} />
      </section>
    </>
  );
}
