import "server-only";
import type { Actor } from "@/lib/auth/guard";
import type { Role } from "@/lib/permissions";
import { User } from "@/models";
import { assertCan } from "./access";

export type UserView = { id: number; email: string; name: string; role: Role; active: boolean; createdAt: string };

export function presentUser(u: User): UserView {
  return { id: u.id, email: u.email, name: u.name, role: u.role, active: u.active, createdAt: u.createdAt.toISOString() };
}

/** Every account, active first, by name. Admins only. */
export async function listUsers(actor: Actor | null): Promise<UserView[]> {
  assertCan(actor, "fleet.admin");
  const rows = await User.findAll({ order: [["active", "DESC"], ["name", "ASC"]] });
  return rows.map(presentUser);
}
