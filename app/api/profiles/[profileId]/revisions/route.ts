import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { saveRevision } from "@/lib/data/profiles";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ profileId: string }> };

// POST /api/profiles/[profileId]/revisions – save a new revision ({ document, note, baseRevision })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await saveRevision(actor, urlId((await params).profileId, "profile"), await readJson(req)), { status: 201 });
});
