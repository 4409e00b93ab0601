import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createGatewayToken, listGatewayTokens } from "@/lib/data/gateway-tokens";
import { HttpError, assertWellFormedText, route } from "@/lib/http";
import type { IssueTokenInput } from "@/schemas/gateway-token";

type Ctx = { params: Promise<{ site: string; gateway: string }> };

// GET /api/sites/[site]/gateways/[gateway]/tokens – a gateway's tokens by prefix, live and revoked (admins only)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const { site, gateway } = await params;
  return NextResponse.json({ tokens: await listGatewayTokens(actor, site, gateway) }, { headers: { "Cache-Control": "no-store" } });
});

// POST /api/sites/[site]/gateways/[gateway]/tokens – issue a token; the token is in this response only
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const { site, gateway } = await params;
  const issued = await createGatewayToken(actor, site, gateway, await optionalJson(req));
  return NextResponse.json(issued, { status: 201, headers: { "Cache-Control": "no-store" } });
});

/** The body is optional (`{label?}`): an empty body issues an unlabelled token; anything else must be JSON. */
async function optionalJson(req: Request): Promise<IssueTokenInput> {
  const text = await req.text();
  if (text.trim() === "") return {};
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new HttpError(400, "the request body must be JSON", "body");
  }
  assertWellFormedText(body);
  return body as IssueTokenInput;
}
