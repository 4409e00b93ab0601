import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createGateway } from "@/lib/data/site-writes";
import { listGateways } from "@/lib/data/sites";
import { readJson, route } from "@/lib/http";
import type { GatewayInput } from "@/schemas/site";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/gateways – a site's gateways
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ gateways: await listGateways(actor, (await params).site) });
});

// POST /api/sites/[site]/gateways – register a gateway at the site
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const gateway = await createGateway(actor, (await params).site, (await readJson(req)) as GatewayInput);
  return NextResponse.json(gateway, { status: 201 });
});
