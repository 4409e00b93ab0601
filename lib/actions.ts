import "server-only";
import { authorize, type Actor } from "@/lib/auth/guard";
import { describeError, type ErrorBody } from "@/lib/http";
import type { Permission } from "@/lib/permissions";

export type ActionResult<T = null> = { ok: true; data: T } | ({ ok: false; status: number } & ErrorBody);

/**
 * Runs a server action body behind the guard and turns every failure into a result the
 * form can show (status, message and the field at fault) instead of a thrown error.
 */
export async function runAction<T>(permission: Permission, body: (actor: Actor) => Promise<T>): Promise<ActionResult<T>> {
  try {
    const actor = await authorize(permission);
    return { ok: true, data: await body(actor) };
  } catch (err) {
    const { status, body: error } = describeError(err);
    return { ok: false, status, ...error };
  }
}
