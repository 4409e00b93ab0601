"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    // Sample data saved against a tag group, so estimates and reviewers can re-run it.
    await queryInterface.createTable("sample_sets", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "sites", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      group_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "tag_groups", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      name: { type: Sequelize.STRING(120), allowNull: false },
      // The tag the samples stand for (kind, unit, range, period decide how a profile runs on them).
      tag_name: { type: Sequelize.STRING(191), allowNull: false },
      kind: { type: Sequelize.ENUM("analog", "discrete", "counter"), allowNull: false },
      unit: { type: Sequelize.STRING(32), allowNull: false },
      eu_low: { type: Sequelize.DOUBLE, allowNull: true },
      eu_high: { type: Sequelize.DOUBLE, allowNull: true },
      sample_period_ms: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      samples: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      first_at: { type: Sequelize.DATE(3), allowNull: false },
      last_at: { type: Sequelize.DATE(3), allowNull: false },
      // Times and values, Gorilla-encoded (lossless), and the quality bytes run-length encoded.
      encoding: { type: Sequelize.STRING(16), allowNull: false },
      data: { type: Sequelize.BLOB("long"), allowNull: false },
      byte_size: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      created_by: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("sample_sets", ["group_id", "created_at"]);
    await queryInterface.addIndex("sample_sets", ["site_id", "created_at"]);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("sample_sets");
  },
};
