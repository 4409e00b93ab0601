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

/** Records one write in the audit log, inside the write's own transaction. */
export async function recordAudit(actor: Actor, entry: AuditEntry, transaction: Transaction): Promise<void> {
  await AuditEvent.create(
    {
      actorId: actor.id,
      actorEmail: actor.email,
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
