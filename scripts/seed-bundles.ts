/**
 * Renders, validates and signs the bundles of any release stored without them (the demo
 * seed's release, written by a seeder that cannot run TypeScript), and keeps each site's
 * release counter at its highest release number. Idempotent; run by scripts/stack.mjs
 * after the seeders with `node --conditions=react-server --import tsx`.
 */
import { QueryTypes } from "sequelize";
import { renderAndValidate, siteContext } from "@/lib/data/release-render";
import { issuedAt, storeSignedBundles } from "@/lib/data/releases";
import { signingKeys } from "@/lib/data/signing-keys";
import { Release, Site, sequelize } from "@/models";

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
      const issued = issuedAt(release.releasedAt);
      const bundles = await renderAndValidate(ctx, release.config, release.number, issued, active.id, transaction);
      await storeSignedBundles(release.id, ctx, bundles, active, transaction);
      console.log(`bundles: ${site.slug} release ${release.number}: ${bundles.size} rendered and signed`);
    });
  }
  await sequelize.close();
}

main().catch((e) => {
  console.error(`bundles: ${(e as Error).message}`);
  process.exit(1);
});
