import { Forbidden } from "@/components/shell/forbidden";
import { PageHeader } from "@/components/shell/page-header";
import { SiteForm } from "@/components/sites/site-form";
import { currentActor } from "@/lib/auth/guard";
import { can } from "@/lib/permissions";
import { timeZones } from "@/schemas/site";

export const metadata = { title: "New site" };

export default async function NewSitePage() {
  const actor = await currentActor();
  if (!actor || !can(actor.role, "fleet.admin")) return <Forbidden what="site set-up" />;
  return (
    <>
      <PageHeader title="New site" crumbs={[{ href: "/", label: "Overview" }, { href: "/sites", label: "Sites" }, { label: "New site" }]} />
      <SiteForm timeZones={timeZones()} />
    </>
  );
}
