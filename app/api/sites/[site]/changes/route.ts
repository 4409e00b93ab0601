import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { listChanges, submitChange } from "@/lib/data/changes";
import { readJson, route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/changes – the site's changes, newest first
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json({ changes: await listChanges(actor, (await params).site) });
});

// POST /api/sites/[site]/changes – submit the site's draft change for review ({ note })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("change.submit", req);
  return NextResponse.json(await submitChange(actor, (await params).site, await readJson(req)), { status: 201 });
});
