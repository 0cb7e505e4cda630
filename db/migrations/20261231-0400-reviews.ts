import type { Migration } from "../migrator";

// Reviews: after a released order its buyer rates the seller once (1–5 and a short text), the seller
// answers once, and a moderator may hide an abusive one with a note (the audit trail keeps who and why).
// One review per order (the primary key); seller_id is kept on the row so a seller's page reads its
// reviews through one index. The sold-price index reads released orders joined to their listings by
// maker and model: the expression index lets it find a model's units without scanning the market.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE reviews (
      id uuid PRIMARY KEY,
      order_id uuid NOT NULL UNIQUE REFERENCES orders(id) ON DELETE RESTRICT,
      seller_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      buyer_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      rating smallint NOT NULL CHECK (rating BETWEEN 1 AND 5),
      body text NOT NULL CHECK (char_length(body) BETWEEN 1 AND 1000),
      answer text NULL CHECK (answer IS NULL OR char_length(answer) BETWEEN 1 AND 1000),
      answered_at timestamptz NULL,
      hidden_at timestamptz NULL,
      hidden_by uuid NULL REFERENCES users(id) ON DELETE RESTRICT,
      hidden_note text NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((answer IS NULL) = (answered_at IS NULL)),
      CHECK ((hidden_at IS NULL) = (hidden_note IS NULL))
    )`);
  await qi.sequelize.query(`CREATE INDEX reviews_seller_created ON reviews (seller_id, created_at DESC)`);
  await qi.sequelize.query(
    `CREATE INDEX listings_maker_model_key ON listings ((lower(regexp_replace(btrim(maker), '\\s+', ' ', 'g'))), (lower(regexp_replace(btrim(model), '\\s+', ' ', 'g'))))`,
  );
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP INDEX IF EXISTS listings_maker_model_key`);
  await qi.sequelize.query(`DROP TABLE IF EXISTS reviews`);
};
