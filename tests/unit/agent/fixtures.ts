import { createPrivateKey } from "node:crypto";
import { gzipSync } from "node:zlib";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { CompactSign } from "jose";
import { renderBundle } from "@/lib/bundles/render";
import { digestHex } from "@/lib/bundles/digest";
import { type SigningKey, generateSigningKey, signBytes } from "@/lib/bundles/signing";
import type { Profile } from "@/lib/reduction/profile";
import type { PinnedKey } from "@/lib/agent/keys";
import { gateways, input } from "../bundles/fixtures";

/** Seeded uniform numbers in [0, 1): mulberry32 (T. Ettinger, public domain), for repeatable jitter. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export const pinned = (k: SigningKey): PinnedKey => ({ id: k.id, publicKey: k.publicKeyPem });

/** A real bundle for fw-gw-01 from the bundle tests' site, rendered by lib/bundles. */
export function bundleText(opts: { release?: number; keyId?: string; gateway?: "fw-gw-01" | "fw-gw-02"; poll?: number; profiles?: Map<number, Profile> } = {}): string {
  const gw = opts.gateway ?? "fw-gw-01";
  const over: Parameters<typeof input>[0] = { release: opts.release ?? 14, keyId: opts.keyId ?? "k1" };
  if (opts.profiles) over.profiles = opts.profiles;
  const base = input(over);
  const gateway = { ...gateways.find((g) => g.slug === gw)!, pollSeconds: opts.poll ?? 60 };
  return renderBundle({ ...base, gateway });
}

/** A Bundle-Freshness statement: JWS compact, alg EdDSA (RFC 8037), signed with jose. */
export async function freshness(key: SigningKey, claims: Record<string, unknown>, kid = key.id): Promise<string> {
  return new CompactSign(new TextEncoder().encode(JSON.stringify(claims))).setProtectedHeader({ alg: "EdDSA", kid }).sign(createPrivateKey(key.privateKeyPem));
}

/** A release as the registry serves it: bytes, signature header, freshness claims. */
export type Served = { text: string; key: SigningKey; signature?: string; release?: string };

export type CheckInRecord = { report: string; release: number; digest: string; status: string; message?: string; pointsIn: number; pointsOut: number; unknownTags?: string[]; from: string; to: string };

/**
 * A registry on 127.0.0.1 speaking the gateway contract (DESIGN.md "Gateway API") over real
 * HTTP: serves `served` with ETag, Bundle-Signature and a fresh Bundle-Freshness, answers
 * If-None-Match with 304, gzips when asked, publishes `keys`, records check-ins (a repeated
 * report id changes nothing). `queue` holds statuses to answer first (e.g. 503), per path.
 */
export async function startRegistry(served: Served, opts: { keys?: () => unknown[]; gzip?: boolean; now?: () => number } = {}) {
  const state = {
    served,
    keys: opts.keys ?? (() => [{ id: served.key.id, publicKey: served.key.publicKeyPem }]),
    queue: new Map<string, { status: number; headers?: Record<string, string> }[]>(),
    checkIns: [] as CheckInRecord[],
    requests: [] as { path: string; headers: http.IncomingHttpHeaders }[],
    /** Overrides the freshness claims (or the whole statement) of the next answers. */
    freshness: undefined as undefined | ((claims: Record<string, unknown>) => Promise<string>),
  };
  const server = http.createServer(async (req, res) => {
    const path = new URL(req.url ?? "/", "http://x").pathname.replace(/^\/api\/gateway\/v1\//, "");
    state.requests.push({ path, headers: req.headers });
    const body = await new Promise<string>((resolve) => {
      let s = "";
      req.on("data", (c) => (s += c));
      req.on("end", () => resolve(s));
    });
    const queued = state.queue.get(path)?.shift();
    if (queued) {
      res.writeHead(queued.status, queued.headers ?? {});
      return res.end();
    }
    if (req.headers.authorization !== "Bearer gw-token") {
      res.writeHead(401, { "www-authenticate": 'Bearer realm="sluice", error="invalid_token"' });
      return res.end();
    }
    const s = state.served;
    const digest = digestHex(s.text);
    const release = /^release: (\d+)$/m.exec(s.text)?.[1] ?? "0";
    const gateway = /^gateway: (\S+)$/m.exec(s.text)?.[1];
    if (path === "bundle") {
      const now = Math.floor((opts.now?.() ?? Date.now()) / 1000);
      const claims = { gateway, release: Number(release), digest, iat: now, exp: now + 180 };
      const fresh = state.freshness ? await state.freshness(claims) : await freshness(s.key, claims);
      const gz = opts.gzip && /gzip/.test(String(req.headers["accept-encoding"]));
      const etag = `"${digest}${gz ? "-gzip" : ""}"`;
      const common = { etag, "cache-control": "private, no-cache", "bundle-freshness": fresh };
      if ((req.headers["if-none-match"] ?? "").includes(digest)) {
        res.writeHead(304, common);
        return res.end();
      }
      const bytes = gz ? gzipSync(s.text) : Buffer.from(s.text);
      res.writeHead(200, {
        ...common,
        "content-type": "application/yaml",
        "bundle-release": s.release ?? release,
        "bundle-signature": `key=${s.key.id}, ed25519=${s.signature ?? signBytes(s.key, s.text)}`,
        ...(gz ? { "content-encoding": "gzip" } : {}),
      });
      return res.end(bytes);
    }
    if (path === "signing-key") {
      res.writeHead(200, { "content-type": "application/json" });
      return res.end(JSON.stringify({ keys: state.keys() }));
    }
    if (path === "check-in" && req.method === "PUT") {
      const r = JSON.parse(body) as CheckInRecord;
      if (!state.checkIns.some((c) => c.report === r.report)) state.checkIns.push(r);
      res.writeHead(204);
      return res.end();
    }
    res.writeHead(404, { "content-type": "application/json" });
    res.end(JSON.stringify({ error: "not found" }));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    state,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

export { generateSigningKey, signBytes };
