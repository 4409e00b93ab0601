import "server-only";
import type { Transaction } from "sequelize";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { diffConfigs } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import { Change, Release, Site, sequelize } from "@/models";
import { assertCan } from "./access";
import { rollbackSchema, submitOpenChange, urgentSchema } from "./changes";
import { restoreConfig } from "./draft-discard";
import { loadBaseConfig, touchDraft } from "./drafts";
import { loadWorkingConfig } from "./groups";
import { notifyChange } from "./notify";
import { publishRelease } from "./releases";
import { siteBySlug } from "./sites";

/** Checks the target and the open change, then makes the working configuration the target's. */
async function prepare(actor: Actor, site: Site, number: number, transaction: Transaction): Promise<{ target: Release; change: Change }> {
  const target = await Release.findOne({ where: { siteId: site.id, number }, transaction });
  if (!target) throw new HttpError(404, `the site has no release ${number}`, "release");
  if (number === site.releaseCounter) throw new HttpError(422, `release ${number} is the current release; choose an earlier one`, "release");
  const open = await Change.findOne({ where: { siteId: site.id, state: ["draft", "in_review", "approved", "rejected"] }, transaction, lock: transaction.LOCK.UPDATE });
  const [base, working] = await Promise.all([loadBaseConfig(site.id, transaction), loadWorkingConfig(site.id, transaction)]);
  if (open && (open.state !== "draft" || diffConfigs(base, working).length > 0)) {
    throw new HttpError(409, `change ${open.id} is open at this site (${open.state.replace("_", " ")}); release, reject or discard it before rolling back`, "change");
  }
  if (diffConfigs(target.config, base).length === 0) throw new HttpError(422, `release ${number}'s configuration equals the current release's`, "release");
  await restoreConfig(site, target.config, actor, transaction);
  const change = await touchDraft(actor, site.id, transaction);
  await change.update({ rollbackOf: number }, { transaction });
  return { target, change };
}

/**
 * A change restoring an earlier release's configuration (groups, assignments with their
 * pinned revisions) against today's inventory, submitted for review like any change.
 */
export async function startRollback(actor: Actor | null, siteSlug: string, input: unknown): Promise<{ changeId: number }> {
  assertCan(actor, "change.review");
  const { release, note } = rollbackSchema.parse(input);
  await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction, true);
    await prepare(actor, site, release, transaction);
  });
  return submitOpenChange(actor, siteSlug, note || `Roll back to release ${release}`);
}

/**
 * The urgent path: a reviewer or admin releases a rollback alone with a written reason.
 * The release is flagged in the history and every reviewer is e-mailed.
 */
export async function urgentRollback(actor: Actor | null, siteSlug: string, input: unknown): Promise<{ release: number; changeId: number }> {
  assertCan(actor, "change.review");
  const { release: number, reason } = urgentSchema.parse(input);
  const result = await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction, true);
    const previous = site.releaseCounter;
    const { target, change } = await prepare(actor, site, number, transaction);
    const release = await publishRelease(site, target.config, { changeId: change.id, actor, note: `Urgent rollback to release ${number}`, rollbackOf: number, urgentReason: reason }, transaction);
    const now = new Date();
    await change.update(
      { state: "released", baseRelease: previous, config: target.config, note: reason, submittedBy: actor.id, submittedAt: now, reviewedBy: actor.id, reviewedAt: now, reviewComment: `Urgent: ${reason}` },
      { transaction },
    );
    await recordAudit(
      actor,
      { action: "release.urgent-rollback", entityType: "release", entityId: release.id, entityLabel: `${site.slug} release ${release.number}`, siteId: site.id, before: { release: previous }, after: { release: release.number, rollbackOf: number, reason } },
      transaction,
    );
    return { site, release: release.number, changeId: change.id };
  });
  await notifyChange("rolled-back", result.site, result.changeId, actor, reason, result.release, true);
  return { release: result.release, changeId: result.changeId };
}
