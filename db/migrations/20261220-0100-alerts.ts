import type { Migration } from "../migrator";

// Keeping track: the watch notices sent (a burst of edits mails a watcher once per window), spec
// alerts (a market query a buyer saved, stored as the market's canonical query string), the listings
// each alert has found (one row per pair, so a listing is never sent twice for one alert; the daily
// digest sends the rows not yet mailed), and the unsubscribe links (only the token's hash is kept).

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(`ALTER TABLE users ADD COLUMN watch_mail_stopped_at timestamptz`);
  await q(sql`
    CREATE TABLE watch_notices (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      kind text NOT NULL CHECK (kind IN ('price_drop', 'sold', 'withdrawn')),
      price_minor bigint,
      currency char(3),
      sent_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE INDEX watch_notices_recent_idx ON watch_notices (listing_id, kind, user_id, sent_at DESC)`);
  await q(sql`
    CREATE TABLE spec_alerts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 80),
      query text NOT NULL CHECK (char_length(query) <= 2000),
      frequency text NOT NULL DEFAULT 'instant' CHECK (frequency IN ('instant', 'daily', 'off')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE INDEX spec_alerts_user_idx ON spec_alerts (user_id, created_at)`);
  await q(`CREATE INDEX spec_alerts_mailing_idx ON spec_alerts (query) WHERE frequency <> 'off'`);
  await q(sql`
    CREATE TABLE spec_alert_hits (
      alert_id uuid NOT NULL REFERENCES spec_alerts(id) ON DELETE CASCADE,
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      found_at timestamptz NOT NULL DEFAULT now(),
      mailed_at timestamptz,
      PRIMARY KEY (alert_id, listing_id)
    )`);
  await q(`CREATE INDEX spec_alert_hits_waiting_idx ON spec_alert_hits (alert_id) WHERE mailed_at IS NULL`);
  await q(sql`
    CREATE TABLE unsubscribe_tokens (
      token_hash text PRIMARY KEY,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      -- what the link stops: the watch notices, one alert's mail, or every alert's (a digest's header)
      list text NOT NULL CHECK (list IN ('watch', 'alert', 'alerts')),
      alert_id uuid REFERENCES spec_alerts(id) ON DELETE CASCADE,
      CHECK ((list = 'alert') = (alert_id IS NOT NULL)),
      created_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL
    )`);
  await q(`CREATE INDEX unsubscribe_tokens_expiry_idx ON unsubscribe_tokens (expires_at)`);
};

export const down: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(`DROP TABLE IF EXISTS unsubscribe_tokens`);
  await q(`DROP TABLE IF EXISTS spec_alert_hits`);
  await q(`DROP TABLE IF EXISTS spec_alerts`);
  await q(`DROP TABLE IF EXISTS watch_notices`);
  await q(`ALTER TABLE users DROP COLUMN IF EXISTS watch_mail_stopped_at`);
};
