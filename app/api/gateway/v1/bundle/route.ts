import { bundleEtag, ifNoneMatchMatches } from "@/lib/gateway/conditional";
import { freshnessFor } from "@/lib/gateway/freshness";
import { authenticateGateway } from "@/lib/data/gateway-auth";
import { bundleBytes } from "@/lib/data/gateway-bundle";
import { signingKeys } from "@/lib/data/signing-keys";
import { HttpError, route } from "@/lib/http";

export const dynamic = "force-dynamic";

// GET /api/gateway/v1/bundle – the calling gateway's bundle of its site's newest release (DESIGN.md "Gateway API")
export const GET = route(async (req: Request) => {
  const pull = await authenticateGateway(req);
  if (pull.bundleId === null || pull.digest === null || pull.release === null) {
    throw new HttpError(404, `no release holds a bundle for gateway ${pull.gateway} yet`, "release");
  }
  const etag = bundleEtag(pull.digest);
  const { keys } = signingKeys();
  const key = keys.find((k) => k.id === pull.keyId) ?? signingKeys().active;
  const headers: Record<string, string> = {
    ETag: etag,
    "Cache-Control": "private, no-cache",
    "Bundle-Release": String(pull.release),
    "Bundle-Freshness": await freshnessFor(pull.gateway, pull.release, pull.digest, pull.pollSeconds, key),
  };
  if (ifNoneMatchMatches(req.headers.get("if-none-match"), etag)) {
    return new Response(null, { status: 304, headers: { ...headers, Date: new Date().toUTCString() } });
  }
  const body = await bundleBytes(pull.bundleId, pull.digest);
  headers["Content-Type"] = "application/yaml; charset=utf-8";
  headers["Bundle-Signature"] = `key=${pull.keyId}, ed25519=${pull.signature}`;
  return new Response(new Uint8Array(body), { status: 200, headers });
});
