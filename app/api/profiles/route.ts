import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createProfile, listProfiles } from "@/lib/data/profiles";
import { readJson, route } from "@/lib/http";

// GET /api/profiles – the profile library (?q= search, ?status=active|archived|all, ?kind=)
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  const query = Object.fromEntries(new URL(req.url).searchParams);
  return NextResponse.json({ profiles: await listProfiles(actor, query) });
});

// POST /api/profiles – create a profile from a document (its revision 1)
export const POST = route(async (req) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await createProfile(actor, await readJson(req)), { status: 201 });
});
