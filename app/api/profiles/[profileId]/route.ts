import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { getProfile, setProfileArchived } from "@/lib/data/profiles";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ profileId: string }> };

// GET /api/profiles/[profileId] – one profile: latest document, revisions, where it is assigned
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await getProfile(actor, urlId((await params).profileId, "profile")));
});

// PATCH /api/profiles/[profileId] – archive or restore a profile ({ archived })
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await setProfileArchived(actor, urlId((await params).profileId, "profile"), await readJson(req)));
});
