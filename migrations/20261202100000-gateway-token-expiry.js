"use strict";

/**
 * Gateway tokens may expire: after `expires_at` the gateway API refuses the token like a
 * revoked one (DESIGN.md "Gateway API": an unknown, expired or revoked token → 401).
 * NULL: the token lives until it is revoked.
 */
/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.addColumn("gateway_tokens", "expires_at", { type: Sequelize.DATE(3), allowNull: true });
  },
  async down(queryInterface) {
    await queryInterface.sequelize.query("ALTER TABLE gateway_tokens DROP COLUMN expires_at");
  },
};
