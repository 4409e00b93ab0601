import "server-only";
import { Op, type Transaction } from "sequelize";
import { z } from "zod";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { Gateway, Tag, sequelize } from "@/models";
import { tagSchema, type TagValues } from "@/schemas/tag";
import { assertCan } from "./access";
import { siteBySlug } from "./sites";

export type TagView = TagValues & { id: number };

export { siteBySlug };

async function gatewayMaps(siteId: number, transaction?: Transaction) {
  const gws = await Gateway.findAll({ where: { siteId }, attributes: ["id", "slug"], transaction });
  return { idOf: new Map(gws.map((g) => [g.slug, g.id])), slugOf: new Map(gws.map((g) => [g.id, g.slug])) };
}

type TagRowData = Pick<Tag, "id" | "name" | "unit" | "samplePeriodMs" | "kind" | "euLow" | "euHigh" | "area" | "equipment" | "gatewayId">;

function present(t: TagRowData, slugOf: Map<number, string>): TagView {
  return {
    id: t.id,
    name: t.name,
    unit: t.unit,
    samplePeriodMs: t.samplePeriodMs,
    kind: t.kind,
    euLow: t.euLow,
    euHigh: t.euHigh,
    area: t.area,
    equipment: t.equipment,
    gateway: slugOf.get(t.gatewayId) ?? "",
  };
}

const snapshot = (v: TagValues) => ({
  name: v.name,
  unit: v.unit,
  samplePeriodMs: v.samplePeriodMs,
  kind: v.kind,
  euLow: v.euLow,
  euHigh: v.euHigh,
  area: v.area,
  equipment: v.equipment,
  gateway: v.gateway,
});

/** Every tag of a site, by name (the inventory is read whole: it is at most a few hundred thousand rows). */
export async function listTags(actor: Actor | null, siteSlug: string, opts: { offset?: number; limit?: number } = {}) {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const { slugOf } = await gatewayMaps(site.id);
  const limit = Math.min(Math.max(opts.limit ?? 10_000, 1), 20_000);
  const offset = Math.max(opts.offset ?? 0, 0);
  const [rows, total] = await Promise.all([
    // Plain rows, not model instances: tens of thousands of them per request.
    Tag.findAll({ where: { siteId: site.id }, order: [["name", "ASC"]], offset, limit, raw: true }) as unknown as Promise<TagRowData[]>,
    Tag.count({ where: { siteId: site.id } }),
  ]);
  return { tags: rows.map((t) => present(t, slugOf)), total, offset, limit };
}

/** The whole inventory of a site as plain values (for selectors, export and coverage). */
export async function allTagValues(siteId: number, transaction?: Transaction): Promise<TagView[]> {
  const { slugOf } = await gatewayMaps(siteId, transaction);
  const rows = (await Tag.findAll({ where: { siteId }, order: [["name", "ASC"]], transaction, raw: true })) as unknown as TagRowData[];
  return rows.map((t) => present(t, slugOf));
}

function resolveGateway(idOf: Map<string, number>, slug: string, field = "gateway"): number {
  const id = idOf.get(slug);
  if (id === undefined) throw new HttpError(422, `unknown gateway "${slug}" at this site`, field);
  return id;
}

/** Adds one tag to a site's inventory (inventory changes directly; bundles change at the next release). */
export async function createTag(actor: Actor | null, siteSlug: string, input: unknown): Promise<TagView> {
  assertCan(actor, "config.edit");
  const values = tagSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    const { idOf, slugOf } = await gatewayMaps(site.id, transaction);
    const tag = await Tag.create({ ...values, siteId: site.id, gatewayId: resolveGateway(idOf, values.gateway) }, { transaction });
    await recordAudit(
      actor,
      { action: "tag.create", entityType: "tag", entityId: tag.id, entityLabel: tag.name, siteId: site.id, before: null, after: snapshot(values) },
      transaction,
    );
    return present(tag, slugOf);
  });
}

async function lockTag(siteId: number, id: number, transaction: Transaction) {
  const tag = await Tag.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE });
  if (!tag) throw new HttpError(404, `no tag with id ${id} at this site`, "tag");
  return tag;
}

/** Edits one tag (all fields given, as the inline editor sends them). */
export async function updateTag(actor: Actor | null, siteSlug: string, id: number, input: unknown): Promise<TagView> {
  assertCan(actor, "config.edit");
  const values = tagSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    const { idOf, slugOf } = await gatewayMaps(site.id, transaction);
    const tag = await lockTag(site.id, id, transaction);
    const before = snapshot(present(tag, slugOf));
    await tag.update({ ...values, gatewayId: resolveGateway(idOf, values.gateway) }, { transaction });
    const after = snapshot(present(tag, slugOf));
    if (JSON.stringify(before) !== JSON.stringify(after)) {
      await recordAudit(actor, { action: "tag.update", entityType: "tag", entityId: tag.id, entityLabel: tag.name, siteId: site.id, before, after }, transaction);
    }
    return present(tag, slugOf);
  });
}

export const deleteTagsSchema = z.object({ ids: z.array(z.number().int().positive()).min(1, "Select at least one tag.").max(200_000) });

/** Deletes the selected tags of a site, all or none. */
export async function deleteTags(actor: Actor | null, siteSlug: string, input: unknown): Promise<{ deleted: number }> {
  assertCan(actor, "config.edit");
  const { ids } = deleteTagsSchema.parse(input);
  return removeTags(actor, siteSlug, ids, () => new HttpError(404, "some selected tags no longer exist; reload the list", "ids"));
}

/** Deletes one tag of a site, named by its id (in the URL): a missing one is a 404 naming "tag". */
export async function deleteTag(actor: Actor | null, siteSlug: string, id: number): Promise<{ deleted: number }> {
  assertCan(actor, "config.edit");
  return removeTags(actor, siteSlug, [id], () => new HttpError(404, `no tag with id ${id} at this site`, "tag"));
}

async function removeTags(actor: Actor, siteSlug: string, ids: number[], missing: () => HttpError): Promise<{ deleted: number }> {
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    const rows = await Tag.findAll({ where: { siteId: site.id, id: { [Op.in]: ids } }, transaction, lock: transaction.LOCK.UPDATE, attributes: ["id", "name"] });
    if (rows.length !== new Set(ids).size) throw missing();
    await Tag.destroy({ where: { siteId: site.id, id: { [Op.in]: ids } }, transaction });
    const names = rows.map((r) => r.name).sort();
    await recordAudit(
      actor,
      {
        action: rows.length === 1 ? "tag.delete" : "tags.delete",
        entityType: "tag",
        entityId: rows.length === 1 ? rows[0].id : null,
        entityLabel: rows.length === 1 ? names[0] : `${rows.length} tags`,
        siteId: site.id,
        before: { count: rows.length, names: names.slice(0, 200) },
        after: null,
      },
      transaction,
    );
    return { deleted: rows.length };
  });
}
