"use strict";

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface, Sequelize) {
    // A change: the edits to one site's configuration since its current release.
    await queryInterface.createTable("changes", {
      id: { type: Sequelize.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      site_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        // RESTRICT: MariaDB refuses a generated column over a cascading foreign key (below).
        references: { model: "sites", key: "id" },
        onUpdate: "RESTRICT",
        onDelete: "RESTRICT",
      },
      state: {
        type: Sequelize.ENUM("draft", "in_review", "approved", "released", "rejected"),
        allowNull: false,
        defaultValue: "draft",
      },
      // The release number the change was started from (null: the site has no release yet).
      base_release: { type: Sequelize.INTEGER.UNSIGNED, allowNull: true },
      created_by: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "SET NULL",
      },
      created_at: { type: Sequelize.DATE(3), allowNull: false },
      updated_at: { type: Sequelize.DATE(3), allowNull: false },
    });
    // At most one open (not yet released) change per site, enforced by the database.
    await queryInterface.sequelize.query(
      "ALTER TABLE changes ADD COLUMN open_site_id INT UNSIGNED AS (IF(state = 'released', NULL, site_id)) PERSISTENT, ADD UNIQUE INDEX changes_one_open (open_site_id)",
    );
    await queryInterface.createTable("change_authors", {
      change_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        primaryKey: true,
        references: { model: "changes", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      user_id: {
        type: Sequelize.INTEGER.UNSIGNED,
        allowNull: false,
        primaryKey: true,
        references: { model: "users", key: "id" },
        onUpdate: "CASCADE",
        onDelete: "CASCADE",
      },
      first_edit_at: { type: Sequelize.DATE(3), allowNull: false },
      last_edit_at: { type: Sequelize.DATE(3), allowNull: false },
    });
  },
  async down(queryInterface) {
    await queryInterface.dropTable("change_authors");
    await queryInterface.dropTable("changes");
  },
};
