"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    const { QueryTypes } = queryInterface.sequelize;
    const user = {
      type: Sequelize.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onUpdate: "CASCADE",
      onDelete: "SET NULL",
    };
    // The site's release counter: the next release takes counter + 1 under a row lock.
    await queryInterface.addColumn("sites", "release_counter", { type: Sequelize.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 });
    await queryInterface.sequelize.query(
      "UPDATE sites s SET release_counter = COALESCE((SELECT MAX(r.number) FROM releases r WHERE r.site_id = s.id), 0)",
      { type: QueryTypes.UPDATE },
    );

    // Review of a change: what was submitted (configuration snapshot and the rendered review), who decided, why.
    await queryInterface.addColumn("changes", "submitted_by", user);
    await queryInterface.addColumn("changes", "submitted_at", { type: Sequelize.DATE(3), allowNull: true });
    await queryInterface.addColumn("changes", "note", { type: Sequelize.STRING(1000), allowNull: false, defaultValue: "" });
    await queryInterface.addColumn("changes", "config", { type: Sequelize.JSON, allowNull: true });
    await queryInterface.addColumn("changes", "review", { type: Sequelize.JSON, allowNull: true });
    await queryInterface.addColumn("changes", "reviewed_by", user);
    await queryInterface.addColumn("changes", "reviewed_at", { type: Sequelize.DATE(3), allowNull: true });
    await queryInterface.addColumn("changes", "review_comment", { type: Sequelize.STRING(2000), allowNull: false, defaultValue: "" });
    // A rollback change restores the configuration of this release number.
    await queryInterface.addColumn("changes", "rollback_of", { type: Sequelize.INTEGER.UNSIGNED, allowNull: true });

    await queryInterface.addColumn("releases", "rollback_of", { type: Sequelize.INTEGER.UNSIGNED, allowNull: true });
    // Urgent path: released without a second person, with a written reason; flagged in the history.
    await queryInterface.addColumn("releases", "urgent_reason", { type: Sequelize.STRING(2000), allowNull: true });

    await queryInterface.addColumn("caution_acknowledgements", "change_id", {
      type: Sequelize.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "changes", key: "id" },
      onUpdate: "CASCADE",
      onDelete: "SET NULL",
    });

    // One signed bundle per gateway and release, stored as the exact bytes served.
    await queryInterface.createTable("bundles", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      release_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "releases", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      gateway_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        references: { model: "gateways", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "RESTRICT",
      },
      gateway_slug: { type: Sequelize.STRING(64), allowNull: false },
      digest: { type: Sequelize.CHAR(64), allowNull: false },
      key_id: { type: Sequelize.STRING(64), allowNull: false },
      signature: { type: Sequelize.STRING(200), allowNull: false },
      bytes: { type: Sequelize.BLOB("long"), allowNull: false },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    await queryInterface.addIndex("bundles", ["release_id", "gateway_id"], { unique: true, name: "bundles_release_gateway" });
    await queryInterface.addIndex("bundles", ["gateway_id", "release_id"]);
  },
  async down(queryInterface) {
    await queryInterface.dropTable("bundles");
    // Plain ALTERs: removeColumn's foreign-key lookup trips over the mariadb 3 driver's result metadata.
    const q = (sql) => queryInterface.sequelize.query(sql);
    await q("ALTER TABLE caution_acknowledgements DROP FOREIGN KEY caution_acknowledgements_change_id_foreign_idx");
    await q("ALTER TABLE caution_acknowledgements DROP COLUMN change_id");
    await q("ALTER TABLE releases DROP COLUMN urgent_reason, DROP COLUMN rollback_of");
    for (const fk of ["changes_submitted_by_foreign_idx", "changes_reviewed_by_foreign_idx"]) await q(`ALTER TABLE changes DROP FOREIGN KEY ${fk}`);
    await q(
      "ALTER TABLE changes DROP COLUMN rollback_of, DROP COLUMN review_comment, DROP COLUMN reviewed_at, DROP COLUMN reviewed_by, DROP COLUMN review, DROP COLUMN config, DROP COLUMN note, DROP COLUMN submitted_at, DROP COLUMN submitted_by",
    );
    await q("ALTER TABLE sites DROP COLUMN release_counter");
  },
};
