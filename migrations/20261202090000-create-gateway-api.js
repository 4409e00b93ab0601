"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { QueryTypes } = queryInterface.sequelize;
    const user = { type: Sequelize.INTEGER.UNSIGNED, allowNull: true, references: { model: "users", key: "id" }, onUpdate: "CASCADE", onDelete: "SET NULL" };
    const gateway = { type: Sequelize.INTEGER.UNSIGNED, allowNull: false, references: { model: "gateways", key: "id" }, onUpdate: "CASCADE", onDelete: "CASCADE" };

    // Gateway tokens: only the SHA-256 of the token is kept; the prefix lets people tell tokens apart.
    await queryInterface.createTable("gateway_tokens", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      gateway_id: gateway,
      token_hash: { type: Sequelize.CHAR(64), allowNull: false },
      prefix: { type: Sequelize.STRING(16), allowNull: false },
      label: { type: Sequelize.STRING(120), allowNull: false, defaultValue: "" },
      created_by: user,
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      last_used_at: { type: Sequelize.DATE(3), allowNull: true },
      revoked_at: { type: Sequelize.DATE(3), allowNull: true },
      revoked_by: user,
    });
    await queryInterface.addIndex("gateway_tokens", ["token_hash"], { unique: true, name: "gateway_tokens_hash" });
    await queryInterface.addIndex("gateway_tokens", ["gateway_id", "created_at"]);

    // What a gateway pulls (the bundle of its site's newest release) and what it last said it runs.
    await queryInterface.addColumn("gateways", "current_bundle_id", {
      type: Sequelize.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "bundles", key: "id" },
      onUpdate: "CASCADE",
      onDelete: "SET NULL",
    });
    await queryInterface.addColumn("gateways", "running_release", { type: Sequelize.INTEGER.UNSIGNED, allowNull: true });
    await queryInterface.addColumn("gateways", "running_digest", { type: Sequelize.CHAR(64), allowNull: true });
    await queryInterface.addColumn("gateways", "applied_at", { type: Sequelize.DATE(3), allowNull: true });
    await queryInterface.addColumn("gateways", "last_check_in_at", { type: Sequelize.DATE(3), allowNull: true });
    await queryInterface.addColumn("gateways", "last_status", { type: Sequelize.ENUM("running", "failed"), allowNull: true });
    await queryInterface.addColumn("gateways", "last_message", { type: Sequelize.STRING(2000), allowNull: true });
    await queryInterface.addColumn("gateways", "failing_since", { type: Sequelize.DATE(3), allowNull: true });
    // A report of a lower release than the last running one; cleared when the target release runs again.
    await queryInterface.addColumn("gateways", "lower_release_reported", { type: Sequelize.INTEGER.UNSIGNED, allowNull: true });
    await queryInterface.addColumn("gateways", "unknown_tags", { type: Sequelize.JSON, allowNull: true });
    // E-mail once per episode: set when the failure / staleness mail went out, cleared on a good check-in.
    await queryInterface.addColumn("gateways", "failure_mailed_at", { type: Sequelize.DATE(3), allowNull: true });
    await queryInterface.addColumn("gateways", "stale_mailed_at", { type: Sequelize.DATE(3), allowNull: true });

    await queryInterface.sequelize.query(
      `UPDATE gateways g SET current_bundle_id = (
         SELECT b.id FROM bundles b JOIN releases r ON r.id = b.release_id
          WHERE b.gateway_id = g.id AND r.site_id = g.site_id
            AND r.number = (SELECT MAX(r2.number) FROM releases r2 WHERE r2.site_id = g.site_id))`,
      { type: QueryTypes.UPDATE },
    );

    // Check-in reports, kept as sent; the same report id twice is stored once.
    await queryInterface.createTable("gateway_reports", {
      id: { type: Sequelize.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      gateway_id: gateway,
      report_id: { type: Sequelize.CHAR(36), allowNull: false },
      release: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
      digest: { type: Sequelize.CHAR(64), allowNull: false },
      status: { type: Sequelize.ENUM("running", "failed"), allowNull: false },
      applied_at: { type: Sequelize.DATE(3), allowNull: false },
      points_in: { type: Sequelize.BIGINT.UNSIGNED, allowNull: false },
      points_out: { type: Sequelize.BIGINT.UNSIGNED, allowNull: false },
      from_at: { type: Sequelize.DATE(3), allowNull: false },
      to_at: { type: Sequelize.DATE(3), allowNull: false },
      message: { type: Sequelize.STRING(2000), allowNull: true },
      unknown_tags: { type: Sequelize.JSON, allowNull: true },
      lower_release: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: false },
      received_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("gateway_reports", ["gateway_id", "report_id"], { unique: true, name: "gateway_reports_gateway_report" });
    await queryInterface.addIndex("gateway_reports", ["gateway_id", "received_at"]);
  },
  async down(queryInterface) {
    const q = (sql) => queryInterface.sequelize.query(sql);
    await queryInterface.dropTable("gateway_reports");
    // Plain ALTERs: removeColumn's foreign-key lookup trips over the mariadb 3 driver's result metadata.
    await q("ALTER TABLE gateways DROP FOREIGN KEY gateways_current_bundle_id_foreign_idx");
    await q(
      "ALTER TABLE gateways DROP COLUMN current_bundle_id, DROP COLUMN running_release, DROP COLUMN running_digest, DROP COLUMN applied_at, " +
        "DROP COLUMN last_check_in_at, DROP COLUMN last_status, DROP COLUMN last_message, DROP COLUMN failing_since, DROP COLUMN lower_release_reported, " +
        "DROP COLUMN unknown_tags, DROP COLUMN failure_mailed_at, DROP COLUMN stale_mailed_at",
    );
    await queryInterface.dropTable("gateway_tokens");
  },
};
