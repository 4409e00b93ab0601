import "server-only";
import { randomBytes } from "node:crypto";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { hashPassword } from "@/lib/auth/sign-in";
import { HttpError } from "@/lib/http";
import type { Role } from "@/lib/permissions";
import { User, sequelize } from "@/models";
import { createUserSchema, updateUserSchema, type CreateUserInput, type UpdateUserInput } from "@/schemas/user";
import { assertCan } from "./access";

export type UserView = { id: number; email: string; name: string; role: Role; active: boolean; createdAt: string };

export function presentUser(u: User): UserView {
  return { id: u.id, email: u.email, name: u.name, role: u.role, active: u.active, createdAt: u.createdAt.toISOString() };
}

const snapshot = (u: User) => ({ email: u.email, name: u.name, role: u.role, active: u.active });

/** A new random password: 96 bits from the CSPRNG, 16 characters, shown once. */
export function generatePassword(): string {
  return randomBytes(12).toString("base64url");
}

/** Every account, active first, by name. Admins only. */
export async function listUsers(actor: Actor | null): Promise<UserView[]> {
  assertCan(actor, "fleet.admin");
  const rows = await User.findAll({ order: [["active", "DESC"], ["name", "ASC"]] });
  return rows.map(presentUser);
}

/** Creates an account with a generated password, returned once and stored only as a bcrypt hash. */
export async function createUser(actor: Actor | null, input: CreateUserInput): Promise<{ user: UserView; password: string }> {
  assertCan(actor, "fleet.admin");
  const values = createUserSchema.parse(input);
  const password = generatePassword();
  const passwordHash = await hashPassword(password);
  const user = await sequelize.transaction(async (transaction) => {
    const created = await User.create({ ...values, passwordHash }, { transaction });
    await recordAudit(
      actor,
      { action: "user.create", entityType: "user", entityId: created.id, entityLabel: created.email, before: null, after: snapshot(created) },
      transaction,
    );
    return created;
  });
  return { user: presentUser(user), password };
}

async function findUserForUpdate(id: number, transaction: import("sequelize").Transaction) {
  const user = await User.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!user) throw new HttpError(404, `no user with id ${id}`, "id");
  return user;
}

/**
 * Changes a user's name, role or active flag. The last active admin can be neither
 * demoted nor deactivated: the admin rows are locked while this is checked, so two
 * admins demoting each other at once cannot both succeed.
 */
export async function updateUser(actor: Actor | null, id: number, input: UpdateUserInput): Promise<UserView> {
  assertCan(actor, "fleet.admin");
  const patch = updateUserSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    // Lock the active admins first, always in id order, then the target: concurrent
    // demotions queue behind each other instead of deadlocking.
    const admins =
      patch.role !== undefined || patch.active !== undefined
        ? await User.findAll({ where: { role: "admin", active: true }, order: [["id", "ASC"]], transaction, lock: transaction.LOCK.UPDATE })
        : [];
    const user = await findUserForUpdate(id, transaction);
    const before = snapshot(user);
    const after = { ...before, ...patch };
    if (JSON.stringify(before) === JSON.stringify(after)) return presentUser(user);
    const losesAdmin = before.role === "admin" && before.active && (after.role !== "admin" || !after.active);
    if (losesAdmin && admins.filter((a) => a.id !== user.id).length === 0) {
      const field = after.active ? "role" : "active";
      throw new HttpError(409, "This is the last active administrator; make another user an admin first.", field);
    }
    await user.update(patch, { transaction });
    await recordAudit(
      actor,
      { action: "user.update", entityType: "user", entityId: user.id, entityLabel: user.email, before, after: snapshot(user) },
      transaction,
    );
    return presentUser(user);
  });
}

/** Replaces a user's password with a generated one, returned once. */
export async function resetPassword(actor: Actor | null, id: number): Promise<{ user: UserView; password: string }> {
  assertCan(actor, "fleet.admin");
  const password = generatePassword();
  const passwordHash = await hashPassword(password);
  return sequelize.transaction(async (transaction) => {
    const user = await findUserForUpdate(id, transaction);
    await user.update({ passwordHash }, { transaction });
    // The audit records that the password changed, never the password or its hash.
    await recordAudit(
      actor,
      {
        action: "user.reset-password",
        entityType: "user",
        entityId: user.id,
        entityLabel: user.email,
        before: { password: "previous" },
        after: { password: "reset" },
      },
      transaction,
    );
    return { user: presentUser(user), password };
  });
}
