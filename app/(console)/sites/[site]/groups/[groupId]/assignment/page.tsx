import Link from "next/link";
import { notFound } from "next/navigation";
import { AssignmentEditor } from "@/components/assignments/assignment-editor";
import { currentActor } from "@/lib/auth/guard";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { getGroupAssignment } from "@/lib/data/assignments";
import { diffRevisions, listProfiles } from "@/lib/data/profiles";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string; groupId: string }> };

export default async function GroupAssignmentPage({ params }: Readonly<Props>) {
  const { site, groupId } = await params;
  const id = Number(groupId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const actor = await currentActor();
  const detail = await orNotFound(getGroupAssignment(actor, site, id));
  const current = detail.assignment;
  const all = await listProfiles(actor, { status: "all" });
  // Offer active profiles whose kinds cover the group's tags; keep the pinned one even when archived.
  const profiles = all
    .filter((p) => (!p.archived && detail.kinds.every((k) => p.kinds.includes(k))) || p.id === current?.profileId)
    .map((p) => ({ id: p.id, name: p.archived ? `${p.name} (archived)` : p.name, latestRevision: p.latestRevision, kinds: p.kinds }));
  const upgrade =
    current && current.latestRevision > current.revision
      ? { to: current.latestRevision, summary: (await diffRevisions(actor, current.profileId, current.revision, current.latestRevision)).summary }
      : null;
  return (
    <>
      <h2 className="mb-1">
        Assignment for group {detail.group}
        {detail.regulated ? <span className="ml-2 rounded bg-caution-soft px-1.5 py-0.5 align-middle text-micro text-caution">regulated record</span> : null}
      </h2>
      <p className="mb-4 text-label text-ink-soft">
        {detail.tagCount.toLocaleString("en")} tags ({[...detail.kinds, ...detail.units].join(", ") || "none yet"}).{" "}
        <Link href={`/sites/${site}/groups/${id}`} className="text-weir-700 underline">
          Group rules
        </Link>
      </p>
      <AssignmentEditor
        site={site}
        groupId={id}
        regulated={detail.regulated}
        canEdit={!!actor && can(actor.role, "config.edit")}
        tags={detail.tags.map((t) => ({ name: t.name, unit: t.unit }))}
        profiles={profiles}
        current={current}
        cautionId={REGULATED_RECORD_CAUTION.id}
        upgrade={upgrade}
      />
    </>
  );
}
