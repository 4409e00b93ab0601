import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { startRollback } from "@/lib/data/rollbacks";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// POST /api/sites/[site]/rollbacks – a change restoring an earlier release, submitted for review ({ release, note })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("change.review", req);
  return NextResponse.json(await startRollback(actor, (await params).site, await readJson(req)), { status: 201 });
});
