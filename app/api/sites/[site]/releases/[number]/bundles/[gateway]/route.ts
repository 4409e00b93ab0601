import { authorize } from "@/lib/auth/guard";
import { getBundle } from "@/lib/data/releases";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ site: string; number: string; gateway: string }> };

// GET /api/sites/[site]/releases/[number]/bundles/[gateway] – download one stored bundle (exact bytes)
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { site, number, gateway } = await params;
  const n = urlId(number, "release");
  const bundle = await getBundle(actor, site, n, gateway);
  return new Response(new Uint8Array(bundle.bytes), {
    headers: {
      "Content-Type": "application/yaml; charset=utf-8",
      "Content-Disposition": `attachment; filename="${site}-${gateway}-r${n}.yaml"`,
      "Bundle-Digest": bundle.digest,
      "Bundle-Signature": `key=${bundle.keyId}, ed25519=${bundle.signature}`,
      "Cache-Control": "private, no-cache",
    },
  });
});
