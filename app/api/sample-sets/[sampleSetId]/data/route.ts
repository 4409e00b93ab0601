import { authorize } from "@/lib/auth/guard";
import { loadSampleSeries } from "@/lib/data/sample-sets";
import { route, urlId } from "@/lib/http";
import { encodeSeriesWire } from "@/lib/samples/wire";

type Ctx = { params: Promise<{ sampleSetId: string }> };

// GET /api/sample-sets/[sampleSetId]/data – the samples in our binary wire format (lib/samples/wire.ts)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { set, series } = await loadSampleSeries(actor, urlId((await params).sampleSetId, "sampleSet"));
  return new Response(encodeSeriesWire(series), {
    headers: { "Content-Type": "application/octet-stream", "Cache-Control": "private, no-cache", "Sample-Count": String(set.samples) },
  });
});
