"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable("users", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      email: { type: Sequelize.STRING(191), allowNull: false, unique: true },
      name: { type: Sequelize.STRING(120), allowNull: false },
      role: { type: Sequelize.ENUM("viewer", "engineer", "reviewer", "admin"), allowNull: false, defaultValue: "viewer" },
      password_hash: { type: Sequelize.STRING(100), allowNull: false },
      active: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: true },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("users");
  },
};
