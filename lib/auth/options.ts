import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { env } from "@/lib/env";
import { signInSchema } from "@/schemas/sign-in";
import { verifySignIn } from "./sign-in";


function clientAddress(headers: Record<string, unknown> | undefined): string {
  const fwd = headers?.["x-forwarded-for"];
  const first = typeof fwd === "string" ? fwd.split(",")[0].trim() : "";
  return first || "unknown";
}

// Secure cookies (and the __Secure- name, which lib/auth/session.ts and proxy.ts also read)
// exactly when the console's address is https; HttpOnly and SameSite=Lax always.
const secureCookies = env().NEXTAUTH_URL?.startsWith("https://") ?? false;

export const authOptions: NextAuthOptions = {
  secret: env().NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  useSecureCookies: secureCookies,
  cookies: {
    sessionToken: {
      name: `${secureCookies ? "__Secure-" : ""}next-auth.session-token`,
      options: { httpOnly: true, sameSite: "lax", path: "/", secure: secureCookies },
    },
  },
  pages: { signIn: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "Sluice account",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, req) {
        const parsed = signInSchema.safeParse(raw);
        if (!parsed.success) throw new Error("Enter an e-mail address and a password.");
        const result = await verifySignIn(parsed.data.email, parsed.data.password, clientAddress(req?.headers));
        if (result.ok) return { id: String(result.user.id), email: result.user.email, name: result.user.name };
        if (result.reason === "throttled") throw new Error(`Too many failed attempts. Try again in ${result.retryAfter} s.`);
        throw new Error("That e-mail and password do not match an active account.");
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    async session({ session, token }) {
      if (session.user) (session.user as { id?: string }).id = token.sub;
      return session;
    },
  },
};
