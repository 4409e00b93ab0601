import { GroupEditor } from "@/components/groups/group-editor";
import { Forbidden } from "@/components/shell/forbidden";
import { currentActor } from "@/lib/auth/guard";
import { listGateways } from "@/lib/data/sites";
import { can } from "@/lib/permissions";

type Props = { params: Promise<{ site: string }> };

export default async function NewGroupPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  if (!actor || !can(actor.role, "config.edit")) return <Forbidden what="group editing" level={2} />;
  const gateways = (await listGateways(actor, site)).map((g) => g.slug);
  return (
    <>
      <h2 className="mb-4">New tag group</h2>
      <GroupEditor site={site} gateways={gateways} existing={null} canEdit />
    </>
  );
}
