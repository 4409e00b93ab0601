import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  serverExternalPackages: ["sequelize", "mariadb", "nodemailer", "mailparser"],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
