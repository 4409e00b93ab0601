import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteTag, updateTag } from "@/lib/data/tags";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; tagId: string }> };

// PATCH /api/sites/[site]/tags/[tagId] – edit one tag (all fields)
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, tagId } = await params;
  return NextResponse.json(await updateTag(actor, site, urlId(tagId, "tag"), await readJson(req)));
});

// DELETE /api/sites/[site]/tags/[tagId] – delete one tag
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, tagId } = await params;
  await deleteTag(actor, site, urlId(tagId, "tag"));
  return new NextResponse(null, { status: 204 });
});
