import { env } from "@/lib/env";
import { gatewayOpenApi } from "@/lib/gateway/openapi";

let body: string | null = null;

// GET /api/gateway/v1/openapi.json – the gateway API described in OpenAPI 3.1 (built once per process)
export async function GET() {
  body ??= JSON.stringify(gatewayOpenApi(env().PUBLIC_URL));
  return new Response(body, { headers: { "Content-Type": "application/json", "Cache-Control": "public, max-age=300" } });
}
