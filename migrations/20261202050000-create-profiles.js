"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    // A reusable, site-independent reduction profile; its content lives in revisions.
    await queryInterface.createTable("profiles", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      name: { type: Sequelize.STRING(80), allowNull: false },
      description: { type: Sequelize.STRING(2000), allowNull: false, defaultValue: "" },
      // Comma-separated tag kinds of the latest revision, for filtering the library.
      kinds: { type: Sequelize.STRING(40), allowNull: false },
      latest_revision: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      archived_at: { type: Sequelize.DATE(3), allowNull: true },
      created_by: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("profiles", ["name"], { unique: true, name: "profiles_name_unique" });
    // Every save of a profile is a new, immutable revision.
    await queryInterface.createTable("profile_revisions", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      profile_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "profiles", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      number: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      document: { type: Sequelize.JSON, allowNull: false },
      note: { type: Sequelize.STRING(500), allowNull: false, defaultValue: "" },
      created_by: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("profile_revisions", ["profile_id", "number"], { unique: true, name: "profile_revisions_number_unique" });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("profile_revisions");
    await queryInterface.dropTable("profiles");
  },
};
