import type { Migration } from "../migrator";

// Watches: a buyer keeps an eye on a listing. One row per (user, listing); the watch list and the
// alerts issue build on it (price changes, sold, withdrawn), so it keeps its own id and times and is
// indexed both ways: a user's list, newest first, and a listing's watchers for fan-out.

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(sql`
    CREATE TABLE watches (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT watches_user_listing_unique UNIQUE (user_id, listing_id)
    )`);
  await q(`CREATE INDEX watches_user_recent_idx ON watches (user_id, created_at DESC)`);
  await q(`CREATE INDEX watches_listing_idx ON watches (listing_id)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS watches`);
};
