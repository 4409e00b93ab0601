import "server-only";
import type { Transaction } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { AuditEvent, type AuditSnapshot } from "@/models/audit-event";

export type AuditEntry = {
  action: string;
  entityType: string;
  entityId: number | null;
  entityLabel: string;
  siteId?: number | null;
  before: AuditSnapshot;
  after: AuditSnapshot;
};

/**
 * A program writing without a signed-in person, such as the command line (scripts/cli.ts).
 * It is always passed explicitly: a null actor stays "signed out" (401) everywhere.
 */
export type SystemActor = { readonly system: "cli" };

/** The command line: audited as "(cli)" with no user id. */
export const CLI_ACTOR: SystemActor = Object.freeze({ system: "cli" });

export function isSystemActor(actor: Actor | SystemActor): actor is SystemActor {
  return "system" in actor;
}

/** Records one write in the audit log, inside the write's own transaction. */
export async function recordAudit(actor: Actor | SystemActor, entry: AuditEntry, transaction: Transaction): Promise<void> {
  await AuditEvent.create(
    {
      actorId: isSystemActor(actor) ? null : actor.id,
      actorEmail: isSystemActor(actor) ? `(${actor.system})` : actor.email,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId,
      entityLabel: entry.entityLabel,
      siteId: entry.siteId ?? null,
      beforeJson: entry.before,
      afterJson: entry.after,
    },
    { transaction },
  );
}
