import "server-only";
import { cookies } from "next/headers";
import { decode } from "next-auth/jwt";
import { env } from "@/lib/env";

const COOKIE_NAMES = ["__Secure-next-auth.session-token", "next-auth.session-token"];

type CookieReader = { get(name: string): { value: string } | undefined };

/** The signed-in user's id from the session cookie, or null. The role is never taken from it. */
export async function sessionUserId(jar?: CookieReader): Promise<number | null> {
  const reader = jar ?? (await cookies());
  const secret = env().NEXTAUTH_SECRET;
  if (!secret) return null;
  for (const name of COOKIE_NAMES) {
    const raw = reader.get(name)?.value;
    if (!raw) continue;
    try {
      const token = await decode({ token: raw, secret });
      const id = Number(token?.sub);
      if (Number.isInteger(id) && id > 0) return id;
    } catch {
      return null;
    }
  }
  return null;
}
