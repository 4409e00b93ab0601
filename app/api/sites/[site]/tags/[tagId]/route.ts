import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteTags, updateTag } from "@/lib/data/tags";
import { HttpError, readJson, route, urlId } from "@/lib/http";

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
  const id = urlId(tagId, "tag");
  // The bulk delete names its "ids" list when a tag is missing; here the URL names one tag.
  await deleteTags(actor, site, { ids: [id] }).catch((e: unknown) => {
    throw e instanceof HttpError && e.status === 404 && e.field === "ids" ? new HttpError(404, `no tag with id ${id} at this site`, "tag") : e;
  });
  return new NextResponse(null, { status: 204 });
});
