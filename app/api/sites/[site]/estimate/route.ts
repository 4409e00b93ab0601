import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { siteEstimate } from "@/lib/data/estimates";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/estimate – samples, bytes, storage and uplink estimates: draft beside current release
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await siteEstimate(actor, (await params).site));
});
