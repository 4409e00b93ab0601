import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { coverage } from "@/lib/data/groups";
import { getSite } from "@/lib/data/sites";

type Props = { params: Promise<{ site: string }> };

export default async function CoveragePage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const [cov, info] = await Promise.all([coverage(actor, site), getSite(actor, site)]);
  const grouped = cov.total - cov.unassignedCount;
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="cov-heading" className="rounded-panel border border-panel-line bg-panel p-4">
        <h2 id="cov-heading">Coverage</h2>
        <p className="mt-1 text-label text-ink-soft" data-testid="coverage-summary">
          {grouped.toLocaleString("en")} of {cov.total.toLocaleString("en")} tags are in a group; {cov.unassignedCount.toLocaleString("en")} in no group (
          {info.defaultHandling === "drop" ? "dropped at the edge" : "passed through unreduced"}, the site default); {cov.overlapCount.toLocaleString("en")} matched by
          more than one group.
        </p>
      </section>
      <section aria-labelledby="unassigned-heading">
        <h3 id="unassigned-heading" className="mb-2 text-lead font-medium">
          Tags in no group
        </h3>
        {cov.unassignedCount === 0 ? (
          <EmptyState title="Every tag is in a group" />
        ) : (
          <div className="max-h-96 overflow-y-auto rounded-panel border border-panel-line bg-panel" tabIndex={0} role="region" aria-labelledby="unassigned-heading">
            <table aria-label="Tags in no group">
              <thead>
                <tr>
                  <th scope="col">Tag</th>
                  <th scope="col">Kind</th>
                  <th scope="col">Unit</th>
                  <th scope="col">Gateway</th>
                </tr>
              </thead>
              <tbody>
                {cov.unassigned.map((t) => (
                  <tr key={t.name}>
                    <td className="font-mono text-label">{t.name}</td>
                    <td>{t.kind}</td>
                    <td>{t.unit}</td>
                    <td className="font-mono text-label">{t.gateway}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            {cov.unassignedCount > cov.unassigned.length ? <p className="p-2 text-micro text-ink-faint">First {cov.unassigned.length} of {cov.unassignedCount.toLocaleString("en")} shown.</p> : null}
          </div>
        )}
      </section>
      <section aria-labelledby="overlap-heading">
        <h3 id="overlap-heading" className="mb-2 text-lead font-medium">
          Tags several groups match
        </h3>
        {cov.overlapCount === 0 ? (
          <EmptyState title="No overlaps">Each grouped tag is matched by exactly one group.</EmptyState>
        ) : (
          <div className="max-h-96 overflow-y-auto rounded-panel border border-panel-line bg-panel" tabIndex={0} role="region" aria-labelledby="overlap-heading">
            <table aria-label="Tags several groups match">
              <thead>
                <tr>
                  <th scope="col">Tag</th>
                  <th scope="col">Wins</th>
                  <th scope="col">Also matched by</th>
                </tr>
              </thead>
              <tbody>
                {cov.overlaps.map((o) => (
                  <tr key={o.name}>
                    <td className="font-mono text-label">{o.name}</td>
                    <td className="font-medium">{o.winner}</td>
                    <td>{o.groups.filter((g) => g !== o.winner).join(", ")}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="mt-2 text-micro text-ink-faint">
          Change which group wins by reordering on the <Link href={`/sites/${site}/groups`} className="underline">Groups</Link> page.
        </p>
      </section>
    </div>
  );
}
