import { NextResponse } from "next/server";
import { publicKeys } from "@/lib/bundles/signing";
import { authenticateGateway } from "@/lib/data/gateway-auth";
import { signingKeys } from "@/lib/data/signing-keys";
import { route } from "@/lib/http";

export const dynamic = "force-dynamic";

// GET /api/gateway/v1/signing-key – the registry's public keys; a rotated key carries the old key's signature
export const GET = route(async (req: Request) => {
  await authenticateGateway(req);
  return NextResponse.json({ keys: publicKeys(signingKeys().keys) }, { headers: { "Cache-Control": "private, no-cache" } });
});
