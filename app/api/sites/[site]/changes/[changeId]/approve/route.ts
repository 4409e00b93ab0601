import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { approveChange } from "@/lib/data/changes";
import { readJson, route } from "@/lib/http";
import { idSchema } from "@/schemas/site";

type Ctx = { params: Promise<{ site: string; changeId: string }> };

// POST /api/sites/[site]/changes/[changeId]/approve – approve a change in review (not one's own; { comment, acknowledge })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("change.review", req);
  const { site, changeId } = await params;
  return NextResponse.json(await approveChange(actor, site, idSchema.parse(changeId), await readJson(req)));
});
