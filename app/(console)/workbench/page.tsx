import { PageHeader } from "@/components/shell/page-header";
import { Workbench } from "@/components/preview/workbench";
import { currentActor } from "@/lib/auth/guard";
import { listProfiles } from "@/lib/data/profiles";
import { listSites } from "@/lib/data/sites";
import { can } from "@/lib/permissions";

export const metadata = { title: "Workbench" };

// The workbench: try a profile revision on sample data in the browser; sample sets can be saved against a group.
export default async function WorkbenchPage() {
  const actor = await currentActor();
  const [profiles, sites] = await Promise.all([listProfiles(actor, { status: "active" }), listSites(actor)]);
  return (
    <>
      <PageHeader
        title="Workbench"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Workbench" }]}
        lead="Try a reduction profile on sample data before assigning it: see what the cloud would receive, the error and the bytes, and tune a parameter. The work runs in your browser; only what you save as a sample set is kept."
      />
      <Workbench
        profiles={profiles.map((p) => ({ id: p.id, name: p.name, kinds: p.kinds, latestRevision: p.latestRevision }))}
        sites={sites.map((s) => ({ slug: s.slug, name: s.name, timeZone: s.timeZone }))}
        canEdit={!!actor && can(actor.role, "config.edit")}
      />
    </>
  );
}
