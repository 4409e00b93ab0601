import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { listReleases } from "@/lib/data/releases";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/releases – release history, newest first, with bundle digests
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ releases: await listReleases(actor, (await params).site) });
});
