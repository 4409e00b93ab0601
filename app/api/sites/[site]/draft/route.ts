import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { draftSummary } from "@/lib/data/drafts";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/draft – the site's open change: state, authors and edits since the current release
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await draftSummary(actor, (await params).site));
});
