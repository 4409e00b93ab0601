// sequelize-cli configuration: one database, named by DATABASE_URL (mariadb://…).
const url = process.env.DATABASE_URL;
if (!url) throw new Error("DATABASE_URL is not set (npm start and npm test set it for you)");

const common = {
  url,
  dialect: "mariadb",
  logging: false,
  timezone: "+00:00",
  dialectOptions: { bigIntAsNumber: true, insertIdAsNumber: true, decimalAsNumber: true },
  migrationStorageTableName: "sequelize_meta",
  seederStorage: "sequelize",
  seederStorageTableName: "sequelize_data",
};

module.exports = { development: common, test: common, production: common };
