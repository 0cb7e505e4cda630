import { DataTypes } from "sequelize";
import type { Migration } from "../migrator";

// Sign-in: identities at outside providers, one-time e-mail tokens, and the attempt log that rate
// limiting counts. `session_version` lets a password reset or a suspension end every open session.
export const up: Migration = async ({ context: qi }) => {
  const now = qi.sequelize.literal("now()");
  const uuid = qi.sequelize.literal("gen_random_uuid()");

  await qi.addColumn("users", "session_version", { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 });
  await qi.addColumn("users", "last_sign_in_at", { type: DataTypes.DATE });

  await qi.createTable("oauth_identities", {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: uuid },
    user_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    provider: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.TEXT, allowNull: false },
    email: { type: "CITEXT" },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: now },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: now },
  });
  await qi.addIndex("oauth_identities", ["provider", "subject"], {
    unique: true,
    name: "oauth_identities_provider_subject",
  });
  await qi.addIndex("oauth_identities", ["user_id"], { name: "oauth_identities_user" });

  await qi.createTable("account_tokens", {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: uuid },
    user_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    purpose: { type: DataTypes.TEXT, allowNull: false },
    // SHA-256 of the token in the e-mailed link; the token itself is never stored.
    token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: now },
  });
  await qi.sequelize.query(
    `ALTER TABLE account_tokens ADD CONSTRAINT account_tokens_purpose_known CHECK (purpose IN ('verify_email','reset_password'))`,
  );
  await qi.addIndex("account_tokens", ["user_id", "purpose", "created_at"], { name: "account_tokens_user_purpose" });

  await qi.createTable("sign_in_attempts", {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    // Whatever was typed, lower-cased: limits apply whether or not an account has that address.
    email: { type: "CITEXT", allowNull: false },
    address: { type: DataTypes.TEXT },
    succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
    attempted_at: { type: DataTypes.DATE, allowNull: false, defaultValue: now },
  });
  await qi.addIndex("sign_in_attempts", ["email", "attempted_at"], { name: "sign_in_attempts_email" });
  await qi.addIndex("sign_in_attempts", ["address", "attempted_at"], { name: "sign_in_attempts_address" });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("sign_in_attempts");
  await qi.dropTable("account_tokens");
  await qi.dropTable("oauth_identities");
  await qi.removeColumn("users", "last_sign_in_at");
  await qi.removeColumn("users", "session_version");
};
