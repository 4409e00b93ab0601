"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable("tag_groups", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "sites", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      name: { type: Sequelize.STRING(80), allowNull: false },
      description: { type: Sequelize.STRING(500), allowNull: false, defaultValue: "" },
      // Lower runs first: a tag belongs to the first group by priority that matches it.
      priority: { type: Sequelize.INTEGER, allowNull: false },
      regulated: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: false },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("tag_groups", ["site_id", "name"], { unique: true, name: "tag_groups_site_name" });
    await queryInterface.addIndex("tag_groups", ["site_id", "priority"]);

    // A group's selector as ordered rows: glob patterns, filters, explicit include and exclude.
    await queryInterface.createTable("tag_group_rules", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      group_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "tag_groups", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      position: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      field: {
        type: Sequelize.ENUM("pattern", "unit", "kind", "area", "equipment", "gateway", "min_period_ms", "max_period_ms", "include", "exclude"),
        allowNull: false,
      },
      value: { type: "VARCHAR(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin", allowNull: false },
    });
    await queryInterface.addIndex("tag_group_rules", ["group_id", "position"], { unique: true, name: "tag_group_rules_order" });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("tag_group_rules");
    await queryInterface.dropTable("tag_groups");
  },
};
