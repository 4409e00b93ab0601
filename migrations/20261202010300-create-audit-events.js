"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable("audit_events", {
      id: { type: Sequelize.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      actor_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      actor_email: { type: Sequelize.STRING(191), allowNull: false },
      action: { type: Sequelize.STRING(64), allowNull: false },
      entity_type: { type: Sequelize.STRING(32), allowNull: false },
      entity_id: { type: Sequelize.INTEGER.UNSIGNED, allowNull: true },
      entity_label: { type: Sequelize.STRING(191), allowNull: false, defaultValue: "" },
      // No foreign key: the history of a deleted site stays readable.
      site_id: { type: Sequelize.INTEGER.UNSIGNED, allowNull: true },
      before_json: { type: Sequelize.JSON, allowNull: true },
      after_json: { type: Sequelize.JSON, allowNull: true },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("audit_events", ["created_at"]);
    await queryInterface.addIndex("audit_events", ["site_id", "created_at"]);
    await queryInterface.addIndex("audit_events", ["actor_id", "created_at"]);
    await queryInterface.addIndex("audit_events", ["action", "created_at"]);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("audit_events");
  },
};
