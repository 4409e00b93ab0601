import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createGroup, listGroups } from "@/lib/data/groups";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/groups – the site's tag groups in priority order, with their tag counts
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ groups: await listGroups(actor, (await params).site) });
});

// POST /api/sites/[site]/groups – add a tag group (joins the site's draft change)
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await createGroup(actor, (await params).site, await readJson(req)), { status: 201 });
});
