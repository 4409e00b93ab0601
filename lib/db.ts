import "server-only";
import { Sequelize } from "sequelize";
import { env } from "@/lib/env";

const globalForDb = globalThis as unknown as { sluiceSequelize?: Sequelize };

/**
 * The one Sequelize instance. The mariadb 3.x driver returns BigInt for BIGINT columns,
 * insert ids and COUNT(); the options below make them plain numbers (tested).
 */
export function createSequelize(url: string): Sequelize {
  return new Sequelize(url, {
    dialect: "mariadb",
    logging: env().SLUICE_SQL_LOG === "1" ? console.log : false,
    timezone: "+00:00",
    dialectOptions: { bigIntAsNumber: true, insertIdAsNumber: true, decimalAsNumber: true, connectTimeout: 5000 },
    pool: { max: 10, min: 0, idle: 10_000, acquire: 10_000 },
    define: { underscored: true },
  });
}

export const sequelize: Sequelize = globalForDb.sluiceSequelize ?? createSequelize(env().DATABASE_URL);
if (env().NODE_ENV !== "production") globalForDb.sluiceSequelize = sequelize;
