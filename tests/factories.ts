import { randomUUID } from "node:crypto";
import { encode } from "next-auth/jwt";
import { NextRequest } from "next/server";
import bcrypt from "bcryptjs";
import type { Role } from "@/lib/permissions";
import type { Profile } from "@/lib/reduction/profile";
import { Assignment, Gateway, GatewayToken, ProfileRevision, ReductionProfile, SampleSet, Site, Tag, TagGroup, TagGroupRule, User } from "@/models";
import { setSessionCookie } from "./integration/cookie-jar";

const unique = () => randomUUID().slice(0, 8);

// bcrypt at cost 4 keeps factories fast; the app itself hashes at cost 12.
export async function createUser(over: Partial<{ role: Role; active: boolean; email: string; name: string; password: string }> = {}) {
  const id = unique();
  return User.create({
    email: over.email ?? `user-${id}@test.invalid`,
    name: over.name ?? `Test user ${id}`,
    role: over.role ?? "viewer",
    active: over.active ?? true,
    passwordHash: await bcrypt.hash(over.password ?? "correct horse", 4),
  });
}

export async function createSite(over: Partial<{ slug: string; name: string; timeZone: string }> = {}) {
  const id = unique();
  return Site.create({
    slug: over.slug ?? `site-${id}`,
    name: over.name ?? `Test site ${id}`,
    timeZone: over.timeZone ?? "Europe/London",
    uplinkBudgetKbps: 256,
    storagePricePerGbMonth: 0.02,
    retentionMonths: 12,
  });
}

export async function createGateway(site: Site, over: Partial<{ slug: string; name: string }> = {}) {
  const id = unique();
  return Gateway.create({ siteId: site.id, slug: over.slug ?? `gw-${id}`, name: over.name ?? `Gateway ${id}` });
}

/** A live gateway token, created directly (no audit); the token is returned since only its hash is stored. */
export async function createGatewayToken(gateway: Gateway, over: Partial<{ label: string; revoked: boolean }> = {}) {
  const { generateToken } = await import("@/lib/gateway/token");
  const { token, hash, prefix } = generateToken();
  const row = await GatewayToken.create({
    gatewayId: gateway.id,
    tokenHash: hash,
    prefix,
    label: over.label ?? "",
    createdBy: null,
    revokedAt: over.revoked ? new Date() : null,
  });
  return { id: row.id, token, row };
}

export async function createTag(site: Site, gateway: Gateway, over: Partial<{ name: string; unit: string; kind: "analog" | "discrete" | "counter"; area: string | null }> = {}) {
  return Tag.create({
    siteId: site.id,
    gatewayId: gateway.id,
    name: over.name ?? `AREA/TT-${unique()}/PV`,
    unit: over.unit ?? "degC",
    samplePeriodMs: 1000,
    kind: over.kind ?? "analog",
    euLow: (over.kind ?? "analog") === "analog" ? 0 : null,
    euHigh: (over.kind ?? "analog") === "analog" ? 150 : null,
    area: over.area === undefined ? "AREA" : over.area,
    equipment: null,
  });
}

/** A tag group with name-pattern rules, created directly (no draft bookkeeping). */
export async function createGroup(site: Site, over: Partial<{ name: string; priority: number; patterns: string[] }> = {}) {
  const group = await TagGroup.create({
    siteId: site.id,
    name: over.name ?? `group-${unique()}`,
    priority: over.priority ?? 10,
  });
  const patterns = over.patterns ?? ["AREA/*/PV"];
  await TagGroupRule.bulkCreate(patterns.map((value, position) => ({ groupId: group.id, position, field: "pattern" as const, value })));
  return group;
}

/** A shape profile document for analog temperatures (swinging door, 0.5 degC). */
export function profileDocument(over: Partial<Profile> = {}): Profile {
  return {
    name: over.name ?? `Profile ${unique()}`,
    kinds: over.kinds ?? ["analog"],
    ...(over.description !== undefined ? { description: over.description } : {}),
    outputs: over.outputs ?? [
      {
        name: "shape",
        steps: [
          { method: "quality-filter", keep: "good" },
          { method: "swinging-door", deviation: { value: 0.5, unit: "degC" }, "max-interval": 600 },
        ],
      },
    ],
  };
}

/** A profile with its first revision, created directly (no audit). */
export async function createProfile(over: Partial<Profile> = {}) {
  const document = profileDocument(over);
  const profile = await ReductionProfile.create({ name: document.name, description: document.description ?? "", kinds: document.kinds.join(","), latestRevision: 1, createdBy: null });
  const revision = await ProfileRevision.create({ profileId: profile.id, number: 1, document, note: "factory", createdBy: null });
  return { profile, revision };
}

/** Pins a revision to a group, created directly (no draft bookkeeping). */
export async function createAssignment(group: TagGroup, revision: ProfileRevision) {
  return Assignment.create({ groupId: group.id, profileRevisionId: revision.id, overrides: [], updatedBy: null });
}

/** A small saved sample set for a tag of the site, created directly (no audit). */
export async function createSampleSet(site: Site, tag: Tag) {
  const { packSeries } = await import("@/lib/samples/storage");
  const t = Float64Array.from({ length: 50 }, (_, i) => 1_790_000_000_000 + i * 1000);
  const v = Float64Array.from({ length: 50 }, (_, i) => Math.sin(i / 5));
  const { encoding, data } = packSeries({ t, v });
  const group = await createGroup(site);
  return SampleSet.create({
    siteId: site.id,
    groupId: group.id,
    name: `set ${unique()}`,
    tagName: tag.name,
    kind: tag.kind,
    unit: tag.unit,
    euLow: tag.euLow,
    euHigh: tag.euHigh,
    samplePeriodMs: tag.samplePeriodMs,
    samples: 50,
    firstAt: new Date(t[0]),
    lastAt: new Date(t[49]),
    encoding,
    data,
    byteSize: data.length,
    createdBy: null,
  });
}

/** A real next-auth session cookie for the user, signed with the app's secret. */
export async function sessionCookie(user: User | null): Promise<string | null> {
  if (!user) return null;
  const value = await encode({ token: { sub: String(user.id), email: user.email }, secret: process.env.NEXTAUTH_SECRET! });
  return `next-auth.session-token=${value}`;
}

/** Makes server actions in this test run as the user (null = signed out). */
export async function actAs(user: User | null) {
  const c = await sessionCookie(user);
  setSessionCookie(c ? { name: "next-auth.session-token", value: c.split("=").slice(1).join("=") } : null);
}

/** A request to a route handler, as the user (null = signed out). */
export async function request(
  method: string,
  path: string,
  opts: { user?: User | null; body?: unknown; rawBody?: string; binaryBody?: ArrayBuffer; cookie?: string; headers?: Record<string, string> } = {},
) {
  const headers = new Headers(opts.headers);
  const c = await sessionCookie(opts.user ?? null);
  if (c ?? opts.cookie) headers.set("cookie", (c ?? opts.cookie)!);
  let body: string | ArrayBuffer | undefined;
  if (opts.binaryBody !== undefined) body = opts.binaryBody;
  else if (opts.rawBody !== undefined) body = opts.rawBody;
  else if (opts.body !== undefined) body = JSON.stringify(opts.body);
  if (body !== undefined) headers.set("content-type", opts.binaryBody !== undefined ? "application/octet-stream" : "application/json");
  return new NextRequest(new URL(path, "http://127.0.0.1"), { method, headers, body });
}

/** Route context with already-resolved params, as Next passes them. */
export const ctx = <P extends Record<string, string>>(params: P) => ({ params: Promise.resolve(params) });
