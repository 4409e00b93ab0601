import Link from "next/link";
import { CautionNote } from "@/components/assignments/caution-note";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { listAssignments } from "@/lib/data/assignments";

type Props = { params: Promise<{ site: string }> };

const overrideCount = (a: { overrides: unknown[]; tags: unknown[] }) => a.overrides.length + a.tags.length;

export default async function AssignmentsPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const rows = await listAssignments(actor, site);
  const regulatedLossy = rows.some((r) => r.regulated && r.assignment?.lossy);
  return (
    <section aria-labelledby="assignments-heading" className="flex flex-col gap-4">
      <div>
        <h2 id="assignments-heading">Assignments</h2>
        <p className="text-label text-ink-soft">Each group runs one pinned profile revision. A newer revision reaches this site only when someone here upgrades it.</p>
      </div>
      {regulatedLossy ? <CautionNote /> : null}
      {rows.length === 0 ? (
        <EmptyState title="No groups yet">Create tag groups first; then assign each a profile here.</EmptyState>
      ) : (
        <table className="w-full text-label" aria-label="Group assignments">
          <thead className="text-left text-ink-soft">
            <tr className="border-b border-panel-line">
              <th className="py-2 pr-3 font-medium">Group</th>
              <th className="py-2 pr-3 font-medium">Tags</th>
              <th className="py-2 pr-3 font-medium">Profile</th>
              <th className="py-2 pr-3 font-medium">Overrides</th>
              <th className="py-2 font-medium">Notes</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const a = r.assignment;
              return (
                <tr key={r.groupId} className="border-b border-panel-line align-top" data-testid={`assignment-${r.group}`}>
                  <td className="py-2 pr-3">
                    <Link href={`/sites/${site}/groups/${r.groupId}/assignment`} className="font-medium text-weir-700 hover:underline">
                      {r.group}
                    </Link>
                    {r.regulated ? <span className="ml-2 rounded bg-caution-soft px-1.5 py-0.5 text-micro text-caution">regulated record</span> : null}
                  </td>
                  <td className="py-2 pr-3">
                    {r.tagCount.toLocaleString("en")}
                    <span className="block text-micro text-ink-faint">{[...r.kinds, ...r.units].join(" · ")}</span>
                  </td>
                  <td className="py-2 pr-3">
                    {a ? (
                      <>
                        <Link href={`/profiles/${a.profileId}`} className="hover:underline">
                          {a.profile}
                        </Link>{" "}
                        <span className="text-ink-faint">revision {a.revision}</span>
                        {a.latestRevision > a.revision ? (
                          <Link href={`/sites/${site}/groups/${r.groupId}/assignment#upgrade`} className="ml-2 rounded bg-weir-50 px-1.5 py-0.5 text-micro text-weir-700">
                            revision {a.latestRevision} available
                          </Link>
                        ) : null}
                        {a.archived ? <span className="ml-2 text-micro text-ink-faint">(archived)</span> : null}
                        <span className="block text-micro text-ink-faint">outputs {a.outputs.join(", ")}</span>
                      </>
                    ) : (
                      <span className="text-ink-faint">none — the site&apos;s default handling applies</span>
                    )}
                  </td>
                  <td className="py-2 pr-3">{a ? overrideCount(a) || "—" : "—"}</td>
                  <td className="py-2 text-micro text-ink-soft">
                    {a && !a.lossy ? "lossless" : null}
                    {r.acknowledgement ? `Caution acknowledged by ${r.acknowledgement.by} on ${r.acknowledgement.at.slice(0, 10)}` : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </section>
  );
}
