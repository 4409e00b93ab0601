import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { listAssignments } from "@/lib/data/assignments";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/assignments – every group with its pinned revision, overrides and newer revisions
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ groups: await listAssignments(actor, (await params).site) });
});
