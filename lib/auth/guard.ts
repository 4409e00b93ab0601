import "server-only";
import type { NextRequest } from "next/server";
import { cache } from "react";
import { HttpError } from "@/lib/http";
import { can, type Permission, type Role } from "@/lib/permissions";
import { User } from "@/models";
import { sessionUserId } from "./session";

export type Actor = { id: number; email: string; name: string; role: Role };

/**
 * The signed-in user as the database has them now (one primary-key read per request),
 * so a role change or a deactivation takes effect on the next request.
 */
export async function currentActor(req?: Request): Promise<Actor | null> {
  if (!req) return sessionActor();
  const jar = "cookies" in req ? (req as NextRequest).cookies : cookieJarOf(req);
  return actorById(await sessionUserId(jar));
}

// Server components of one request (layout and page) share one read; outside a render, no caching.
const sessionActor = cache(async () => actorById(await sessionUserId()));

async function actorById(id: number | null): Promise<Actor | null> {
  if (id === null) return null;
  const user = await User.findByPk(id, { attributes: ["id", "email", "name", "role", "active"] });
  if (!user || !user.active) return null;
  return { id: user.id, email: user.email, name: user.name, role: user.role };
}

/** The one server-side guard: 401 when signed out, 403 when the role lacks the permission. */
export async function authorize(permission: Permission, req?: Request): Promise<Actor> {
  const actor = await currentActor(req);
  if (!actor) throw new HttpError(401, "sign in first");
  if (!can(actor.role, permission)) throw new HttpError(403, `the ${actor.role} role may not do this`);
  return actor;
}

function cookieJarOf(req: Request) {
  const header = req.headers.get("cookie") ?? "";
  const map = new Map<string, string>();
  for (const part of header.split(";")) {
    const eq = part.indexOf("=");
    if (eq > 0) map.set(part.slice(0, eq).trim(), decodeURIComponent(part.slice(eq + 1).trim()));
  }
  return { get: (name: string) => (map.has(name) ? { value: map.get(name)! } : undefined) };
}
