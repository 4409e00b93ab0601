import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { getGroupAssignment, removeAssignment, setAssignment } from "@/lib/data/assignments";
import { readJson, route } from "@/lib/http";
import { idSchema } from "@/schemas/site";

type Ctx = { params: Promise<{ site: string; groupId: string }> };

// GET /api/sites/[site]/groups/[groupId]/assignment – the group's assignment and the tags it applies to
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, groupId } = await params;
  return NextResponse.json(await getGroupAssignment(actor, site, idSchema.parse(groupId)));
});

// PUT /api/sites/[site]/groups/[groupId]/assignment – pin a profile revision with overrides (joins the draft)
export const PUT = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  return NextResponse.json(await setAssignment(actor, site, idSchema.parse(groupId), await readJson(req)));
});

// DELETE /api/sites/[site]/groups/[groupId]/assignment – remove the group's assignment (joins the draft)
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  await removeAssignment(actor, site, idSchema.parse(groupId));
  return new Response(null, { status: 204 });
});
