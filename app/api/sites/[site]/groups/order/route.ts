import { authorize } from "@/lib/auth/guard";
import { reorderGroups } from "@/lib/data/groups";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// PUT /api/sites/[site]/groups/order – set the priority order ({ order: [group ids, first wins] })
export const PUT = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  await reorderGroups(actor, (await params).site, await readJson(req));
  return new Response(null, { status: 204 });
});
