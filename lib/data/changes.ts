import "server-only";
import type { Transaction } from "sequelize";
import { z } from "zod";
import { diffBundles } from "@/lib/bundles/diff";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { diffConfigs } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import { CautionAcknowledgement, Change, ChangeAuthor, Site, TagGroup, User, sequelize, type ChangeReview } from "@/models";
import { TEXT_CONTROL_MESSAGE, noControlInText } from "@/schemas/text";
import { assertCan } from "./access";
import { renderReview } from "./change-review";
import { loadBaseConfig } from "./drafts";
import { loadWorkingConfig } from "./groups";
import { notifyChange } from "./notify";
import { publishRelease } from "./releases";
import { siteBySlug } from "./sites";

export const submitSchema = z.object({ note: z.string().trim().max(1000, "A note has at most 1,000 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).default("") }).strict();
export const approveSchema = z
  .object({ comment: z.string().trim().max(2000, "A comment has at most 2,000 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).default(""), acknowledge: z.string().max(64).optional() })
  .strict();
export const rejectSchema = z
  .object({ comment: z.string({ error: "Say why the change is rejected." }).trim().min(1, "Say why the change is rejected.").max(2000).refine(noControlInText, TEXT_CONTROL_MESSAGE) })
  .strict();

const OPEN = ["draft", "in_review", "approved", "rejected"] as const;

async function lockChange(site: Site, changeId: number, transaction: Transaction): Promise<Change> {
  const change = await Change.findOne({ where: { id: changeId, siteId: site.id }, transaction, lock: transaction.LOCK.UPDATE });
  if (!change) throw new HttpError(404, `no change ${changeId} at this site`, "change");
  return change;
}

async function authorIds(changeId: number, transaction?: Transaction): Promise<number[]> {
  return (await ChangeAuthor.findAll({ where: { changeId }, attributes: ["userId"], transaction })).map((a) => a.userId);
}

/**
 * Submits the site's draft for review: snapshots the configuration and renders every
 * gateway's bundle, the diff against the current release, the summary in words and the
 * impact. The submitter becomes an author. Reviewers are e-mailed.
 */
export async function submitChange(actor: Actor | null, siteSlug: string, input: unknown): Promise<{ changeId: number }> {
  assertCan(actor, "change.submit");
  return submitOpenChange(actor, siteSlug, submitSchema.parse(input).note);
}

/** Submits the open change; the caller has checked the actor may (a rollback is submitted by its reviewer). */
export async function submitOpenChange(actor: Actor, siteSlug: string, note: string): Promise<{ changeId: number }> {
  const result = await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction, true);
    const change = await Change.findOne({ where: { siteId: site.id, state: [...OPEN] }, transaction, lock: transaction.LOCK.UPDATE });
    if (!change) throw new HttpError(409, "the site has no draft change to submit", "change");
    if (change.state === "in_review" || change.state === "approved") throw new HttpError(409, `change ${change.id} is already ${change.state.replace("_", " ")}`, "change");
    const [base, working] = await Promise.all([loadBaseConfig(site.id, transaction), loadWorkingConfig(site.id, transaction)]);
    if (diffConfigs(base, working).length === 0 && change.rollbackOf === null) throw new HttpError(409, "the draft holds no edits since the current release", "change");
    await submitInto(actor, site, change, base, working, note, transaction);
    return { changeId: change.id, site };
  });
  await notifyChange("review-requested", result.site, result.changeId, actor);
  return { changeId: result.changeId };
}

async function submitInto(actor: Actor, site: Site, change: Change, base: Awaited<ReturnType<typeof loadBaseConfig>>, working: Awaited<ReturnType<typeof loadWorkingConfig>>, note: string, transaction: Transaction) {
  const review = await renderReview(actor, site, base, working, transaction);
  await change.update(
    {
      state: "in_review",
      baseRelease: site.releaseCounter === 0 ? null : site.releaseCounter,
      config: working,
      review,
      note,
      submittedBy: actor.id,
      submittedAt: new Date(),
      reviewedBy: null,
      reviewedAt: null,
      reviewComment: "",
    },
    { transaction },
  );
  const now = new Date();
  const author = await ChangeAuthor.findOne({ where: { changeId: change.id, userId: actor.id }, transaction });
  if (!author) await ChangeAuthor.create({ changeId: change.id, userId: actor.id, firstEditAt: now, lastEditAt: now }, { transaction });
  await recordAudit(
    actor,
    { action: "change.submit", entityType: "change", entityId: change.id, entityLabel: `${site.slug} change ${change.id}`, siteId: site.id, before: null, after: { note, release: review.release, gateways: review.gatewaysAffected, summary: review.summary.map((s) => s.text) } },
    transaction,
  );
}

export type ChangeView = {
  id: number;
  state: string;
  baseRelease: number | null;
  rollbackOf: number | null;
  note: string;
  authors: { id: number; name: string; email: string }[];
  submittedBy: string | null;
  submittedAt: string | null;
  reviewedBy: string | null;
  reviewedAt: string | null;
  reviewComment: string;
  review: (Omit<ChangeReview, "gateways"> & { gateways: { gateway: string; diff: ReturnType<typeof diffBundles>; unchanged: boolean }[] }) | null;
  cautionId: string;
};

const nameOf = async (id: number | null | undefined) => (id ? ((await User.findByPk(id, { attributes: ["name"] }))?.name ?? "(removed user)") : null);

/** A change with its review: per-gateway diffs, summary, impact, who did what. */
export async function getChange(actor: Actor | null, siteSlug: string, changeId: number): Promise<ChangeView> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const change = await Change.findOne({ where: { id: changeId, siteId: site.id } });
  if (!change) throw new HttpError(404, `no change ${changeId} at this site`, "change");
  const authors = await ChangeAuthor.findAll({ where: { changeId }, include: [{ model: User, as: "user", attributes: ["id", "name", "email"] }] });
  const review = change.review
    ? {
        ...change.review,
        gateways: change.review.gateways.map((g) => ({ gateway: g.gateway, diff: diffBundles(g.before, g.after), unchanged: g.before === g.after })),
      }
    : null;
  return {
    id: change.id,
    state: change.state,
    baseRelease: change.baseRelease,
    rollbackOf: change.rollbackOf ?? null,
    note: change.note,
    authors: authors.map((a) => {
      const u = (a as ChangeAuthor & { user?: User }).user;
      return { id: a.userId, name: u?.name ?? "", email: u?.email ?? "" };
    }),
    submittedBy: await nameOf(change.submittedBy),
    submittedAt: change.submittedAt?.toISOString() ?? null,
    reviewedBy: await nameOf(change.reviewedBy),
    reviewedAt: change.reviewedAt?.toISOString() ?? null,
    reviewComment: change.reviewComment,
    review,
    cautionId: REGULATED_RECORD_CAUTION.id,
  };
}

/** The site's changes, newest first (without their reviews). */
export async function listChanges(actor: Actor | null, siteSlug: string) {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const rows = await Change.findAll({ where: { siteId: site.id }, attributes: { exclude: ["config", "review"] }, order: [["id", "DESC"]], limit: 100 });
  return rows.map((c) => ({ id: c.id, state: c.state, note: c.note, rollbackOf: c.rollbackOf ?? null, submittedAt: c.submittedAt?.toISOString() ?? null, updatedAt: c.updatedAt.toISOString() }));
}

/**
 * Approves a change in review. Four-eyes: no author may approve. When the change touches
 * a regulated-record group the reviewer acknowledges the caution again (stored per group).
 */
export async function approveChange(actor: Actor | null, siteSlug: string, changeId: number, input: unknown): Promise<{ state: string }> {
  assertCan(actor, "change.review");
  const { comment, acknowledge } = approveSchema.parse(input);
  const site = await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    const change = await lockChange(site, changeId, transaction);
    if (change.state !== "in_review") throw new HttpError(409, `change ${change.id} is ${change.state.replace("_", " ")}, not in review`, "change");
    if ((await authorIds(change.id, transaction)).includes(actor.id)) {
      throw new HttpError(403, "you contributed to this change; another reviewer must approve it (four-eyes rule)", "change");
    }
    const regulated = change.review?.regulatedTouched ?? [];
    if (regulated.length > 0) {
      if (acknowledge !== REGULATED_RECORD_CAUTION.id) {
        throw new HttpError(422, `the change touches regulated-record groups (${regulated.join(", ")}): acknowledge the caution "${REGULATED_RECORD_CAUTION.title}" to approve`, "acknowledge");
      }
      const groups = await TagGroup.findAll({ where: { siteId: site.id, name: regulated }, attributes: ["id", "name"], transaction });
      const idOf = new Map(groups.map((g) => [g.name, g.id]));
      const now = new Date();
      await CautionAcknowledgement.bulkCreate(
        regulated.map((name) => ({
          siteId: site.id,
          groupId: idOf.get(name) ?? null,
          groupName: name,
          profileRevisionId: change.config?.groups.find((g) => g.name === name)?.assignment?.revisionId ?? null,
          cautionId: REGULATED_RECORD_CAUTION.id,
          cautionText: REGULATED_RECORD_CAUTION.text,
          userId: actor.id,
          userEmail: actor.email,
          acknowledgedAt: now,
          changeId: change.id,
        })),
        { transaction },
      );
    }
    await change.update({ state: "approved", reviewedBy: actor.id, reviewedAt: new Date(), reviewComment: comment }, { transaction });
    await recordAudit(actor, { action: "change.approve", entityType: "change", entityId: change.id, entityLabel: `${site.slug} change ${change.id}`, siteId: site.id, before: { state: "in_review" }, after: { state: "approved", comment, acknowledged: regulated } }, transaction);
    return site;
  });
  await notifyChange("approved", site, changeId, actor, comment);
  return { state: "approved" };
}

/** Rejects a change in review with a comment; its authors are e-mailed and it is editable again. */
export async function rejectChange(actor: Actor | null, siteSlug: string, changeId: number, input: unknown): Promise<{ state: string }> {
  assertCan(actor, "change.review");
  const { comment } = rejectSchema.parse(input);
  const site = await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    const change = await lockChange(site, changeId, transaction);
    if (change.state !== "in_review" && change.state !== "approved") throw new HttpError(409, `change ${change.id} is ${change.state.replace("_", " ")}; only a change in review or approved can be rejected`, "change");
    if ((await authorIds(change.id, transaction)).includes(actor.id)) throw new HttpError(403, "you contributed to this change; another reviewer decides on it", "change");
    await change.update({ state: "rejected", reviewedBy: actor.id, reviewedAt: new Date(), reviewComment: comment }, { transaction });
    await recordAudit(actor, { action: "change.reject", entityType: "change", entityId: change.id, entityLabel: `${site.slug} change ${change.id}`, siteId: site.id, before: { state: change.previous("state") }, after: { state: "rejected", comment } }, transaction);
    return site;
  });
  await notifyChange("rejected", site, changeId, actor, comment);
  return { state: "rejected" };
}

/**
 * Releases an approved change in one transaction: compare-and-set on the base release
 * (a change whose base is no longer current goes back to draft and must be submitted and
 * approved again), the next number under the site's row lock, signed bundles stored.
 */
export async function releaseChange(actor: Actor | null, siteSlug: string, changeId: number): Promise<{ release: number }> {
  assertCan(actor, "change.review");
  let stale: string | null = null;
  const result = await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction, true);
    const change = await lockChange(site, changeId, transaction);
    if (change.state !== "approved") throw new HttpError(409, `change ${change.id} is ${change.state.replace("_", " ")}; only an approved change is released`, "change");
    const current = site.releaseCounter === 0 ? null : site.releaseCounter;
    if (change.baseRelease !== current) {
      await change.update({ state: "draft" }, { transaction });
      stale = `release ${current} was published after this change was reviewed against ${change.baseRelease === null ? "no release" : `release ${change.baseRelease}`}; submit it again for review`;
      return null;
    }
    const release = await publishRelease(site, change.config!, { changeId: change.id, actor, note: change.note, rollbackOf: change.rollbackOf ?? null }, transaction);
    await change.update({ state: "released" }, { transaction });
    await recordAudit(actor, { action: "release.publish", entityType: "release", entityId: release.id, entityLabel: `${site.slug} release ${release.number}`, siteId: site.id, before: { release: current }, after: { release: release.number, change: change.id } }, transaction);
    return { site, release: release.number, rollbackOf: change.rollbackOf ?? null };
  });
  if (result === null) throw new HttpError(409, stale!, "change");
  await notifyChange(result.rollbackOf ? "rolled-back" : "released", result.site, changeId, actor, undefined, result.release);
  return { release: result.release };
}

export const rollbackSchema = z.object({
  release: z.number({ error: "Choose the release to go back to." }).int().positive("Choose the release to go back to."),
  note: z.string().trim().max(1000).refine(noControlInText, TEXT_CONTROL_MESSAGE).default(""),
});
export const urgentSchema = z.object({
  release: z.number({ error: "Choose the release to go back to." }).int().positive("Choose the release to go back to."),
  // Stored as the change's note (at most 1,000 characters) and, prefixed, as its review comment.
  reason: z
    .string({ error: "Write why this cannot wait for a second reviewer." })
    .trim()
    .min(10, "Write why this cannot wait for a second reviewer (at least 10 characters).")
    .max(1000, "A reason has at most 1,000 characters.")
    .refine(noControlInText, TEXT_CONTROL_MESSAGE),
});

