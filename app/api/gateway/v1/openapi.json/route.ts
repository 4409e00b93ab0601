import { NextResponse } from "next/server";
import { env } from "@/lib/env";
import { gatewayOpenApi } from "@/lib/gateway/openapi";

// GET /api/gateway/v1/openapi.json – the gateway API described in OpenAPI 3.1
export async function GET() {
  return NextResponse.json(gatewayOpenApi(env().PUBLIC_URL), { headers: { "Cache-Control": "public, max-age=300" } });
}
