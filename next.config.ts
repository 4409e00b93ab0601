import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  serverExternalPackages: ["sequelize", "mariadb"],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
