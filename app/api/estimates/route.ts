import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { fleetEstimate } from "@/lib/data/estimates";
import { route } from "@/lib/http";

// GET /api/estimates – every site's uplink estimate before and after its draft change
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ sites: await fleetEstimate(actor) });
});
