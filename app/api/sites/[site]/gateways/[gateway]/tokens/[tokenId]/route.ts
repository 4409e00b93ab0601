import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { revokeGatewayToken } from "@/lib/data/gateway-tokens";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; gateway: string; tokenId: string }> };

// DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId] – revoke a token (kept in the list as revoked)
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const { site, gateway, tokenId } = await params;
  return NextResponse.json(await revokeGatewayToken(actor, site, gateway, tokenId));
});
