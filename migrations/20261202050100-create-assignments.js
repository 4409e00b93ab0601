"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    const user = (allowNull) => ({
      type: Sequelize.INTEGER.UNSIGNED,
      allowNull,
      references: { model: "users", key: "id" },
      onUpdate: "CASCADE",
      onDelete: "SET NULL",
    });
    // Tag group → one pinned profile revision, with the group's parameter overrides.
    await queryInterface.createTable("assignments", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      group_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "tag_groups", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      profile_revision_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "profile_revisions", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      overrides: { type: Sequelize.JSON, allowNull: false },
      updated_by: user(true),
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("assignments", ["group_id"], { unique: true, name: "assignments_group_unique" });
    // Overrides for single tags of an assigned group (the one noisy transmitter).
    await queryInterface.createTable("assignment_tag_overrides", {
      assignment_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        primaryKey: true,
        references: { model: "assignments", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      tag_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        primaryKey: true,
        references: { model: "tags", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      overrides: { type: Sequelize.JSON, allowNull: false },
    });
    // An engineer's explicit acknowledgement of a caution before a lossy step reaches a regulated group.
    await queryInterface.createTable("caution_acknowledgements", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "sites", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      // Kept by name as well: the record outlives a deleted group.
      group_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "tag_groups", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      group_name: { type: Sequelize.STRING(80), allowNull: false },
      profile_revision_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "profile_revisions", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      caution_id: { type: Sequelize.STRING(64), allowNull: false },
      caution_text: { type: Sequelize.TEXT, allowNull: false },
      user_id: user(true),
      user_email: { type: Sequelize.STRING(191), allowNull: false },
      acknowledged_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("caution_acknowledgements", ["group_id", "acknowledged_at"]);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("caution_acknowledgements");
    await queryInterface.dropTable("assignment_tag_overrides");
    await queryInterface.dropTable("assignments");
  },
};
