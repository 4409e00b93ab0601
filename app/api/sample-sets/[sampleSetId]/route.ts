import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { deleteSampleSet, getSampleSet } from "@/lib/data/sample-sets";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ sampleSetId: string }> };

// GET /api/sample-sets/[sampleSetId] – a sample set's description (tag context, size, span)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  return NextResponse.json(await getSampleSet(actor, urlId((await params).sampleSetId, "sampleSet")));
});

// DELETE /api/sample-sets/[sampleSetId] – remove a saved sample set
export const DELETE = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  await deleteSampleSet(actor, urlId((await params).sampleSetId, "sampleSet"));
  return new Response(null, { status: 204 });
});
