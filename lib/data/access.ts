import "server-only";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { can, type Permission } from "@/lib/permissions";

/** Data-layer check: every lib/data function calls this itself, so no caller can forget. */
export function assertCan(actor: Actor | null, permission: Permission): asserts actor is Actor {
  if (!actor) throw new HttpError(401, "sign in first");
  if (!can(actor.role, permission)) throw new HttpError(403, `the ${actor.role} role may not do this`);
}
