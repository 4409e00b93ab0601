"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable("tags", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "sites", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      gateway_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "gateways", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      // Tag names are case-sensitive (PAST1/TT-101/PV ≠ past1/tt-101/pv): binary collation.
      name: { type: "VARCHAR(191) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin", allowNull: false },
      unit: { type: Sequelize.STRING(32), allowNull: false },
      sample_period_ms: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: Sequelize.ENUM("analog", "discrete", "counter"), allowNull: false },
      eu_low: { type: Sequelize.DOUBLE, allowNull: true },
      eu_high: { type: Sequelize.DOUBLE, allowNull: true },
      area: { type: Sequelize.STRING(64), allowNull: true },
      equipment: { type: Sequelize.STRING(64), allowNull: true },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("tags", ["site_id", "name"], { unique: true, name: "tags_site_name" });
    await queryInterface.addIndex("tags", ["gateway_id"]);
    await queryInterface.sequelize.query(
      "ALTER TABLE tags ADD CONSTRAINT tags_range CHECK ((eu_low IS NULL AND eu_high IS NULL) OR (eu_low IS NOT NULL AND eu_high IS NOT NULL AND eu_low < eu_high))",
    );
    await queryInterface.sequelize.query("ALTER TABLE tags ADD CONSTRAINT tags_period CHECK (sample_period_ms BETWEEN 1 AND 86400000)");
  },
  async down(queryInterface) {
    await queryInterface.dropTable("tags");
  },
};
