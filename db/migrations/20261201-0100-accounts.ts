import { DataTypes } from "sequelize";
import type { Migration } from "../migrator";

// Accounts, sign-in identities and one-time tokens. Roles are a set on the user: every account is a
// buyer; seller, workshop, moderator and admin are granted.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`CREATE EXTENSION IF NOT EXISTS citext`);
  await qi.sequelize.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);
  await qi.createTable("users", {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal("gen_random_uuid()") },
    email: { type: "CITEXT", allowNull: false, unique: true },
    email_verified_at: { type: DataTypes.DATE },
    password_hash: { type: DataTypes.TEXT },
    display_name: { type: DataTypes.TEXT, allowNull: false },
    roles: {
      type: DataTypes.ARRAY(DataTypes.TEXT),
      allowNull: false,
      defaultValue: qi.sequelize.literal(`ARRAY['buyer']::text[]`),
    },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "active" },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal("now()") },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal("now()") },
  });
  await qi.sequelize.query(
    `ALTER TABLE users ADD CONSTRAINT users_roles_known CHECK (roles <@ ARRAY['buyer','seller','workshop','moderator','admin']::text[])`,
  );
  await qi.sequelize.query(`ALTER TABLE users ADD CONSTRAINT users_status_known CHECK (status IN ('active','suspended'))`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("users");
};
