import "server-only";
import type { Transaction } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { Gateway, Site, sequelize } from "@/models";
import { assertCan } from "./access";

export type SiteView = {
  id: number;
  slug: string;
  name: string;
  timeZone: string;
  uplinkBudgetKbps: number;
  storagePricePerGbMonth: number;
  retentionMonths: number;
  defaultHandling: string;
  bytesPerSample: number;
  transportOverheadPct: number;
  uplinkHeadroomPct: number;
  gatewayCount: number;
};

export type GatewayView = {
  id: number;
  siteId: number;
  slug: string;
  name: string;
  description: string;
  pollSeconds: number;
};

export function presentSite(site: Site, gatewayCount = 0): SiteView {
  return {
    id: site.id,
    slug: site.slug,
    name: site.name,
    timeZone: site.timeZone,
    uplinkBudgetKbps: Number(site.uplinkBudgetKbps),
    storagePricePerGbMonth: Number(site.storagePricePerGbMonth),
    retentionMonths: site.retentionMonths,
    defaultHandling: site.defaultHandling,
    bytesPerSample: site.bytesPerSample,
    transportOverheadPct: Number(site.transportOverheadPct),
    uplinkHeadroomPct: Number(site.uplinkHeadroomPct),
    gatewayCount,
  };
}

export function presentGateway(g: Gateway): GatewayView {
  return { id: g.id, siteId: g.siteId, slug: g.slug, name: g.name, description: g.description, pollSeconds: g.pollSeconds };
}

/** A site by slug, or 404 naming the field; with `lock`, the row is locked for the transaction. */
export async function siteBySlug(slug: string, transaction?: Transaction, lock = false): Promise<Site> {
  const site = await Site.findOne({ where: { slug }, transaction, lock: lock && transaction ? transaction.LOCK.UPDATE : undefined });
  if (!site) throw new HttpError(404, `no site with slug "${slug}"`, "site");
  return site;
}

/** All sites with their gateway counts, by name. */
export async function listSites(actor: Actor | null): Promise<SiteView[]> {
  assertCan(actor, "read");
  const sites = await Site.findAll({ order: [["name", "ASC"]] });
  const counts = (await Gateway.findAll({
    attributes: ["siteId", [sequelize.fn("COUNT", sequelize.col("id")), "n"]],
    group: ["siteId"],
    raw: true,
  })) as unknown as { siteId: number; n: number }[];
  const bySite = new Map(counts.map((c) => [c.siteId, Number(c.n)]));
  return sites.map((s) => presentSite(s, bySite.get(s.id) ?? 0));
}

/** One site by slug, or 404. */
export async function getSite(actor: Actor | null, slug: string): Promise<SiteView> {
  assertCan(actor, "read");
  const site = await siteBySlug(slug);
  const n = await Gateway.count({ where: { siteId: site.id } });
  return presentSite(site, n);
}

/** A site's gateways, by name. */
export async function listGateways(actor: Actor | null, siteSlug: string): Promise<GatewayView[]> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const rows = await Gateway.findAll({ where: { siteId: site.id }, order: [["name", "ASC"]] });
  return rows.map(presentGateway);
}

/** One gateway of a site, or 404. */
export async function getGateway(actor: Actor | null, siteSlug: string, gatewaySlug: string): Promise<GatewayView> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const gw = await Gateway.findOne({ where: { siteId: site.id, slug: gatewaySlug } });
  if (!gw) throw new HttpError(404, `no gateway "${gatewaySlug}" at site "${siteSlug}"`, "gateway");
  return presentGateway(gw);
}
