import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { getGroupAssignment, removeAssignment, setAssignment } from "@/lib/data/assignments";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; groupId: string }> };

// GET /api/sites/[site]/groups/[groupId]/assignment – the group's assignment and the tags it applies to
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, groupId } = await params;
  return NextResponse.json(await getGroupAssignment(actor, site, urlId(groupId, "group")));
});

// PUT /api/sites/[site]/groups/[groupId]/assignment – pin a profile revision with overrides (joins the draft)
export const PUT = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  return NextResponse.json(await setAssignment(actor, site, urlId(groupId, "group"), await readJson(req)));
});

// DELETE /api/sites/[site]/groups/[groupId]/assignment – remove the group's assignment (joins the draft)
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  await removeAssignment(actor, site, urlId(groupId, "group"));
  return new Response(null, { status: 204 });
});
