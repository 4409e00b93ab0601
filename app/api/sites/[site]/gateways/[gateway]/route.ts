import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteGateway, updateGateway } from "@/lib/data/site-writes";
import { getGateway } from "@/lib/data/sites";
import { readJson, route } from "@/lib/http";
import type { GatewayInput } from "@/schemas/site";

type Ctx = { params: Promise<{ site: string; gateway: string }> };

// GET /api/sites/[site]/gateways/[gateway] – one gateway
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, gateway } = await params;
  return NextResponse.json(await getGateway(actor, site, gateway));
});

// PATCH /api/sites/[site]/gateways/[gateway] – replace a gateway's settings (all fields)
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const { site, gateway } = await params;
  return NextResponse.json(await updateGateway(actor, site, gateway, (await readJson(req)) as GatewayInput));
});

// DELETE /api/sites/[site]/gateways/[gateway] – delete a gateway (refused while releases need it)
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const { site, gateway } = await params;
  await deleteGateway(actor, site, gateway);
  return new NextResponse(null, { status: 204 });
});
