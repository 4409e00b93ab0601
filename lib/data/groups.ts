import "server-only";
import type { Transaction } from "sequelize";
import { z } from "zod";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { rulesToSelector, selectorToRules } from "@/lib/config/group-rules";
import type { GroupConfig, SiteConfig } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import { assignGroups, previewSelector } from "@/lib/tags/selector";
import { TagGroup, TagGroupRule, sequelize } from "@/models";
import { groupSchema, selectorSchema } from "@/schemas/tag";
import { assertCan } from "./access";
import { ASSIGNMENT_INCLUDE, assignmentConfig } from "./assignment-config";
import { touchDraft } from "./drafts";
import { allTagValues, siteBySlug } from "./tags";

export type GroupView = GroupConfig & { id: number; tagCount: number; matchCount: number };

async function loadGroups(siteId: number, transaction?: Transaction) {
  return TagGroup.findAll({
    where: { siteId },
    include: [{ model: TagGroupRule, as: "rules" }, ...ASSIGNMENT_INCLUDE],
    order: [["priority", "ASC"], ["name", "ASC"], [{ model: TagGroupRule, as: "rules" }, "position", "ASC"]],
    transaction,
  });
}

const toConfig = (g: TagGroup): GroupConfig => ({
  name: g.name,
  description: g.description,
  priority: g.priority,
  regulated: g.regulated,
  selector: rulesToSelector(g.rules ?? []),
  assignment: assignmentConfig(g.assignment ?? null),
});

/** The site's configuration as it stands now, draft edits included. */
export async function loadWorkingConfig(siteId: number, transaction?: Transaction): Promise<SiteConfig> {
  return { groups: (await loadGroups(siteId, transaction)).map(toConfig) };
}

/** The site's groups in priority order, each with the tags it wins and the tags it matches. */
export async function listGroups(actor: Actor | null, siteSlug: string): Promise<GroupView[]> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const [groups, tags] = await Promise.all([loadGroups(site.id), allTagValues(site.id)]);
  const configs = groups.map(toConfig);
  const result = assignGroups(tags, configs);
  const matched = new Map<string, number>();
  for (const list of result.matches) for (const name of list) matched.set(name, (matched.get(name) ?? 0) + 1);
  return groups.map((g, i) => ({ ...configs[i], id: g.id, tagCount: result.counts.get(g.name) ?? 0, matchCount: matched.get(g.name) ?? 0 }));
}

export async function getGroup(actor: Actor | null, siteSlug: string, id: number): Promise<GroupView> {
  const group = (await listGroups(actor, siteSlug)).find((g) => g.id === id);
  if (!group) throw new HttpError(404, `no group with id ${id} at this site`, "group");
  return group;
}

export async function writeRules(groupId: number, selector: GroupConfig["selector"], transaction: Transaction) {
  await TagGroupRule.destroy({ where: { groupId }, transaction });
  const rules = selectorToRules(selector).map((r, position) => ({ ...r, groupId, position }));
  if (rules.length) await TagGroupRule.bulkCreate(rules, { transaction });
}

/** Adds a group at the end of the site's priority order; the edit joins the site's draft change. */
export async function createGroup(actor: Actor | null, siteSlug: string, input: unknown): Promise<{ id: number }> {
  assertCan(actor, "config.edit");
  const values = groupSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    await touchDraft(actor, site.id, transaction);
    const last = (await TagGroup.max("priority", { where: { siteId: site.id }, transaction })) as number | null;
    const group = await TagGroup.create(
      { siteId: site.id, name: values.name, description: values.description, regulated: values.regulated, priority: (last ?? 0) + 10 },
      { transaction },
    );
    await writeRules(group.id, values.selector, transaction);
    await recordAudit(
      actor,
      { action: "group.create", entityType: "group", entityId: group.id, entityLabel: group.name, siteId: site.id, before: null, after: { ...values, priority: group.priority } },
      transaction,
    );
    return { id: group.id };
  });
}

async function lockGroup(siteId: number, id: number, transaction: Transaction) {
  const group = await TagGroup.findOne({ where: { id, siteId }, include: [{ model: TagGroupRule, as: "rules" }, ...ASSIGNMENT_INCLUDE], transaction, lock: transaction.LOCK.UPDATE });
  if (!group) throw new HttpError(404, `no group with id ${id} at this site`, "group");
  group.rules?.sort((a, b) => a.position - b.position);
  return group;
}

/** Replaces a group's name, description, regulated flag and selector. */
export async function updateGroup(actor: Actor | null, siteSlug: string, id: number, input: unknown): Promise<{ id: number }> {
  assertCan(actor, "config.edit");
  const values = groupSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    await touchDraft(actor, site.id, transaction);
    const group = await lockGroup(site.id, id, transaction);
    const before = toConfig(group);
    await group.update({ name: values.name, description: values.description, regulated: values.regulated }, { transaction });
    await writeRules(group.id, values.selector, transaction);
    const after = { ...values, priority: group.priority };
    await recordAudit(actor, { action: "group.update", entityType: "group", entityId: group.id, entityLabel: group.name, siteId: site.id, before, after }, transaction);
    return { id: group.id };
  });
}

export async function deleteGroup(actor: Actor | null, siteSlug: string, id: number): Promise<void> {
  assertCan(actor, "config.edit");
  await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    await touchDraft(actor, site.id, transaction);
    const group = await lockGroup(site.id, id, transaction);
    const before = toConfig(group);
    await group.destroy({ transaction });
    await recordAudit(actor, { action: "group.delete", entityType: "group", entityId: id, entityLabel: before.name, siteId: site.id, before, after: null }, transaction);
  });
}

export const orderSchema = z.object({ order: z.array(z.number().int().positive()).min(1, "Give the groups in their new order.") });

/** Sets the priority order of all of a site's groups at once (ids, first = highest priority). */
export async function reorderGroups(actor: Actor | null, siteSlug: string, input: unknown): Promise<void> {
  assertCan(actor, "config.edit");
  const { order } = orderSchema.parse(input);
  await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    await touchDraft(actor, site.id, transaction);
    const groups = await TagGroup.findAll({ where: { siteId: site.id }, order: [["priority", "ASC"], ["name", "ASC"]], transaction, lock: transaction.LOCK.UPDATE });
    const ids = groups.map((g) => g.id);
    if (order.length !== ids.length || new Set(order).size !== order.length || order.some((id) => !ids.includes(id))) {
      throw new HttpError(422, "order must list every group of the site exactly once", "order");
    }
    const before = groups.map((g) => g.name);
    const byId = new Map(groups.map((g) => [g.id, g]));
    for (const [i, id] of order.entries()) {
      const g = byId.get(id)!;
      if (g.priority !== (i + 1) * 10) await g.update({ priority: (i + 1) * 10 }, { transaction });
    }
    const after = order.map((id) => byId.get(id)!.name);
    await recordAudit(
      actor,
      { action: "group.reorder", entityType: "site", entityId: site.id, entityLabel: site.slug, siteId: site.id, before: { order: before }, after: { order: after } },
      transaction,
    );
  });
}

export const previewSchema = z.object({ selector: selectorSchema, groupId: z.number().int().positive().nullable().default(null) });

/**
 * Live preview of a selector being edited: how many tags it matches, a sample, and how
 * many of them a higher-priority group already wins.
 */
export async function previewGroup(actor: Actor | null, siteSlug: string, input: unknown) {
  assertCan(actor, "read");
  const { selector, groupId } = previewSchema.parse(input);
  const site = await siteBySlug(siteSlug);
  const [tags, groups] = await Promise.all([allTagValues(site.id), loadGroups(site.id)]);
  const own = previewSelector(tags, selector, 25);
  const self = groups.find((g) => g.id === groupId);
  const ahead = groups.filter((g) => g.id !== groupId && (!self || g.priority < self.priority || (g.priority === self.priority && g.name < self.name)));
  const preview = { ...own, wonElsewhere: 0, total: tags.length };
  if (ahead.length && own.count) {
    const withSelf = [...ahead.map(toConfig), { name: "\u0000preview", description: "", priority: Number.MAX_SAFE_INTEGER, regulated: false, selector, assignment: null }];
    const res = assignGroups(tags, withSelf);
    preview.wonElsewhere = own.count - (res.counts.get("\u0000preview") ?? 0);
  }
  return preview;
}

/** Tags in no group, and tags several groups match with the group that wins. */
export async function coverage(actor: Actor | null, siteSlug: string, limit = 500) {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const [tags, groups] = await Promise.all([allTagValues(site.id), loadGroups(site.id)]);
  const res = assignGroups(tags, groups.map(toConfig));
  return {
    total: tags.length,
    groups: groups.map((g) => ({ id: g.id, name: g.name, tagCount: res.counts.get(g.name) ?? 0 })),
    unassignedCount: res.unassigned.length,
    unassigned: res.unassigned.slice(0, limit).map((i) => ({ name: tags[i].name, kind: tags[i].kind, unit: tags[i].unit, gateway: tags[i].gateway })),
    overlapCount: res.overlaps.length,
    overlaps: res.overlaps.slice(0, limit).map((i) => ({ name: tags[i].name, groups: res.matches[i], winner: res.winner[i] })),
  };
}
