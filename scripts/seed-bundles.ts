/**
 * Renders, validates and signs the bundles of any release stored without them (the demo
 * seed's release, written by a seeder that cannot run TypeScript), and keeps each site's
 * release counter at its highest release number. Idempotent; run by scripts/stack.mjs
 * after the seeders with `node --conditions=react-server --import tsx`.
 */
import { QueryTypes } from "sequelize";
import { digestHex } from "@/lib/bundles/digest";
import { signBytes } from "@/lib/bundles/signing";
import { renderAndValidate, siteContext } from "@/lib/data/release-render";
import { signingKeys } from "@/lib/data/signing-keys";
import { Bundle, Release, Site, sequelize } from "@/models";

async function main() {
  await sequelize.query("UPDATE sites s SET release_counter = GREATEST(release_counter, COALESCE((SELECT MAX(r.number) FROM releases r WHERE r.site_id = s.id), 0))", {
    type: QueryTypes.UPDATE,
  });
  const missing = await sequelize.query<{ id: number }>("SELECT r.id FROM releases r WHERE NOT EXISTS (SELECT 1 FROM bundles b WHERE b.release_id = r.id)", { type: QueryTypes.SELECT });
  const { active } = signingKeys();
  for (const { id } of missing) {
    await sequelize.transaction(async (transaction) => {
      const release = (await Release.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }))!;
      const site = (await Site.findByPk(release.siteId, { transaction }))!;
      const ctx = await siteContext(site, transaction);
      const issued = release.releasedAt.toISOString().replace(/\.\d{3}Z$/, "Z");
      const bundles = await renderAndValidate(ctx, release.config, release.number, issued, active.id, transaction);
      const idOf = new Map(ctx.gateways.map((g) => [g.slug, g.id]));
      await Bundle.bulkCreate(
        [...bundles].map(([gateway, text]) => {
          const bytes = Buffer.from(text, "utf8");
          return { releaseId: release.id, gatewayId: idOf.get(gateway)!, gatewaySlug: gateway, digest: digestHex(bytes), keyId: active.id, signature: signBytes(active, bytes), bytes };
        }),
        { transaction },
      );
      console.log(`bundles: ${site.slug} release ${release.number}: ${bundles.size} rendered and signed`);
    });
  }
  await sequelize.close();
}

main().catch((e) => {
  console.error(`bundles: ${(e as Error).message}`);
  process.exit(1);
});
