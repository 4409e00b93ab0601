import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { duplicateProfile } from "@/lib/data/profiles";
import { readJson, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ profileId: string }> };

// POST /api/profiles/[profileId]/duplicate – a new profile copying the latest revision ({ name })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await duplicateProfile(actor, urlId((await params).profileId, "profile"), await readJson(req)), { status: 201 });
});
