import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteSite, updateSite } from "@/lib/data/site-writes";
import { getSite } from "@/lib/data/sites";
import { readJson, route } from "@/lib/http";
import type { SiteInput } from "@/schemas/site";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site] – one site by slug
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await getSite(actor, (await params).site));
});

// PATCH /api/sites/[site] – replace a site's settings (all fields)
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  return NextResponse.json(await updateSite(actor, (await params).site, (await readJson(req)) as SiteInput));
});

// DELETE /api/sites/[site] – delete a site and its gateways (refused while releases need it)
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  await deleteSite(actor, (await params).site);
  return new NextResponse(null, { status: 204 });
});
