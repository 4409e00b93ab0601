import "server-only";
import { Op } from "sequelize";
import { SignInThrottle, sequelize } from "@/models";

/**
 * Sign-in throttling with a growing delay, no hard lockout. Counters live in the database
 * so every app instance shares them. Three keys per attempt: the account from this
 * address (tight), the account from anywhere (loose, so rotating addresses does not
 * help), and the address alone (loose). Failures older than an hour are forgotten.
 */
export type ThrottleRule = { prefix: string; free: number; capSeconds: number };

const RULES: readonly ThrottleRule[] = [
  { prefix: "pair", free: 3, capSeconds: 60 },
  { prefix: "acct", free: 20, capSeconds: 60 },
  { prefix: "addr", free: 10, capSeconds: 60 },
];

const FORGET_AFTER_MS = 60 * 60 * 1000;

export function throttleKeys(email: string, address: string): string[] {
  const e = email.trim().toLowerCase();
  return [`pair:${e}|${address}`, `acct:${e}`, `addr:${address}`];
}

/** Seconds to wait after `failures` failures under a rule: 0 for the first free ones, then 1, 2, 4 … up to the cap. */
export function delaySeconds(failures: number, free: number, capSeconds: number): number {
  if (failures < free) return 0;
  return Math.min(capSeconds, 2 ** (failures - free));
}

/** Seconds until another attempt is allowed for these keys (0 = go ahead). */
export async function waitSeconds(keys: string[], now = new Date()): Promise<number> {
  const rows = await SignInThrottle.findAll({ where: { throttleKey: { [Op.in]: keys }, blockedUntil: { [Op.gt]: now } } });
  let wait = 0;
  for (const row of rows) wait = Math.max(wait, Math.ceil((row.blockedUntil.getTime() - now.getTime()) / 1000));
  return wait;
}

/** Counts a failure under each key; `rules[i]` governs `keys[i]` (the sign-in rules by default). */
export async function recordFailure(keys: string[], now = new Date(), rules: readonly ThrottleRule[] = RULES): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    for (const [i, key] of keys.entries()) {
      const rule = rules[i] ?? rules[rules.length - 1];
      const row = await SignInThrottle.findByPk(key, { transaction, lock: transaction.LOCK.UPDATE });
      const stale = !row || now.getTime() - row.lastFailureAt.getTime() > FORGET_AFTER_MS;
      const failures = stale ? 1 : row.failures + 1;
      const blockedUntil = new Date(now.getTime() + delaySeconds(failures, rule.free, rule.capSeconds) * 1000);
      if (row) await row.update({ failures, lastFailureAt: now, blockedUntil }, { transaction });
      else await SignInThrottle.create({ throttleKey: key, failures, lastFailureAt: now, blockedUntil }, { transaction });
    }
  });
}

/** A successful sign-in clears the account's own counters (not the address counter). */
export async function recordSuccess(keys: string[]): Promise<void> {
  await SignInThrottle.destroy({ where: { throttleKey: { [Op.in]: keys.filter((k) => !k.startsWith("addr:")) } } });
}
