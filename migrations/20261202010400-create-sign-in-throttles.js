"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    // One row per throttle key (an account+address pair, or an address alone),
    // shared by every app instance through the database.
    await queryInterface.createTable("sign_in_throttles", {
      throttle_key: { type: Sequelize.STRING(255), primaryKey: true },
      failures: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      last_failure_at: { type: Sequelize.DATE(3), allowNull: false },
      blocked_until: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("sign_in_throttles", ["last_failure_at"]);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("sign_in_throttles");
  },
};
