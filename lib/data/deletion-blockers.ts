import "server-only";
import type { Transaction } from "sequelize";
import { Bundle, Release, Tag } from "@/models";

type Target = { siteId: number } | { gatewayId: number };
type Check = (target: Target, transaction: Transaction) => Promise<string | null>;

/**
 * Reasons a site or gateway may not be deleted, in words for the person asking. Each
 * table that must outlive its site or gateway (releases, bundles, check-ins) adds its
 * check here in the issue that creates it.
 */
const CHECKS: Check[] = [
  async (target, transaction) => {
    if (!("gatewayId" in target)) return null;
    const n = await Tag.count({ where: { gatewayId: target.gatewayId }, transaction });
    return n ? `${n.toLocaleString("en")} tag${n === 1 ? " is" : "s are"} collected by it; move them to another gateway or delete them first` : null;
  },
  async (target, transaction) => {
    if ("gatewayId" in target) {
      const n = await Bundle.count({ where: { gatewayId: target.gatewayId }, transaction });
      return n ? `it has bundles in ${n.toLocaleString("en")} release${n === 1 ? "" : "s"}; released history is kept` : null;
    }
    const n = await Release.count({ where: { siteId: target.siteId }, transaction });
    return n ? `it has ${n.toLocaleString("en")} release${n === 1 ? "" : "s"}; released history is kept` : null;
  },
];

export async function deletionBlockers(target: Target, transaction: Transaction): Promise<string[]> {
  const reasons: string[] = [];
  for (const check of CHECKS) {
    const reason = await check(target, transaction);
    if (reason) reasons.push(reason);
  }
  return reasons;
}
