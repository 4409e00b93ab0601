import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { previewGroup } from "@/lib/data/groups";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// POST /api/sites/[site]/groups/preview – count and sample of the tags a selector matches (writes nothing)
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await previewGroup(actor, (await params).site, await readJson(req)));
});
