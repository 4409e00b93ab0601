"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable("gateways", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "sites", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      slug: { type: Sequelize.STRING(64), allowNull: false, unique: true },
      name: { type: Sequelize.STRING(120), allowNull: false },
      description: { type: Sequelize.STRING(500), allowNull: false, defaultValue: "" },
      poll_seconds: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false, defaultValue: 60 },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("gateways", ["site_id"]);
    await queryInterface.sequelize.query(
      "ALTER TABLE gateways ADD CONSTRAINT gateways_poll_range CHECK (poll_seconds BETWEEN 5 AND 86400)",
    );
  },
  async down(queryInterface) {
    await queryInterface.dropTable("gateways");
  },
};
