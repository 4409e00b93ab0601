import "server-only";
import { Op, type Transaction } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { diffConfigs, type DraftEdit, type SiteConfig } from "@/lib/config/site-config";
import { Change, ChangeAuthor, Release, Site, User } from "@/models";
import { assertCan } from "./access";
import { loadWorkingConfig } from "./groups";
import { siteBySlug } from "./sites";

/**
 * The site's open change, created on the first edit and locked for the rest of the
 * transaction; the editor becomes one of its authors. An edit to a change that is in
 * review or approved sends it back to draft: what was reviewed is no longer what is there.
 */
export async function touchDraft(actor: Actor, siteId: number, transaction: Transaction): Promise<Change> {
  // The site row serialises edits per site, so two first edits cannot both open a change.
  await Site.findByPk(siteId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ["id"] });
  let change = await Change.findOne({ where: { siteId, state: { [Op.ne]: "released" } }, transaction, lock: transaction.LOCK.UPDATE });
  if (!change) {
    change = await Change.create({ siteId, baseRelease: await currentReleaseNumber(siteId, transaction), createdBy: actor.id }, { transaction });
  } else if (change.state !== "draft") {
    await change.update({ state: "draft" }, { transaction });
  } else {
    change.changed("updatedAt", true);
    await change.save({ transaction });
  }
  const now = new Date();
  const author = await ChangeAuthor.findOne({ where: { changeId: change.id, userId: actor.id }, transaction });
  if (author) await author.update({ lastEditAt: now }, { transaction });
  else await ChangeAuthor.create({ changeId: change.id, userId: actor.id, firstEditAt: now, lastEditAt: now }, { transaction });
  return change;
}

/** The number of the site's current release; null until the site has one. */
export async function currentReleaseNumber(siteId: number, transaction?: Transaction): Promise<number | null> {
  const latest = await Release.findOne({ where: { siteId }, order: [["number", "DESC"]], attributes: ["number"], transaction });
  return latest?.number ?? null;
}

/** The configuration of the site's current release (empty before the first release). */
export async function loadBaseConfig(siteId: number, transaction?: Transaction): Promise<SiteConfig> {
  const latest = await Release.findOne({ where: { siteId }, order: [["number", "DESC"]], attributes: ["config"], transaction });
  return latest?.config ?? { groups: [] };
}

export type DraftSummary = {
  changeId: number | null;
  state: string;
  baseRelease: number | null;
  authors: { name: string; email: string }[];
  edits: DraftEdit[];
};

/** What the site's open change holds: its authors and its edits against the current release. */
export async function draftSummary(actor: Actor | null, siteSlug: string): Promise<DraftSummary> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const change = await Change.findOne({
    where: { siteId: site.id, state: { [Op.ne]: "released" } },
    include: [{ model: ChangeAuthor, as: "authors", include: [{ model: User, as: "user", attributes: ["name", "email"] }] }],
  });
  const edits = diffConfigs(await loadBaseConfig(site.id), await loadWorkingConfig(site.id));
  const authors = ((change as unknown as { authors?: (ChangeAuthor & { user?: User })[] })?.authors ?? [])
    .sort((a, b) => a.firstEditAt.getTime() - b.firstEditAt.getTime())
    .map((a) => ({ name: a.user?.name ?? "", email: a.user?.email ?? "" }));
  const baseRelease = change ? change.baseRelease : await currentReleaseNumber(site.id);
  return { changeId: change?.id ?? null, state: change?.state ?? "none", baseRelease, authors, edits };
}
