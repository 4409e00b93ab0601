import { ProfileImport } from "@/components/profiles/profile-import";
import { ReadOnlyNotice } from "@/components/profiles/read-only-notice";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { can } from "@/lib/permissions";

export const metadata = { title: "Import a profile" };

export default async function ImportProfilePage() {
  const actor = await currentActor();
  return (
    <>
      <PageHeader
        title="Import a profile"
        crumbs={[{ href: "/", label: "Overview" }, { href: "/profiles", label: "Profiles" }, { label: "Import" }]}
        lead="The file is checked in full first: if anything is wrong, each problem is listed with its field and line and nothing is saved."
      />
      {actor && can(actor.role, "config.edit") ? <ProfileImport /> : <ReadOnlyNotice />}
    </>
  );
}
