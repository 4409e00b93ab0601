import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createSite } from "@/lib/data/site-writes";
import { listSites } from "@/lib/data/sites";
import { readJson, route } from "@/lib/http";
import type { SiteInput } from "@/schemas/site";

// GET /api/sites – every site with its gateway count
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ sites: await listSites(actor) });
});

// POST /api/sites – create a site
export const POST = route(async (req) => {
  const actor = await authorize("fleet.admin", req);
  return NextResponse.json(await createSite(actor, (await readJson(req)) as SiteInput), { status: 201 });
});
