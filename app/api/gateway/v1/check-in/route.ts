import { CHECK_IN_LIMIT_BYTES, recordCheckIn } from "@/lib/data/check-in";
import { authenticateGateway } from "@/lib/data/gateway-auth";
import { readJsonLimited, route } from "@/lib/http";

export const dynamic = "force-dynamic";

// PUT /api/gateway/v1/check-in – what the gateway runs, with counters since its previous report; idempotent by report id
export const PUT = route(async (req: Request) => {
  const pull = await authenticateGateway(req);
  const body = await readJsonLimited(req, CHECK_IN_LIMIT_BYTES);
  await recordCheckIn(pull, body);
  return new Response(null, { status: 204 });
});
