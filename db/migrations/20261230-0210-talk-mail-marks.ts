import type { Migration } from "../migrator";

// A burst of messages is one e-mail: each side's thread row remembers up to which message it was
// mailed, so the 'message-mail' job sends only what is unread and not yet sent (a retried or doubled
// job sends nothing twice).

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE message_threads ADD COLUMN buyer_mailed_at timestamptz, ADD COLUMN seller_mailed_at timestamptz`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE message_threads DROP COLUMN IF EXISTS buyer_mailed_at, DROP COLUMN IF EXISTS seller_mailed_at`);
};
