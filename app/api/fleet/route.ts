import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { fleetStatus } from "@/lib/data/fleet";
import { route } from "@/lib/http";
import { fleetQuerySchema } from "@/schemas/fleet";

// GET /api/fleet?site=&state= – every gateway's target and running release, state and ratios, with a roll-up per site (times in ISO 8601)
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  const filters = fleetQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return NextResponse.json(await fleetStatus(actor, filters));
});
