import { Forbidden } from "@/components/shell/forbidden";
import { TagImport } from "@/components/tags/tag-import";
import { currentActor } from "@/lib/auth/guard";
import { listGateways } from "@/lib/data/sites";
import { can } from "@/lib/permissions";

type Props = { params: Promise<{ site: string }> };

export default async function TagImportPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  if (!actor || !can(actor.role, "config.edit")) return <Forbidden what="tag imports" level={2} />;
  const gateways = (await listGateways(actor, site)).map((g) => g.slug);
  return (
    <>
      <h2 className="mb-1">Import tags from CSV</h2>
      <p className="mb-4 text-label text-ink-soft">
        Tags are matched by name: new names are added, known names updated. The import is all or nothing.
      </p>
      <TagImport site={site} gateways={gateways} />
    </>
  );
}
