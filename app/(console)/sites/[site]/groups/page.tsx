import Link from "next/link";
import { DraftPanel } from "@/components/drafts/draft-panel";
import { GroupOrderButtons } from "@/components/groups/group-order-buttons";
import { selectorSummary } from "@/components/groups/selector-summary";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { draftSummary } from "@/lib/data/drafts";
import { listGroups } from "@/lib/data/groups";
import { can } from "@/lib/permissions";

type Props = { params: Promise<{ site: string }> };

export default async function GroupsPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const [groups, draft] = await Promise.all([listGroups(actor, site), draftSummary(actor, site)]);
  const canEdit = !!actor && can(actor.role, "config.edit");
  const order = groups.map((g) => g.id);
  return (
    <>
      <section aria-labelledby="groups-heading" className="mb-8">
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          <div>
            <h2 id="groups-heading">Tag groups</h2>
            <p className="text-label text-ink-soft">A tag belongs to the first group, top to bottom, whose rules match it.</p>
          </div>
          {canEdit ? (
            <Link href={`/sites/${site}/groups/new`} className="rounded-panel bg-weir-600 px-3 py-1.5 text-label font-medium text-white hover:bg-weir-700">
              New group
            </Link>
          ) : null}
        </div>
        {groups.length === 0 ? (
          <EmptyState title="No groups yet">
            {canEdit ? "Create a group from name patterns and filters; the live preview shows what it selects." : "Engineers group the site's tags here."}
          </EmptyState>
        ) : (
          <ol className="flex flex-col gap-2" aria-label="Groups in priority order">
            {groups.map((g, i) => (
              <li key={g.id} className="flex flex-wrap items-center gap-3 rounded-panel border border-panel-line bg-panel px-3 py-2">
                <span className="w-6 text-right font-mono text-micro text-ink-faint">{i + 1}</span>
                {canEdit ? <GroupOrderButtons site={site} order={order} index={i} name={g.name} /> : null}
                <div className="min-w-0 flex-1">
                  <Link href={`/sites/${site}/groups/${g.id}`} className="font-medium text-weir-700 hover:underline">
                    {g.name}
                  </Link>
                  {g.regulated ? <span className="ml-2 rounded bg-caution-soft px-1.5 py-0.5 text-micro text-caution">regulated record</span> : null}
                  <p className="truncate text-micro text-ink-faint">{selectorSummary(g.selector)}</p>
                </div>
                <Link href={`/sites/${site}/groups/${g.id}/assignment`} className="text-label text-weir-700 hover:underline">
                  {g.assignment ? `${g.assignment.profile} · r${g.assignment.revision}` : "Assign a profile"}
                  <span className="sr-only">, assignment of {g.name}</span>
                </Link>
                <span className="text-label" data-testid={`group-count-${g.name}`}>
                  {g.tagCount.toLocaleString("en")} tags
                  {g.matchCount > g.tagCount ? <span className="text-ink-faint"> ({(g.matchCount - g.tagCount).toLocaleString("en")} won by groups above)</span> : null}
                </span>
              </li>
            ))}
          </ol>
        )}
      </section>
      <DraftPanel site={site} draft={draft} canEdit={canEdit} linkToPage />
    </>
  );
}
