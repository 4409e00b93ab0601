import { z } from "zod";
import { checkInShape } from "./check-in-shape";

const error = { $ref: "#/components/schemas/Error" };
const json = (schema: object) => ({ "application/json": { schema } });
const retryAfter = { "Retry-After": { description: "Seconds to wait before trying again (RFC 9110 §10.2.3).", schema: { type: "integer", minimum: 0 } } };
const challenge = {
  "WWW-Authenticate": {
    description: 'RFC 6750 §3: `Bearer realm="sluice"` when no token was sent; with `error="invalid_token"` when the token is unknown, expired or revoked.',
    schema: { type: "string" },
  },
};
const freshness = {
  "Bundle-Freshness": {
    description:
      "JWS compact serialisation (RFC 7515), alg EdDSA (RFC 8037), protected header `kid` = the signing key id; payload `{gateway, release, digest, iat, exp}` (seconds since the epoch), signed with the registry key. Lets a gateway tell a current \"nothing changed\" from a replayed old answer.",
    schema: { type: "string", pattern: "^[A-Za-z0-9_-]+\\.[A-Za-z0-9_-]+\\.[A-Za-z0-9_-]+$" },
  },
};
const etag = {
  ETag: {
    description: "Strong entity tag: the quoted SHA-256 hex of the bundle's bytes. The body is always sent uncompressed; a proxy that compresses must give that representation another (weak) ETag (RFC 9110 §8.8.3).",
    schema: { type: "string" },
  },
};
const cacheControl = { "Cache-Control": { schema: { type: "string", const: "private, no-cache" } } };
const authFailures = {
  "401": { description: "No token, or an unknown, expired or revoked one. Sent before any precondition is evaluated.", headers: challenge, content: json(error) },
  "429": { description: "The token (or the address) failed too often; slowed down.", headers: retryAfter, content: json(error) },
  "503": { description: "The registry's database is unreachable.", headers: retryAfter, content: json(error) },
};

/** The gateway API as an OpenAPI 3.1 document (served at /api/gateway/v1/openapi.json). */
export function gatewayOpenApi(serverUrl?: string) {
  return {
    openapi: "3.1.0",
    info: {
      title: "Sluice gateway API",
      version: "1.0.0",
      description:
        "What an edge gateway calls: pull its signed bundle, learn the registry's signing keys, and check in with what it runs. The bearer token identifies the gateway; there is no way to ask for another gateway's bundle. Tokens are never accepted in a URL.",
    },
    ...(serverUrl ? { servers: [{ url: serverUrl }] } : {}),
    security: [{ gatewayToken: [] }],
    paths: {
      "/api/gateway/v1/bundle": {
        get: {
          operationId: "getBundle",
          summary: "The calling gateway's bundle of its site's newest release",
          parameters: [
            { name: "If-None-Match", in: "header", required: false, description: "Entity tags, or `*`; weak comparison (RFC 9110 §13.1.2).", schema: { type: "string" } },
          ],
          responses: {
            "200": {
              description: "The bundle's exact bytes (YAML 1.2).",
              headers: {
                ...etag,
                ...cacheControl,
                ...freshness,
                "Bundle-Release": { description: "The release number.", schema: { type: "integer", minimum: 1 } },
                "Bundle-Signature": { description: "`key=<key id>, ed25519=<base64>`: Ed25519 (RFC 8032) over the exact uncompressed bytes.", schema: { type: "string" } },
              },
              content: { "application/yaml": { schema: { type: "string" } } },
            },
            "304": { description: "The bundle in the If-None-Match field is current. No body.", headers: { ...etag, ...cacheControl, ...freshness, Date: { schema: { type: "string" } } } },
            "404": { description: "No release holds a bundle for this gateway yet.", content: json(error) },
            ...authFailures,
          },
        },
      },
      "/api/gateway/v1/signing-key": {
        get: {
          operationId: "getSigningKeys",
          summary: "The registry's public signing keys",
          responses: {
            "200": {
              description: "Every active key. A key introduced by a rotation carries the previous key's Ed25519 signature over the exact bytes of its PEM.",
              content: json({
                type: "object",
                required: ["keys"],
                properties: {
                  keys: {
                    type: "array",
                    items: {
                      type: "object",
                      required: ["id", "publicKey"],
                      properties: {
                        id: { type: "string" },
                        publicKey: { type: "string", description: "SPKI PEM of an Ed25519 public key." },
                        signedBy: { type: "object", required: ["keyId", "signature"], properties: { keyId: { type: "string" }, signature: { type: "string", contentEncoding: "base64" } } },
                      },
                    },
                  },
                },
              }),
            },
            ...authFailures,
          },
        },
      },
      "/api/gateway/v1/check-in": {
        put: {
          operationId: "checkIn",
          summary: "Report what the gateway runs, with counters since its previous report",
          description: "Idempotent by report id: the same report twice changes nothing. A running report of a lower release than the last running one is recorded and flagged.",
          requestBody: { required: true, content: json(checkInJsonSchema()) },
          responses: {
            "204": { description: "Recorded (or already recorded)." },
            "400": { description: "The body is not JSON.", content: json(error) },
            "413": { description: "The body is larger than the limit.", content: json(error) },
            "422": { description: "A field is invalid; `field` names it.", content: json(error) },
            ...authFailures,
          },
        },
      },
    },
    components: {
      securitySchemes: { gatewayToken: { type: "http", scheme: "bearer", description: "A gateway token (`sgw_…`), issued once by an admin." } },
      schemas: {
        Error: {
          type: "object",
          required: ["error"],
          properties: { error: { type: "string" }, field: { type: "string" }, issues: { type: "array", items: { type: "object", properties: { field: { type: "string" }, message: { type: "string" } } } } },
        },
      },
    },
  };
}

/** The check-in body's JSON Schema, generated from the same zod shape the route validates with. */
export function checkInJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(checkInShape, { target: "draft-2020-12", io: "input" }) as Record<string, unknown>;
  delete schema.$schema;
  return schema;
}
