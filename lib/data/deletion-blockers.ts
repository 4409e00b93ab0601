import "server-only";
import type { Transaction } from "sequelize";

type Target = { siteId: number } | { gatewayId: number };
type Check = (target: Target, transaction: Transaction) => Promise<string | null>;

/**
 * Reasons a site or gateway may not be deleted, in words for the person asking. Each
 * table that must outlive its site or gateway (releases, bundles, check-ins) adds its
 * check here in the issue that creates it; until then nothing refers to them.
 */
const CHECKS: Check[] = [];

export async function deletionBlockers(target: Target, transaction: Transaction): Promise<string[]> {
  const reasons: string[] = [];
  for (const check of CHECKS) {
    const reason = await check(target, transaction);
    if (reason) reasons.push(reason);
  }
  return reasons;
}
