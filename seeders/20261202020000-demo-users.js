"use strict";
// Demo sign-ins, one per role. Demo data only: the passwords are printed by `npm start`.
const bcrypt = require("bcryptjs");

const USERS = [
  { email: "ada.admin@demo.invalid", name: "Ada Marsh", role: "admin", password: "demo-admin-pass" },
  { email: "rui.reviewer@demo.invalid", name: "Rui Calder", role: "reviewer", password: "demo-reviewer-pass" },
  { email: "eli.engineer@demo.invalid", name: "Eli Brennan", role: "engineer", password: "demo-engineer-pass" },
  { email: "vic.viewer@demo.invalid", name: "Vic Holloway", role: "viewer", password: "demo-viewer-pass" },
];

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  USERS,
  async up(queryInterface) {
    const now = new Date();
    const rows = [];
    for (const u of USERS) {
      rows.push({
        email: u.email,
        name: u.name,
        role: u.role,
        password_hash: await bcrypt.hash(u.password, 10),
        active: true,
        created_at: now,
        updated_at: now,
      });
    }
    await queryInterface.bulkInsert("users", rows, { ignoreDuplicates: true });
  },
  async down(queryInterface) {
    await queryInterface.bulkDelete("users", { email: USERS.map((u) => u.email) });
  },
};
