import { notFound } from "next/navigation";
import { ReadOnlyNotice } from "@/components/profiles/read-only-notice";
import { ProfileEditor } from "@/components/profiles/profile-editor";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { getProfile } from "@/lib/data/profiles";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ profileId: string }> };

export default async function EditProfilePage({ params }: Readonly<Props>) {
  const { profileId } = await params;
  const id = Number(profileId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const actor = await currentActor();
  const profile = await orNotFound(getProfile(actor, id));
  const crumbs = [{ href: "/", label: "Overview" }, { href: "/profiles", label: "Profiles" }, { href: `/profiles/${id}`, label: profile.name }, { label: "Edit" }];
  if (!actor || !can(actor.role, "config.edit")) {
    return (
      <>
        <PageHeader title={`Edit ${profile.name}`} crumbs={crumbs} />
        <ReadOnlyNotice />
      </>
    );
  }
  return (
    <>
      <PageHeader
        title={`Edit ${profile.name}`}
        crumbs={crumbs}
        lead={`Saving makes revision ${profile.latestRevision + 1}. Groups pinned to earlier revisions keep them until their site's change upgrades them.`}
      />
      {profile.archived ? <p className="mb-4 text-label text-ink-soft">This profile is archived; a new revision does not restore it.</p> : null}
      <ProfileEditor existing={{ id, revision: profile.latestRevision, document: profile.document }} />
    </>
  );
}
