import "server-only";
import type { Transaction } from "sequelize";
import { diffBundles } from "@/lib/bundles/diff";
import { digestHex } from "@/lib/bundles/digest";
import { signBytes, type SigningKey } from "@/lib/bundles/signing";
import type { Actor } from "@/lib/auth/guard";
import type { SiteConfig } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import { Bundle, Release, Site, User } from "@/models";
import { assertCan } from "./access";
import { renderAndValidate, siteContext, type SiteContext } from "./release-render";
import { signingKeys } from "./signing-keys";
import { siteBySlug } from "./sites";

/** A time as bundles carry it: ISO 8601 UTC to the second. */
export const issuedAt = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, "Z");
export const issuedNow = () => issuedAt(new Date());

/**
 * The next release number of a site: its counter + 1, under a row lock on the site held
 * until the transaction ends, so concurrent releases queue and no number is lost or
 * given twice (numbers are never reused: a rollback publishes a higher one).
 */
export async function allocateReleaseNumber(siteId: number, transaction: Transaction): Promise<number> {
  const site = await Site.findByPk(siteId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ["id", "releaseCounter"] });
  if (!site) throw new HttpError(404, "the site is gone", "site");
  const next = site.releaseCounter + 1;
  await Site.update({ releaseCounter: next }, { where: { id: siteId }, transaction });
  return next;
}

export type PublishOptions = { changeId: number | null; actor: Actor; note?: string; rollbackOf?: number | null; urgentReason?: string | null };

/**
 * Publishes a configuration as the site's next release inside the caller's transaction:
 * allocates the number, renders and validates every gateway's bundle against today's
 * inventory and gateways, signs each (Ed25519 over the exact bytes) with its SHA-256
 * digest, and stores release and bundles. Any failure rolls the whole release back.
 */
export async function publishRelease(site: Site, config: SiteConfig, opts: PublishOptions, transaction: Transaction): Promise<Release> {
  const number = await allocateReleaseNumber(site.id, transaction);
  const issued = issuedNow();
  const { active } = signingKeys();
  const ctx = await siteContext(site, transaction);
  const bundles = await renderAndValidate(ctx, config, number, issued, active.id, transaction);
  const release = await Release.create(
    {
      siteId: site.id,
      number,
      config,
      changeId: opts.changeId,
      note: opts.note ?? "",
      releasedBy: opts.actor.id,
      releasedAt: new Date(issued),
      rollbackOf: opts.rollbackOf ?? null,
      urgentReason: opts.urgentReason ?? null,
    },
    { transaction },
  );
  await storeSignedBundles(release.id, ctx, bundles, active, transaction);
  return release;
}

/**
 * Signs each rendered bundle (Ed25519 over its exact bytes, with its SHA-256 digest), stores
 * it for the release, and points the site's gateways at their bundle of the newest release.
 */
export async function storeSignedBundles(releaseId: number, ctx: SiteContext, bundles: Map<string, string>, key: SigningKey, transaction: Transaction): Promise<void> {
  const idOf = new Map(ctx.gateways.map((g) => [g.slug, g.id]));
  await Bundle.bulkCreate(
    [...bundles].map(([gateway, text]) => {
      const bytes = Buffer.from(text, "utf8");
      return { releaseId, gatewayId: idOf.get(gateway)!, gatewaySlug: gateway, digest: digestHex(bytes), keyId: key.id, signature: signBytes(key, bytes), bytes };
    }),
    { transaction },
  );
  // What a gateway pull serves: the bundle of the site's newest release (none when that release has no bundle for it).
  await Bundle.sequelize!.query(
    `UPDATE gateways g
       LEFT JOIN bundles b ON b.gateway_id = g.id
        AND b.release_id = (SELECT r.id FROM releases r WHERE r.site_id = g.site_id ORDER BY r.number DESC LIMIT 1)
        SET g.current_bundle_id = b.id
      WHERE g.site_id = (SELECT site_id FROM releases WHERE id = :releaseId)`,
    { replacements: { releaseId }, transaction },
  );
}

export type ReleaseView = {
  number: number;
  releasedAt: string;
  releasedBy: string;
  changeId: number | null;
  note: string;
  rollbackOf: number | null;
  urgentReason: string | null;
  bundles: { gateway: string; digest: string; size: number }[];
};

/** The site's releases, newest first, with their bundles' digests. */
export async function listReleases(actor: Actor | null, siteSlug: string): Promise<ReleaseView[]> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const releases = await Release.findAll({
    where: { siteId: site.id },
    attributes: { exclude: ["config"] },
    order: [["number", "DESC"]],
    include: [
      { model: Bundle, as: "bundles", attributes: ["gatewaySlug", "digest", [Bundle.sequelize!.fn("LENGTH", Bundle.sequelize!.col("bytes")), "size"]] },
      { model: User, as: "releaser", attributes: ["name"] },
    ],
  });
  return releases.map((r) => {
    const x = r as Release & { bundles?: (Bundle & { get(k: "size"): number })[]; releaser?: User | null };
    return {
      number: r.number,
      releasedAt: r.releasedAt.toISOString(),
      releasedBy: x.releaser?.name ?? "(system)",
      changeId: r.changeId,
      note: r.note,
      rollbackOf: r.rollbackOf ?? null,
      urgentReason: r.urgentReason ?? null,
      bundles: (x.bundles ?? []).map((b) => ({ gateway: b.gatewaySlug, digest: b.digest, size: Number(b.get("size")) })).sort((a, b) => (a.gateway < b.gateway ? -1 : 1)),
    };
  });
}

async function bundleTexts(siteId: number, number: number): Promise<Map<string, string>> {
  const release = await Release.findOne({ where: { siteId, number }, attributes: ["id"] });
  if (!release) throw new HttpError(404, `the site has no release ${number}`, "release");
  const rows = await Bundle.findAll({ where: { releaseId: release.id }, attributes: ["gatewaySlug", "bytes"] });
  return new Map(rows.map((b) => [b.gatewaySlug, b.bytes.toString("utf8")]));
}

/** Two releases compared gateway by gateway (line diffs of the bundles). */
export async function compareReleases(actor: Actor | null, siteSlug: string, from: number, to: number) {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const [a, b] = await Promise.all([bundleTexts(site.id, from), bundleTexts(site.id, to)]);
  const gateways = [...new Set([...a.keys(), ...b.keys()])].sort();
  return {
    from,
    to,
    gateways: gateways.map((g) => ({ gateway: g, diff: b.has(g) ? diffBundles(a.get(g) ?? null, b.get(g)!) : null, removed: !b.has(g) })),
  };
}

/** One stored bundle: its exact bytes, digest and signature. */
export async function getBundle(actor: Actor | null, siteSlug: string, number: number, gateway: string): Promise<Bundle> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const release = await Release.findOne({ where: { siteId: site.id, number }, attributes: ["id"] });
  if (!release) throw new HttpError(404, `the site has no release ${number}`, "release");
  const bundle = await Bundle.findOne({ where: { releaseId: release.id, gatewaySlug: gateway } });
  if (!bundle) throw new HttpError(404, `release ${number} has no bundle for gateway ${gateway}`, "gateway");
  return bundle;
}
