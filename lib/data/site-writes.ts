import "server-only";
import type { Transaction } from "sequelize";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { Change, Gateway, Site, Tag, sequelize } from "@/models";
import { gatewaySchema, siteSchema, type GatewayInput, type SiteInput } from "@/schemas/site";
import { assertCan } from "./access";
import { deletionBlockers } from "./deletion-blockers";
import { presentGateway, presentSite, siteBySlug, type GatewayView, type SiteView } from "./sites";

const siteSnapshot = (s: Site) => {
  const v = presentSite(s);
  return {
    name: v.name,
    slug: v.slug,
    timeZone: v.timeZone,
    uplinkBudgetKbps: v.uplinkBudgetKbps,
    storagePricePerGbMonth: v.storagePricePerGbMonth,
    retentionMonths: v.retentionMonths,
    defaultHandling: v.defaultHandling,
    bytesPerSample: v.bytesPerSample,
    transportOverheadPct: v.transportOverheadPct,
    uplinkHeadroomPct: v.uplinkHeadroomPct,
  };
};

const gatewaySnapshot = (g: Gateway) => ({ name: g.name, slug: g.slug, description: g.description, pollSeconds: g.pollSeconds });

const lockSite = (slug: string, transaction: Transaction) => siteBySlug(slug, transaction, true);

async function lockGateway(site: Site, slug: string, transaction: Transaction) {
  const gw = await Gateway.findOne({ where: { siteId: site.id, slug }, transaction, lock: transaction.LOCK.UPDATE });
  if (!gw) throw new HttpError(404, `no gateway "${slug}" at site "${site.slug}"`, "gateway");
  return gw;
}

export async function createSite(actor: Actor | null, input: SiteInput): Promise<SiteView> {
  assertCan(actor, "fleet.admin");
  const values = siteSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await Site.create(values, { transaction });
    await recordAudit(
      actor,
      { action: "site.create", entityType: "site", entityId: site.id, entityLabel: site.slug, siteId: site.id, before: null, after: siteSnapshot(site) },
      transaction,
    );
    return presentSite(site);
  });
}

export async function updateSite(actor: Actor | null, slug: string, input: SiteInput): Promise<SiteView> {
  assertCan(actor, "fleet.admin");
  const values = siteSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await lockSite(slug, transaction);
    const before = siteSnapshot(site);
    await site.update(values, { transaction });
    const after = siteSnapshot(site);
    if (JSON.stringify(before) !== JSON.stringify(after)) {
      await recordAudit(
        actor,
        { action: "site.update", entityType: "site", entityId: site.id, entityLabel: site.slug, siteId: site.id, before, after },
        transaction,
      );
    }
    return presentSite(site, await Gateway.count({ where: { siteId: site.id }, transaction }));
  });
}

/** Deletes a site and its gateways, unless something (such as a release) still needs it. */
export async function deleteSite(actor: Actor | null, slug: string): Promise<void> {
  assertCan(actor, "fleet.admin");
  await sequelize.transaction(async (transaction) => {
    const site = await lockSite(slug, transaction);
    const blockers = await deletionBlockers({ siteId: site.id }, transaction);
    if (blockers.length) throw new HttpError(409, `Site "${site.name}" cannot be deleted: ${blockers.join("; ")}.`, "site");
    const gateways = await Gateway.findAll({ where: { siteId: site.id }, transaction, order: [["slug", "ASC"]] });
    const tagCount = await Tag.count({ where: { siteId: site.id }, transaction });
    const before = { ...siteSnapshot(site), gateways: gateways.map((g) => g.slug), tags: tagCount };
    // Tags and groups go with the site (foreign keys cascade); tags first, as they refer to
    // gateways. Changes are removed explicitly (their foreign key cannot cascade).
    await Tag.destroy({ where: { siteId: site.id }, transaction });
    await Change.destroy({ where: { siteId: site.id }, transaction });
    await Gateway.destroy({ where: { siteId: site.id }, transaction });
    await site.destroy({ transaction });
    await recordAudit(
      actor,
      { action: "site.delete", entityType: "site", entityId: site.id, entityLabel: site.slug, siteId: site.id, before, after: null },
      transaction,
    );
  });
}

export async function createGateway(actor: Actor | null, siteSlug: string, input: GatewayInput): Promise<GatewayView> {
  assertCan(actor, "fleet.admin");
  const values = gatewaySchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await lockSite(siteSlug, transaction);
    const gw = await Gateway.create({ ...values, siteId: site.id }, { transaction });
    await recordAudit(
      actor,
      { action: "gateway.create", entityType: "gateway", entityId: gw.id, entityLabel: gw.slug, siteId: site.id, before: null, after: gatewaySnapshot(gw) },
      transaction,
    );
    return presentGateway(gw);
  });
}

export async function updateGateway(actor: Actor | null, siteSlug: string, gatewaySlug: string, input: GatewayInput): Promise<GatewayView> {
  assertCan(actor, "fleet.admin");
  const values = gatewaySchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await lockSite(siteSlug, transaction);
    const gw = await lockGateway(site, gatewaySlug, transaction);
    const before = gatewaySnapshot(gw);
    await gw.update(values, { transaction });
    const after = gatewaySnapshot(gw);
    if (JSON.stringify(before) !== JSON.stringify(after)) {
      await recordAudit(
        actor,
        { action: "gateway.update", entityType: "gateway", entityId: gw.id, entityLabel: gw.slug, siteId: site.id, before, after },
        transaction,
      );
    }
    return presentGateway(gw);
  });
}

export async function deleteGateway(actor: Actor | null, siteSlug: string, gatewaySlug: string): Promise<void> {
  assertCan(actor, "fleet.admin");
  await sequelize.transaction(async (transaction) => {
    const site = await lockSite(siteSlug, transaction);
    const gw = await lockGateway(site, gatewaySlug, transaction);
    const blockers = await deletionBlockers({ gatewayId: gw.id }, transaction);
    if (blockers.length) throw new HttpError(409, `Gateway "${gw.name}" cannot be deleted: ${blockers.join("; ")}.`, "gateway");
    const before = gatewaySnapshot(gw);
    await gw.destroy({ transaction });
    await recordAudit(
      actor,
      { action: "gateway.delete", entityType: "gateway", entityId: gw.id, entityLabel: gw.slug, siteId: site.id, before, after: null },
      transaction,
    );
  });
}
