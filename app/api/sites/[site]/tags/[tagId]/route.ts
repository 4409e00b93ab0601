import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteTags, updateTag } from "@/lib/data/tags";
import { readJson, route } from "@/lib/http";
import { idSchema } from "@/schemas/site";

type Ctx = { params: Promise<{ site: string; tagId: string }> };

// PATCH /api/sites/[site]/tags/[tagId] – edit one tag (all fields)
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, tagId } = await params;
  return NextResponse.json(await updateTag(actor, site, idSchema.parse(tagId), await readJson(req)));
});

// DELETE /api/sites/[site]/tags/[tagId] – delete one tag
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, tagId } = await params;
  await deleteTags(actor, site, { ids: [idSchema.parse(tagId)] });
  return new NextResponse(null, { status: 204 });
});
