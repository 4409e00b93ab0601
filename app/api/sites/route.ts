import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { listSites } from "@/lib/data/sites";
import { route } from "@/lib/http";

// GET /api/sites – every site with its gateway count
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ sites: await listSites(actor) });
});
