import type { Migration } from "../migrator";

// Buying: orders and their state machine's record (order_events), the double-entry ledger, contests,
// the admin's marketplace settings, sellers' payout accounts, and the 'reserved' listing status (a
// unit held for one buyer's checkout, out of the market).
// The state list must match shared/orders.ts ORDER_STATES; tests/integration/orders-guards.test.ts compares them.
// Money in integer minor units with its currency; times are timestamptz (stored UTC).

const sql = String.raw;

const STATES = `'reserved','funded','shipped','arrived','audition','released','contested','refunded','cancelled'`;
// States in which an order holds its unit: no second order may hold the same listing.
const HOLDING = `'reserved','funded','shipped','arrived','audition','contested'`;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);

  await q(`ALTER TABLE listings DROP CONSTRAINT listings_status_known`);
  await q(
    `ALTER TABLE listings ADD CONSTRAINT listings_status_known CHECK (status IN ('draft','held','live','reserved','sold','withdrawn','removed'))`,
  );

  await q(`ALTER TABLE users ADD COLUMN payout_account_id text, ADD COLUMN payouts_enabled boolean NOT NULL DEFAULT false`);

  await q(sql`
    CREATE TABLE marketplace_settings (
      id smallint PRIMARY KEY DEFAULT 1 CHECK (id = 1),
      fee_basis_points integer NOT NULL DEFAULT 800 CHECK (fee_basis_points BETWEEN 0 AND 5000),
      fee_minimum_minor jsonb NOT NULL DEFAULT '{}'::jsonb CHECK (jsonb_typeof(fee_minimum_minor) = 'object'),
      audition_days integer NOT NULL DEFAULT 3 CHECK (audition_days BETWEEN 1 AND 30),
      arrival_assumed_days integer NOT NULL DEFAULT 10 CHECK (arrival_assumed_days BETWEEN 1 AND 60),
      reservation_minutes integer NOT NULL DEFAULT 30 CHECK (reservation_minutes BETWEEN 5 AND 240),
      offer_hours integer NOT NULL DEFAULT 48 CHECK (offer_hours BETWEEN 1 AND 336),
      offer_checkout_hours integer NOT NULL DEFAULT 24 CHECK (offer_checkout_hours BETWEEN 1 AND 168),
      updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(sql`
    INSERT INTO marketplace_settings (id, fee_minimum_minor) VALUES (1,
      '{"EUR":350,"GBP":300,"USD":400,"CHF":350,"SEK":4000,"NOK":4000,"DKK":2500,"PLN":1500,"CZK":9000,"CAD":500,"AUD":550,"JPY":500}'::jsonb)`);

  await q(sql`
    CREATE TABLE orders (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE RESTRICT,
      buyer_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      seller_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      state text NOT NULL DEFAULT 'reserved' CONSTRAINT orders_state_known CHECK (state IN (${STATES})),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      price_minor integer NOT NULL CHECK (price_minor > 0),
      delivery_minor integer NOT NULL DEFAULT 0 CHECK (delivery_minor >= 0),
      delivery_method text NOT NULL CHECK (delivery_method IN ('collection','parcel','freight')),
      delivery_zone text NOT NULL CHECK (delivery_zone IN ('domestic','nearby','worldwide')),
      fee_minor integer CHECK (fee_minor >= 0),
      offer_id uuid,
      checkout_session_id text,
      payment_intent_id text,
      charge_id text,
      transfer_id text,
      refunded_minor integer NOT NULL DEFAULT 0 CHECK (refunded_minor >= 0 AND refunded_minor <= price_minor + delivery_minor),
      reserved_until timestamptz NOT NULL,
      funded_at timestamptz,
      ship_by timestamptz,
      shipped_at timestamptz,
      carrier text,
      tracking_number text,
      arrived_at timestamptz,
      audition_ends_at timestamptz,
      released_at timestamptz,
      closed_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      version integer NOT NULL DEFAULT 0,
      CONSTRAINT orders_not_own CHECK (buyer_id <> seller_id),
      CONSTRAINT orders_shipped_has_tracking CHECK (shipped_at IS NULL OR (carrier IS NOT NULL AND tracking_number IS NOT NULL))
    )`);
  // The guarantee behind "two buyers never hold the same unit", whatever the code above it does.
  await q(`CREATE UNIQUE INDEX orders_one_holder_idx ON orders (listing_id) WHERE state IN (${HOLDING})`);
  await q(`CREATE INDEX orders_buyer_idx ON orders (buyer_id, created_at DESC)`);
  await q(`CREATE INDEX orders_seller_idx ON orders (seller_id, created_at DESC)`);
  await q(`CREATE INDEX orders_contested_idx ON orders (updated_at) WHERE state = 'contested'`);
  await q(`CREATE UNIQUE INDEX orders_checkout_session_idx ON orders (checkout_session_id) WHERE checkout_session_id IS NOT NULL`);
  await q(`CREATE UNIQUE INDEX orders_payment_intent_idx ON orders (payment_intent_id) WHERE payment_intent_id IS NOT NULL`);

  await q(sql`
    CREATE TABLE order_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      -- Written order (several changes can share one instant, e.g. arrival opening the audition window).
      seq bigint GENERATED BY DEFAULT AS IDENTITY,
      order_id uuid NOT NULL REFERENCES orders(id) ON DELETE RESTRICT,
      from_state text CHECK (from_state IN (${STATES})),
      to_state text NOT NULL CHECK (to_state IN (${STATES})),
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      actor_kind text NOT NULL CHECK (actor_kind IN ('buyer','seller','moderator','system','provider')),
      note text,
      at timestamptz NOT NULL
    )`);
  await q(`CREATE INDEX order_events_order_idx ON order_events (order_id, seq)`);

  await q(sql`
    CREATE TABLE ledger_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      seq bigint GENERATED BY DEFAULT AS IDENTITY,
      order_id uuid NOT NULL REFERENCES orders(id) ON DELETE RESTRICT,
      movement_id uuid NOT NULL,
      kind text NOT NULL CHECK (kind IN ('buyer_payment','platform_fee','seller_payable','transfer','refund')),
      account text NOT NULL CHECK (account IN ('buyer','escrow','platform_fees','seller_payable','seller_paid')),
      amount_minor bigint NOT NULL CHECK (amount_minor <> 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      provider_ref text,
      at timestamptz NOT NULL
    )`);
  await q(`CREATE INDEX ledger_entries_order_idx ON ledger_entries (order_id, seq)`);
  await q(`CREATE INDEX ledger_entries_movement_idx ON ledger_entries (movement_id)`);
  // A money movement is recorded once: one buyer payment per order, one transfer, one row per refund id.
  await q(`CREATE UNIQUE INDEX ledger_entries_once_idx ON ledger_entries (order_id, kind, account, coalesce(provider_ref, ''))`);

  // History is written once: the ledger and the order's timeline refuse UPDATE and DELETE.
  await q(sql`
    CREATE FUNCTION loadline_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION '% is append-only', TG_TABLE_NAME USING ERRCODE = 'restrict_violation';
    END $$`);
  await q(
    `CREATE TRIGGER ledger_entries_append_only BEFORE UPDATE OR DELETE ON ledger_entries FOR EACH ROW EXECUTE FUNCTION loadline_append_only()`,
  );
  await q(
    `CREATE TRIGGER order_events_append_only BEFORE UPDATE OR DELETE ON order_events FOR EACH ROW EXECUTE FUNCTION loadline_append_only()`,
  );
  // Every movement sums to zero and is in one currency, checked when its transaction commits.
  await q(sql`
    CREATE FUNCTION ledger_movement_balances() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE total numeric; currencies integer;
    BEGIN
      SELECT sum(amount_minor), count(DISTINCT currency) INTO total, currencies FROM ledger_entries WHERE movement_id = NEW.movement_id;
      IF total <> 0 OR currencies <> 1 THEN
        RAISE EXCEPTION 'ledger movement % does not balance (sum %, % currencies)', NEW.movement_id, total, currencies
          USING ERRCODE = 'check_violation';
      END IF;
      RETURN NULL;
    END $$`);
  await q(sql`
    CREATE CONSTRAINT TRIGGER ledger_entries_balance AFTER INSERT ON ledger_entries
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION ledger_movement_balances()`);

  await q(sql`
    CREATE TABLE order_contests (
      order_id uuid PRIMARY KEY REFERENCES orders(id) ON DELETE RESTRICT,
      reason text NOT NULL CHECK (char_length(reason) BETWEEN 1 AND 2000),
      note text,
      readings jsonb,
      photo_keys text[] NOT NULL DEFAULT '{}',
      capture_ids uuid[] NOT NULL DEFAULT '{}',
      comparison jsonb,
      created_at timestamptz NOT NULL DEFAULT now(),
      resolved_by uuid REFERENCES users(id) ON DELETE SET NULL,
      resolution_note text,
      resolved_at timestamptz,
      CHECK ((resolved_at IS NULL) = (resolution_note IS NULL))
    )`);
};

export const down: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(`DROP TABLE IF EXISTS order_contests`);
  await q(`DROP TABLE IF EXISTS ledger_entries`);
  await q(`DROP TABLE IF EXISTS order_events`);
  await q(`DROP FUNCTION IF EXISTS ledger_movement_balances()`);
  await q(`DROP FUNCTION IF EXISTS loadline_append_only()`);
  await q(`DROP TABLE IF EXISTS orders`);
  await q(`DROP TABLE IF EXISTS marketplace_settings`);
  await q(`ALTER TABLE users DROP COLUMN IF EXISTS payouts_enabled, DROP COLUMN IF EXISTS payout_account_id`);
  await q(`UPDATE listings SET status = 'live' WHERE status = 'reserved'`);
  await q(`ALTER TABLE listings DROP CONSTRAINT listings_status_known`);
  await q(
    `ALTER TABLE listings ADD CONSTRAINT listings_status_known CHECK (status IN ('draft','held','live','sold','withdrawn','removed'))`,
  );
};
