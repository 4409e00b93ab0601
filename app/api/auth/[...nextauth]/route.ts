import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";

// GET, POST /api/auth/[...nextauth] – sign-in, sign-out and session endpoints
const handler = NextAuth(authOptions);

export { handler as GET, handler as POST };
