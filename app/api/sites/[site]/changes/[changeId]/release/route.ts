import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { releaseChange } from "@/lib/data/changes";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; changeId: string }> };

// POST /api/sites/[site]/changes/[changeId]/release – release an approved change (compare-and-set on its base release)
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("change.review", req);
  const { site, changeId } = await params;
  return NextResponse.json(await releaseChange(actor, site, urlId(changeId, "change")));
});
