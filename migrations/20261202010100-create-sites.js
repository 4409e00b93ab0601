"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable("sites", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      slug: { type: Sequelize.STRING(64), allowNull: false, unique: true },
      name: { type: Sequelize.STRING(120), allowNull: false },
      time_zone: { type: Sequelize.STRING(64), allowNull: false },
      uplink_budget_kbps: { type: Sequelize.DECIMAL(12, 3), allowNull: false },
      storage_price_per_gb_month: { type: Sequelize.DECIMAL(12, 4), allowNull: false },
      retention_months: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      default_handling: {
        type: Sequelize.ENUM("pass-through", "drop", "profile"),
        allowNull: false,
        defaultValue: "pass-through",
      },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.sequelize.query(
      "ALTER TABLE sites ADD CONSTRAINT sites_positive CHECK (uplink_budget_kbps > 0 AND storage_price_per_gb_month >= 0 AND retention_months >= 1)",
    );
  },
  async down(queryInterface) {
    await queryInterface.dropTable("sites");
  },
};
