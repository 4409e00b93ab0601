// Ids in the URL (path and query parameters) of the reading routes: a malformed one is
// refused with 422 naming the same field as the record's 404, never the body (the write
// routes get the same check from the hostile-input suite's path-parameter cases).
import { beforeAll, describe, expect, it } from "vitest";
import { GET as profileRoute } from "@/app/api/profiles/[profileId]/route";
import { GET as exportRoute } from "@/app/api/profiles/[profileId]/export/route";
import { GET as revisionRoute } from "@/app/api/profiles/[profileId]/revisions/[revision]/route";
import { GET as diffRoute } from "@/app/api/profiles/[profileId]/diff/route";
import { GET as sampleSetRoute } from "@/app/api/sample-sets/[sampleSetId]/route";
import { GET as sampleDataRoute } from "@/app/api/sample-sets/[sampleSetId]/data/route";
import { GET as changeRoute } from "@/app/api/sites/[site]/changes/[changeId]/route";
import { GET as bundleRoute } from "@/app/api/sites/[site]/releases/[number]/bundles/[gateway]/route";
import { GET as groupRoute } from "@/app/api/sites/[site]/groups/[groupId]/route";
import { GET as assignmentRoute } from "@/app/api/sites/[site]/groups/[groupId]/assignment/route";
import { GET as samplesRoute } from "@/app/api/sites/[site]/groups/[groupId]/samples/route";
import type { User } from "@/models";
import { createGateway, createSite, createUser, ctx, request } from "../factories";

type Handler = (req: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;

let user: User;
let site: string;
let gateway: string;

beforeAll(async () => {
  user = await createUser({ role: "engineer" });
  const s = await createSite();
  site = s.slug;
  gateway = (await createGateway(s)).slug;
});

const BAD = ["abc", "0", "-3", "1.5", "1e400", "9007199254740993", "%00", " "];

async function refusal(handler: Handler, path: string, params: Record<string, string>) {
  const res = await handler(await request("GET", path, { user }), ctx(params) as { params: Promise<Record<string, string>> });
  return { status: res.status, body: (await res.json()) as { error: string; field?: string } };
}

describe("a malformed id in the URL names its field", () => {
  const cases: [string, Handler, (bad: string) => [string, Record<string, string>], string][] = [
    ["GET /api/profiles/[profileId]", profileRoute as Handler, (b) => ["/", { profileId: b }], "profile"],
    ["GET /api/profiles/[profileId]/export", exportRoute as Handler, (b) => ["/", { profileId: b }], "profile"],
    ["GET /api/profiles/[profileId]/export?revision=", exportRoute as Handler, (b) => [`/?revision=${encodeURIComponent(b)}`, { profileId: "1" }], "revision"],
    ["GET /api/profiles/[profileId]/revisions/[revision] (profile)", revisionRoute as Handler, (b) => ["/", { profileId: b, revision: "1" }], "profile"],
    ["GET /api/profiles/[profileId]/revisions/[revision] (revision)", revisionRoute as Handler, (b) => ["/", { profileId: "1", revision: b }], "revision"],
    ["GET /api/profiles/[profileId]/diff", diffRoute as Handler, (b) => ["/?from=1&to=2", { profileId: b }], "profile"],
    ["GET /api/sample-sets/[sampleSetId]", sampleSetRoute as Handler, (b) => ["/", { sampleSetId: b }], "sampleSet"],
    ["GET /api/sample-sets/[sampleSetId]/data", sampleDataRoute as Handler, (b) => ["/", { sampleSetId: b }], "sampleSet"],
    ["GET /api/sites/[site]/changes/[changeId]", changeRoute as Handler, (b) => ["/", { site, changeId: b }], "change"],
    ["GET /api/sites/[site]/releases/[number]/bundles/[gateway]", bundleRoute as Handler, (b) => ["/", { site, number: b, gateway }], "release"],
    ["GET /api/sites/[site]/groups/[groupId]", groupRoute as Handler, (b) => ["/", { site, groupId: b }], "group"],
    ["GET /api/sites/[site]/groups/[groupId]/assignment", assignmentRoute as Handler, (b) => ["/", { site, groupId: b }], "group"],
    ["GET /api/sites/[site]/groups/[groupId]/samples", samplesRoute as Handler, (b) => ["/", { site, groupId: b }], "group"],
  ];
  for (const [name, handler, build, field] of cases) {
    it(`${name}: 422 naming "${field}"`, async () => {
      for (const bad of BAD) {
        const [path, params] = build(bad);
        const { status, body } = await refusal(handler, path, params);
        expect(status, `${name} with ${JSON.stringify(bad)}`).toBe(422);
        expect(body.field, `${name} with ${JSON.stringify(bad)}`).toBe(field);
        expect(body.error).toMatch(new RegExp(`^${field}: `));
      }
      // A well-formed id of no record is a 404 that names the same field (where the other
      // ids in the URL are of real records: not for a revision of profile 1).
      if (name.includes("revision")) return;
      const [path, params] = build("987654321");
      const missing = await refusal(handler, path, params);
      expect(missing.status).toBe(404);
      expect(missing.body.field).toBe(field);
    });
  }
});
