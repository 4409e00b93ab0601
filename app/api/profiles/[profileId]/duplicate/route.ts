import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { duplicateProfile } from "@/lib/data/profiles";
import { readJson, route } from "@/lib/http";
import { idSchema } from "@/schemas/site";

type Ctx = { params: Promise<{ profileId: string }> };

// POST /api/profiles/[profileId]/duplicate – a new profile copying the latest revision ({ name })
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  return NextResponse.json(await duplicateProfile(actor, idSchema.parse((await params).profileId), await readJson(req)), { status: 201 });
});
