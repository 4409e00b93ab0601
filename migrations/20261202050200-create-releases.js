"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    // An immutable, numbered snapshot of one site's configuration (groups, assignments with
    // their pinned revisions). Drafts are measured and discarded against the latest one.
    await queryInterface.createTable("releases", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "sites", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      number: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      config: { type: Sequelize.JSON, allowNull: false },
      change_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "changes", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      note: { type: Sequelize.STRING(500), allowNull: false, defaultValue: "" },
      released_by: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      released_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("releases", ["site_id", "number"], { unique: true, name: "releases_site_number_unique" });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("releases");
  },
};
