import "server-only";
import type { Transaction } from "sequelize";
import { z } from "zod";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { describeEdit, diffConfigs, type AssignmentConfig, type DraftEdit, type GroupConfig, type SiteConfig } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import { Assignment, Change, ProfileRevision, Site, Tag, TagGroup, sequelize } from "@/models";
import { assertCan } from "./access";
import { writeAssignment } from "./assignments";
import { loadBaseConfig } from "./drafts";
import { loadWorkingConfig, writeRules } from "./groups";
import { siteBySlug } from "./sites";

export const discardSchema = z.union([
  z.object({ all: z.literal(true, { error: "all must be true" }) }).strict(),
  z.object({ edits: z.array(z.string().min(1).max(200)).min(1, "Choose at least one edit to discard.").max(1000) }).strict(),
]);

const ORDER: DraftEdit["kind"][] = ["group-added", "group-removed", "group-changed", "assignment-set", "overrides-changed", "groups-reordered"];

/**
 * Discards edits of the site's draft change, one by one or all: each edit is undone by
 * restoring what the current release holds (before the first release: nothing). When no
 * edit is left, the change is closed. Runs in one transaction with the site row locked.
 */
export async function discardEdits(actor: Actor | null, siteSlug: string, input: unknown): Promise<{ discarded: string[]; remaining: number }> {
  assertCan(actor, "config.edit");
  const request = discardSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction, true);
    const change = await Change.findOne({ where: { siteId: site.id, state: ["draft", "in_review", "approved", "rejected"] }, transaction, lock: transaction.LOCK.UPDATE });
    if (!change) throw new HttpError(404, "the site has no draft change", "change");
    const base = await loadBaseConfig(site.id, transaction);
    const edits = diffConfigs(base, await loadWorkingConfig(site.id, transaction));
    let chosen = edits;
    if ("edits" in request) {
      const known = new Set(edits.map((e) => e.key));
      const missing = request.edits.find((k) => !known.has(k));
      if (missing !== undefined) throw new HttpError(422, `the draft holds no edit "${missing}" (it may have been discarded already); reload`, "edits");
      chosen = edits.filter((e) => request.edits.includes(e.key));
    }
    chosen = [...chosen].sort((a, b) => ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind));
    const baseGroups = new Map(base.groups.map((g) => [g.name, g]));
    for (const edit of chosen) await undo(edit, site, baseGroups, actor, transaction);
    // Restoring removed groups can disturb the order: discarding everything restores it too.
    if ("all" in request) await undo({ key: "groups-reordered", kind: "groups-reordered", from: [], to: [] }, site, baseGroups, actor, transaction);
    const remaining = diffConfigs(base, await loadWorkingConfig(site.id, transaction)).length;
    if (remaining === 0) await change.destroy({ transaction });
    else if (change.state !== "draft") await change.update({ state: "draft" }, { transaction });
    await recordAudit(
      actor,
      {
        action: "draft.discard",
        entityType: "change",
        entityId: change.id,
        entityLabel: `${site.slug} draft`,
        siteId: site.id,
        before: { edits: chosen.map(describeEdit) },
        after: { remaining },
      },
      transaction,
    );
    return { discarded: chosen.map((e) => e.key), remaining };
  });
}

async function groupByName(site: Site, name: string, transaction: Transaction): Promise<TagGroup> {
  const g = await TagGroup.findOne({ where: { siteId: site.id, name }, transaction, lock: transaction.LOCK.UPDATE });
  if (!g) throw new HttpError(409, `group "${name}" changed meanwhile; reload`, "edits");
  return g;
}

/**
 * Makes the site's working configuration equal to `target` (a release's snapshot):
 * every edit between them is undone, then the target's priorities restored. Used by
 * rollbacks; runs inside the caller's transaction.
 */
export async function restoreConfig(site: Site, target: SiteConfig, actor: Actor, transaction: Transaction): Promise<void> {
  const edits = diffConfigs(target, await loadWorkingConfig(site.id, transaction)).sort((a, b) => ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind));
  const groups = new Map(target.groups.map((g) => [g.name, g]));
  for (const edit of edits) await undo(edit, site, groups, actor, transaction);
  await undo({ key: "groups-reordered", kind: "groups-reordered", from: [], to: [] }, site, groups, actor, transaction);
}

async function undo(edit: DraftEdit, site: Site, base: Map<string, GroupConfig>, actor: Actor, transaction: Transaction): Promise<void> {
  switch (edit.kind) {
    case "group-added":
      await (await groupByName(site, edit.group, transaction)).destroy({ transaction });
      return;
    case "group-removed": {
      const b = base.get(edit.group)!;
      const g = await TagGroup.create({ siteId: site.id, name: b.name, description: b.description, regulated: b.regulated, priority: b.priority }, { transaction });
      await writeRules(g.id, b.selector, transaction);
      await restoreAssignment(g.id, site, b.assignment, actor, transaction);
      return;
    }
    case "group-changed": {
      const b = base.get(edit.group)!;
      const g = await groupByName(site, edit.group, transaction);
      await g.update({ description: b.description, regulated: b.regulated }, { transaction });
      await writeRules(g.id, b.selector, transaction);
      return;
    }
    case "assignment-set":
    case "overrides-changed": {
      const g = await groupByName(site, edit.group, transaction);
      await restoreAssignment(g.id, site, base.get(edit.group)!.assignment, actor, transaction);
      return;
    }
    case "groups-reordered":
      for (const b of base.values()) await TagGroup.update({ priority: b.priority }, { where: { siteId: site.id, name: b.name }, transaction });
      return;
  }
}

async function restoreAssignment(groupId: number, site: Site, a: AssignmentConfig | null, actor: Actor, transaction: Transaction): Promise<void> {
  if (a === null) {
    await Assignment.destroy({ where: { groupId }, transaction });
    return;
  }
  if (!(await ProfileRevision.findByPk(a.revisionId, { transaction, attributes: ["id"] }))) {
    throw new HttpError(409, `profile "${a.profile}" revision ${a.revision} no longer exists`, "edits");
  }
  const names = a.tags.map((t) => t.tag);
  const tags = names.length ? await Tag.findAll({ where: { siteId: site.id, name: names }, attributes: ["id", "name"], transaction }) : [];
  const idOf = new Map(tags.map((t) => [t.name, t.id]));
  const tagOverrides = a.tags.filter((t) => idOf.has(t.tag)).map((t) => ({ tagId: idOf.get(t.tag)!, overrides: t.overrides }));
  await writeAssignment(groupId, a.revisionId, a.overrides, tagOverrides, actor.id, transaction);
}
