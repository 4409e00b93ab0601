import "server-only";
import type { Transaction } from "sequelize";
import { renderSiteBundles, type BundleTag } from "@/lib/bundles/render";
import { validateBundle } from "@/lib/bundles/validate";
import type { SiteConfig } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import type { Profile } from "@/lib/reduction/profile";
import { Gateway, ProfileRevision, Site, Tag } from "@/models";

export type SiteContext = {
  site: Site;
  gateways: { id: number; slug: string; pollSeconds: number }[];
  tags: BundleTag[];
};

/** The site's gateways and inventory as the bundle renderer reads them. */
export async function siteContext(site: Site, transaction?: Transaction): Promise<SiteContext> {
  const gateways = await Gateway.findAll({ where: { siteId: site.id }, attributes: ["id", "slug", "pollSeconds"], order: [["slug", "ASC"]], transaction });
  const slugOf = new Map(gateways.map((g) => [g.id, g.slug]));
  const rows = await Tag.findAll({
    where: { siteId: site.id },
    attributes: ["name", "kind", "unit", "euLow", "euHigh", "samplePeriodMs", "gatewayId", "area", "equipment"],
    raw: true,
    transaction,
  });
  const tags = rows.map((t) => ({
    name: t.name,
    kind: t.kind,
    unit: t.unit,
    euLow: t.euLow === null ? null : Number(t.euLow),
    euHigh: t.euHigh === null ? null : Number(t.euHigh),
    samplePeriodMs: t.samplePeriodMs,
    gateway: slugOf.get(t.gatewayId) ?? "",
    area: t.area,
    equipment: t.equipment,
  }));
  return { site, gateways: gateways.map((g) => ({ id: g.id, slug: g.slug, pollSeconds: g.pollSeconds })), tags };
}

/** The profile documents a configuration pins, by revision id. */
export async function pinnedProfiles(config: SiteConfig, transaction?: Transaction): Promise<Map<number, Profile>> {
  const ids = [...new Set(config.groups.flatMap((g) => (g.assignment ? [g.assignment.revisionId] : [])))];
  if (ids.length === 0) return new Map();
  const revs = await ProfileRevision.findAll({ where: { id: ids }, attributes: ["id", "document"], transaction });
  return new Map(revs.map((r) => [r.id, r.document]));
}

/**
 * Every gateway's bundle for a configuration, rendered and validated against the bundle
 * schema. A profile that cannot resolve for a tag, or a bundle that does not validate,
 * refuses the whole set (422) — an invalid bundle is never released.
 */
export async function renderAndValidate(ctx: SiteContext, config: SiteConfig, release: number, issued: string, keyId: string, transaction?: Transaction): Promise<Map<string, string>> {
  const profiles = await pinnedProfiles(config, transaction);
  let bundles: Map<string, string>;
  try {
    bundles = renderSiteBundles(
      {
        site: { slug: ctx.site.slug, timeZone: ctx.site.timeZone, defaultHandling: ctx.site.defaultHandling === "drop" ? "drop" : "pass-through" },
        release,
        issued,
        keyId,
        config,
        tags: ctx.tags,
        profiles,
      },
      ctx.gateways.map((g) => ({ slug: g.slug, pollSeconds: g.pollSeconds })),
    );
  } catch (e) {
    throw new HttpError(422, `a bundle cannot be rendered: ${(e as Error).message}`, "config");
  }
  for (const [gateway, text] of bundles) {
    const checked = validateBundle(text);
    if (!checked.ok) throw new HttpError(422, `the bundle for ${gateway} does not match the bundle schema: ${checked.problems[0].path} ${checked.problems[0].message}`, "bundle");
  }
  return bundles;
}
