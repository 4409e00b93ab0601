import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createSampleSet, listSampleSets, SAMPLE_SET_MAX_SAMPLES } from "@/lib/data/sample-sets";
import { HttpError, route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; groupId: string }> };

/** Largest body: the wire header plus time, value and quality of the largest set. */
const MAX_BODY = 16 + 17 * SAMPLE_SET_MAX_SAMPLES;

// GET /api/sites/[site]/groups/[groupId]/samples – the group's saved sample sets (descriptions)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, groupId } = await params;
  return NextResponse.json({ sampleSets: await listSampleSets(actor, site, urlId(groupId, "group")) });
});

// POST /api/sites/[site]/groups/[groupId]/samples?name=&tag= – save sample data (binary body, lib/samples/wire.ts)
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site, groupId } = await params;
  if (Number(req.headers.get("content-length") ?? "0") > MAX_BODY) throw new HttpError(413, `a sample set body is at most ${MAX_BODY} bytes`, "body");
  const body = await req.arrayBuffer();
  if (body.byteLength > MAX_BODY) throw new HttpError(413, `a sample set body is at most ${MAX_BODY} bytes`, "body");
  const query = Object.fromEntries(new URL(req.url).searchParams);
  return NextResponse.json(await createSampleSet(actor, site, urlId(groupId, "group"), query, body), { status: 201 });
});
