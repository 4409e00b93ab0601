import "server-only";
import bcrypt from "bcryptjs";
import { User } from "@/models";
import type { Role } from "@/lib/permissions";
import { recordFailure, recordSuccess, throttleKeys, waitSeconds } from "./throttle";

export type SignInResult =
  | { ok: true; user: { id: number; email: string; name: string; role: Role } }
  | { ok: false; reason: "invalid" | "throttled"; retryAfter?: number };

// A hash of a random string, so an unknown e-mail costs the same time as a known one.
let dummyHash: Promise<string> | null = null;
const dummy = () => (dummyHash ??= bcrypt.hash(crypto.randomUUID(), 12));

/** Checks a credentials sign-in, throttled per account, account+address and address. */
export async function verifySignIn(email: string, password: string, address: string): Promise<SignInResult> {
  const keys = throttleKeys(email, address);
  const wait = await waitSeconds(keys);
  if (wait > 0) return { ok: false, reason: "throttled", retryAfter: wait };
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const matches = await bcrypt.compare(password, user?.passwordHash ?? (await dummy()));
  if (!user || !matches || !user.active) {
    await recordFailure(keys);
    return { ok: false, reason: "invalid" };
  }
  await recordSuccess(keys);
  return { ok: true, user: { id: user.id, email: user.email, name: user.name, role: user.role } };
}

export async function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, 12);
}
