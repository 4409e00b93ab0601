import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { coverage } from "@/lib/data/groups";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/coverage – tags in no group, and tags several groups match with the winner
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await coverage(actor, (await params).site));
});
