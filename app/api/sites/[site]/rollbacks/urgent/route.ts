import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { urgentRollback } from "@/lib/data/rollbacks";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// POST /api/sites/[site]/rollbacks/urgent – release a rollback alone with a written reason ({ release, reason })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("change.review", req);
  return NextResponse.json(await urgentRollback(actor, (await params).site, await readJson(req)), { status: 201 });
});
