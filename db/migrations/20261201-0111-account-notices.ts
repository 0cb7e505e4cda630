import { DataTypes } from "sequelize";
import type { Migration } from "../migrator";

// When an account was last told that someone tried to sign up with its address: the sign-up form
// must not become a way to flood someone's inbox, so that note goes out at most once an hour.
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("users", "exists_notice_at", { type: DataTypes.DATE });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn("users", "exists_notice_at");
};
