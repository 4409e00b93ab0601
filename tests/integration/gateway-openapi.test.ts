import { randomUUID } from "node:crypto";
import { Validator } from "@seriousme/openapi-schema-validator";
import Ajv2020 from "ajv/dist/2020";
import { describe, expect, it } from "vitest";
import { GET as openapiRoute } from "@/app/api/gateway/v1/openapi.json/route";
import { GET as keysRoute } from "@/app/api/gateway/v1/signing-key/route";
import { ROUTE_ACCESS } from "@/lib/permissions";
import { request } from "../factories";
import { releasedGateway } from "./matrix/samples";

// The gateway API's OpenAPI 3.1 document, checked against the OpenAPI 3.1 JSON Schema
// (the published schema bundled by @seriousme/openapi-schema-validator) and against the routes.

async function doc() {
  const res = await openapiRoute();
  expect(res.status).toBe(200);
  return res.json();
}

describe("GET /api/gateway/v1/openapi.json", () => {
  it("is a valid OpenAPI 3.1 document", async () => {
    const validator = new Validator();
    const result = await validator.validate(await doc());
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe("3.1");
  });

  it("describes exactly the gateway routes, with the statuses they answer", async () => {
    const d = await doc();
    const documented = Object.entries(d.paths as Record<string, Record<string, unknown>>).flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p}`));
    const gatewayRoutes = Object.entries(ROUTE_ACCESS).filter(([, a]) => a === "gateway").map(([k]) => k);
    expect(documented.sort()).toEqual(gatewayRoutes.sort());
    const statuses = (p: string, m: string) => Object.keys(d.paths[p][m].responses);
    expect(statuses("/api/gateway/v1/bundle", "get")).toEqual(expect.arrayContaining(["200", "304", "401", "404", "429", "503"]));
    expect(statuses("/api/gateway/v1/check-in", "put")).toEqual(expect.arrayContaining(["204", "401", "413", "422", "429", "503"]));
  });

  it("documents the check-in body the route accepts, and refuses what it refuses", async () => {
    const d = await doc();
    const ajv = new Ajv2020({ strict: false, allErrors: true });
    const validate = ajv.compile(d.paths["/api/gateway/v1/check-in"].put.requestBody.content["application/json"].schema);
    const good = { report: randomUUID(), release: 3, digest: "a".repeat(64), status: "running", appliedAt: "2026-12-01T10:00:00Z", pointsIn: 10, pointsOut: 2, from: "2026-12-01T10:00:00Z", to: "2026-12-01T10:01:00Z" };
    expect(validate(good), JSON.stringify(validate.errors)).toBe(true);
    expect(validate({ ...good, status: "asleep" })).toBe(false);
    expect(validate({ ...good, extra: true })).toBe(false);
    const { report: _omit, ...missing } = good;
    expect(validate(missing)).toBe(false);
  });

  it("documents the signing-key answer as the route gives it", async () => {
    const d = await doc();
    const g = await releasedGateway();
    const res = await keysRoute(await request("GET", "/api/gateway/v1/signing-key", { headers: { authorization: `Bearer ${g.token}` } }), undefined);
    const ajv = new Ajv2020({ strict: false });
    const validate = ajv.compile(d.paths["/api/gateway/v1/signing-key"].get.responses["200"].content["application/json"].schema);
    expect(validate(await res.json()), JSON.stringify(validate.errors)).toBe(true);
  });
});
