import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { rejectChange } from "@/lib/data/changes";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; changeId: string }> };

// POST /api/sites/[site]/changes/[changeId]/reject – reject a change with a comment ({ comment })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("change.review", req);
  const { site, changeId } = await params;
  return NextResponse.json(await rejectChange(actor, site, urlId(changeId, "change"), await readJson(req)));
});
