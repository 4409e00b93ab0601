import { NextResponse } from "next/server";
import { z } from "zod";
import { authorize } from "@/lib/auth/guard";
import { createTag, deleteTags, listTags } from "@/lib/data/tags";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

const pageSchema = z.object({
  offset: z.coerce.number({ message: "offset must be a number." }).int().min(0).default(0),
  limit: z.coerce.number({ message: "limit must be a number." }).int().min(1).max(20_000).default(10_000),
});

// GET /api/sites/[site]/tags – a page of the site's tag inventory, by name (offset, limit ≤ 20,000)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const page = pageSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return NextResponse.json(await listTags(actor, (await params).site, page));
});

// POST /api/sites/[site]/tags – add one tag
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await createTag(actor, (await params).site, await readJson(req)), { status: 201 });
});

// DELETE /api/sites/[site]/tags – delete the selected tags ({ ids }), all or none
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await deleteTags(actor, (await params).site, await readJson(req)));
});
