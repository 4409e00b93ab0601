import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteGroup, getGroup, updateGroup } from "@/lib/data/groups";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; groupId: string }> };

// GET /api/sites/[site]/groups/[groupId] – one group with its selector and counts
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, groupId } = await params;
  return NextResponse.json(await getGroup(actor, site, urlId(groupId, "group")));
});

// PATCH /api/sites/[site]/groups/[groupId] – replace a group's name, description, flag and selector
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  return NextResponse.json(await updateGroup(actor, site, urlId(groupId, "group"), await readJson(req)));
});

// DELETE /api/sites/[site]/groups/[groupId] – remove a group (joins the site's draft change)
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  await deleteGroup(actor, site, urlId(groupId, "group"));
  return new Response(null, { status: 204 });
});
