import type { NextConfig } from "next";
import { API_CONTENT_SECURITY_POLICY, SECURITY_HEADERS } from "./lib/security/headers";

const nextConfig: NextConfig = {
  serverExternalPackages: ["sequelize", "mariadb", "nodemailer", "mailparser"],
  poweredByHeader: false,
  reactStrictMode: true,
  // Pages get their nonce CSP from proxy.ts; no Cache-Control here (routes set their own).
  async headers() {
    return [
      { source: "/:path*", headers: [...SECURITY_HEADERS] },
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: API_CONTENT_SECURITY_POLICY }] },
    ];
  },
};

export default nextConfig;
