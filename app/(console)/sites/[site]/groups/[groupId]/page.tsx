import Link from "next/link";
import { notFound } from "next/navigation";
import { GroupEditor } from "@/components/groups/group-editor";
import { currentActor } from "@/lib/auth/guard";
import { getGroup } from "@/lib/data/groups";
import { listGateways } from "@/lib/data/sites";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string; groupId: string }> };

export default async function GroupPage({ params }: Readonly<Props>) {
  const { site, groupId } = await params;
  const id = Number(groupId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const actor = await currentActor();
  const group = await orNotFound(getGroup(actor, site, id));
  const gateways = (await listGateways(actor, site)).map((g) => g.slug);
  return (
    <>
      <h2 className="mb-4">
        Group {group.name}
        <span className="ml-2 text-label font-normal text-ink-faint">{group.tagCount.toLocaleString("en")} tags</span>
      </h2>
      <p className="mb-4 text-label">
        <Link href={`/sites/${site}/groups/${id}/assignment`} className="text-weir-700 hover:underline">
          {group.assignment ? `Assigned: ${group.assignment.profile} revision ${group.assignment.revision} — change` : "Assign a profile"}
        </Link>
      </p>
      <GroupEditor site={site} gateways={gateways} existing={group} canEdit={!!actor && can(actor.role, "config.edit")} />
    </>
  );
}
