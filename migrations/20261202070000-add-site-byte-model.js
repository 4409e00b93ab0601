"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    // The plain byte model of a site's estimates: bytes per sample (timestamp, value, framing)
    // plus a transport overhead, and the share of the uplink kept free.
    await queryInterface.addColumn("sites", "bytes_per_sample", { type: Sequelize.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 16 });
    await queryInterface.addColumn("sites", "transport_overhead_pct", { type: Sequelize.DECIMAL(6, 2), allowNull: false, defaultValue: 10 });
    await queryInterface.addColumn("sites", "uplink_headroom_pct", { type: Sequelize.DECIMAL(5, 2), allowNull: false, defaultValue: 20 });
  },
  async down(queryInterface) {
    // Plain ALTER: removeColumn's foreign-key lookup trips over the mariadb 3 driver's result metadata.
    await queryInterface.sequelize.query("ALTER TABLE sites DROP COLUMN uplink_headroom_pct, DROP COLUMN transport_overhead_pct, DROP COLUMN bytes_per_sample");
  },
};
