import Link from "next/link";
import { TagTable } from "@/components/tags/tag-table";
import { currentActor } from "@/lib/auth/guard";
import { listGateways } from "@/lib/data/sites";
import { can } from "@/lib/permissions";

type Props = { params: Promise<{ site: string }> };

export default async function TagsPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const gateways = (await listGateways(actor, site)).map((g) => g.slug);
  const canEdit = !!actor && can(actor.role, "config.edit");
  return (
    <section aria-labelledby="tags-heading">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <div>
          <h2 id="tags-heading">Tag inventory</h2>
          <p className="text-label text-ink-soft">
            What exists at the plant. Edits apply at once to the inventory; gateways see them at the next release.
          </p>
        </div>
        <div className="flex gap-2">
          <a href={`/api/sites/${site}/tags/export`} className="rounded-panel border border-panel-line bg-panel px-3 py-1.5 text-label font-medium hover:bg-panel-sunk">
            Export CSV
          </a>
          {canEdit ? (
            <Link href={`/sites/${site}/tags/import`} className="rounded-panel bg-weir-600 px-3 py-1.5 text-label font-medium text-white hover:bg-weir-700">
              Import CSV
            </Link>
          ) : null}
        </div>
      </div>
      <TagTable site={site} gateways={gateways} canEdit={canEdit} />
    </section>
  );
}
