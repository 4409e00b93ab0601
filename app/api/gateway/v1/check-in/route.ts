import { CHECK_IN_LIMIT_BYTES, recordCheckIn } from "@/lib/data/check-in";
import { sweepGatewayAlerts } from "@/lib/data/fleet-alerts";
import { authenticateGateway } from "@/lib/data/gateway-auth";
import { readJsonLimited, route } from "@/lib/http";

export const dynamic = "force-dynamic";

// PUT /api/gateway/v1/check-in – what the gateway runs, with counters since its previous report; idempotent by report id
export const PUT = route(async (req: Request) => {
  const pull = await authenticateGateway(req);
  const body = await readJsonLimited(req, CHECK_IN_LIMIT_BYTES);
  const result = await recordCheckIn(pull, body);
  // A new failure is mailed now rather than at the next timed sweep (the sweep mails each episode once).
  if (result.stored && result.status === "failed") {
    void sweepGatewayAlerts().catch((err: unknown) => console.error("gateway alert sweep failed:", (err as Error).message));
  }
  return new Response(null, { status: 204 });
});
