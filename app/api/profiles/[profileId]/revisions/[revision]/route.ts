import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { getRevision } from "@/lib/data/profiles";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ profileId: string; revision: string }> };

// GET /api/profiles/[profileId]/revisions/[revision] – one revision's document
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { profileId, revision } = await params;
  return NextResponse.json(await getRevision(actor, urlId(profileId, "profile"), urlId(revision, "revision")));
});
