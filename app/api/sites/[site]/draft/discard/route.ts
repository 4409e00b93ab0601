import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { discardEdits } from "@/lib/data/draft-discard";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// POST /api/sites/[site]/draft/discard – undo chosen edits ({ edits: [key] }) or all ({ all: true })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await discardEdits(actor, (await params).site, await readJson(req)));
});
