import type { Migration } from "../migrator";

// When an account's owner was last told about failed sign-ins to it: the warning goes out once an
// hour at most, however many guesses arrive.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE users ADD COLUMN sign_in_warning_at timestamptz`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE users DROP COLUMN sign_in_warning_at`);
};
