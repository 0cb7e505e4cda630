import type { Migration } from "../migrator";

// Server-side sessions. The cookie carries a random token; this table keeps only its SHA-256, so a
// copy of the database does not sign anyone in. Signing out, a password reset or a suspension set
// revoked_at, which ends the session on its next request. They replace users.session_version.

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(sql`
    CREATE TABLE sessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash text NOT NULL,
      address text,
      user_agent text,
      created_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL,
      last_seen_at timestamptz NOT NULL DEFAULT now(),
      revoked_at timestamptz,
      CONSTRAINT sessions_token_hash_unique UNIQUE (token_hash),
      CONSTRAINT sessions_expiry_after_start CHECK (expires_at > created_at)
    )`);
  // An account's open sessions: the /account list and "sign out everywhere".
  await q(`CREATE INDEX sessions_user_open_idx ON sessions (user_id, last_seen_at DESC) WHERE revoked_at IS NULL`);
  await q(`ALTER TABLE users DROP COLUMN session_version`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE users ADD COLUMN session_version integer NOT NULL DEFAULT 0`);
  await qi.sequelize.query(`DROP TABLE IF EXISTS sessions`);
};
