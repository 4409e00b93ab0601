import { DraftPanel } from "@/components/drafts/draft-panel";
import { currentActor } from "@/lib/auth/guard";
import { draftSummary } from "@/lib/data/drafts";
import { can } from "@/lib/permissions";

type Props = { params: Promise<{ site: string }> };

export default async function DraftPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const draft = await draftSummary(actor, site);
  return <DraftPanel site={site} draft={draft} canEdit={!!actor && can(actor.role, "config.edit")} />;
}
