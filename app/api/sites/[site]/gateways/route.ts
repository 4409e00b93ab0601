import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { listGateways } from "@/lib/data/sites";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/gateways – a site's gateways
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site } = await params;
  return NextResponse.json({ gateways: await listGateways(actor, site) });
});
