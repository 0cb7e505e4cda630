import type { Migration } from "../migrator";

// Talking before buying: one message thread per listing and buyer (with the listing's seller), the
// messages in it, and offers. A thread's read marks are per side, so the header's unread count is
// one indexed count over the threads (no per-message read rows). Offers form chains: a counter is a
// new row (made_by 'seller' or 'buyer') whose parent is the offer it answers; the answered one
// becomes 'countered'. At most one offer per buyer and listing is open at a time.

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(sql`
    CREATE TABLE message_threads (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      buyer_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      seller_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      CHECK (buyer_id <> seller_id),
      CONSTRAINT message_threads_listing_buyer_unique UNIQUE (listing_id, buyer_id),
      buyer_read_at timestamptz,
      seller_read_at timestamptz,
      -- null until the first message (or offer); the thread lists order by it
      last_message_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE INDEX message_threads_buyer_idx ON message_threads (buyer_id, last_message_at DESC)`);
  await q(`CREATE INDEX message_threads_seller_idx ON message_threads (seller_id, last_message_at DESC)`);
  // The header's count reads only these two partial indexes (app/messages/unread.server.ts).
  await q(sql`
    CREATE INDEX message_threads_buyer_unread_idx ON message_threads (buyer_id)
      WHERE last_message_at > coalesce(buyer_read_at, '-infinity'::timestamptz)`);
  await q(sql`
    CREATE INDEX message_threads_seller_unread_idx ON message_threads (seller_id)
      WHERE last_message_at > coalesce(seller_read_at, '-infinity'::timestamptz)`);
  await q(sql`
    CREATE TABLE messages (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      thread_id uuid NOT NULL REFERENCES message_threads(id) ON DELETE CASCADE,
      sender_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      -- stored as the other side sees it: contact details typed before a sale are masked on the way in
      body text NOT NULL CHECK (char_length(body) BETWEEN 1 AND 4000),
      masked boolean NOT NULL DEFAULT false,
      created_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE INDEX messages_thread_idx ON messages (thread_id, created_at)`);
  await q(sql`
    CREATE TABLE offers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      buyer_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      seller_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      CHECK (buyer_id <> seller_id),
      thread_id uuid REFERENCES message_threads(id) ON DELETE SET NULL,
      amount_minor integer NOT NULL CHECK (amount_minor > 0),
      currency char(3) NOT NULL,
      made_by text NOT NULL CHECK (made_by IN ('buyer', 'seller')),
      parent_offer_id uuid REFERENCES offers(id) ON DELETE SET NULL,
      state text NOT NULL DEFAULT 'open'
        CHECK (state IN ('open', 'accepted', 'declined', 'countered', 'expired', 'withdrawn', 'used')),
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      checkout_until timestamptz,
      CHECK ((state IN ('accepted', 'used')) = (accepted_at IS NOT NULL AND checkout_until IS NOT NULL)),
      decided_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE UNIQUE INDEX offers_one_open_idx ON offers (listing_id, buyer_id) WHERE state = 'open'`);
  await q(`CREATE INDEX offers_accepted_idx ON offers (listing_id, buyer_id) WHERE state = 'accepted'`);
  await q(`CREATE INDEX offers_thread_idx ON offers (thread_id, created_at)`);
};

export const down: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(`DROP TABLE IF EXISTS offers`);
  await q(`DROP TABLE IF EXISTS messages`);
  await q(`DROP TABLE IF EXISTS message_threads`);
};
