import { ReadOnlyNotice } from "@/components/profiles/read-only-notice";
import { ProfileEditor } from "@/components/profiles/profile-editor";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { can } from "@/lib/permissions";

export const metadata = { title: "New profile" };

export default async function NewProfilePage() {
  const actor = await currentActor();
  const crumbs = [{ href: "/", label: "Overview" }, { href: "/profiles", label: "Profiles" }, { label: "New" }];
  return (
    <>
      <PageHeader title="New profile" crumbs={crumbs} lead="Name the profile, tick the tag kinds it is for, and give each output its steps. Saving makes revision 1." />
      {actor && can(actor.role, "config.edit") ? <ProfileEditor existing={null} /> : <ReadOnlyNotice />}
    </>
  );
}
