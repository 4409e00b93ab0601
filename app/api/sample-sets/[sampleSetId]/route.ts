import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteSampleSet, getSampleSet } from "@/lib/data/sample-sets";
import { route } from "@/lib/http";
import { idSchema } from "@/schemas/site";

type Ctx = { params: Promise<{ sampleSetId: string }> };

// GET /api/sample-sets/[sampleSetId] – a sample set's description (tag context, size, span)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await getSampleSet(actor, idSchema.parse((await params).sampleSetId)));
});

// DELETE /api/sample-sets/[sampleSetId] – remove a saved sample set
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  await deleteSampleSet(actor, idSchema.parse((await params).sampleSetId));
  return new Response(null, { status: 204 });
});
