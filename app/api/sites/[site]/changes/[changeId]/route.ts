import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { getChange } from "@/lib/data/changes";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; changeId: string }> };

// GET /api/sites/[site]/changes/[changeId] – a change with its review: per-gateway diffs, summary, impact
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, changeId } = await params;
  return NextResponse.json(await getChange(actor, site, urlId(changeId, "change")));
});
