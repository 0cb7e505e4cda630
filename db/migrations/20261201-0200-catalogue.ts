import type { Migration } from "../migrator";

// The catalogue: workshops, listings with their photos, bench sheet and restoration log.
// Enumerations are CHECK constraints (cheap to extend in a later migration, unlike PG enums).
// The lists here must match shared/catalogue.ts; tests/integration/catalogue-model.test.ts compares them.
// Money in integer minor units; times are timestamptz (stored UTC).

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);

  await q(sql`
    CREATE TABLE workshops (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      owner_id uuid NOT NULL UNIQUE REFERENCES users(id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(btrim(name)) BETWEEN 2 AND 120),
      slug citext NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$'),
      about text,
      country char(2) NOT NULL CHECK (country ~ '^[A-Z]{2}$'),
      region text,
      town text,
      verification_status text NOT NULL DEFAULT 'applied'
        CONSTRAINT workshops_verification_known CHECK (verification_status IN ('applied','verified','rejected')),
      verified_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT workshops_verified_has_time CHECK ((verification_status = 'verified') = (verified_at IS NOT NULL))
    )`);
  await q(`CREATE INDEX workshops_verification_idx ON workshops (verification_status, created_at)`);

  await q(sql`
    CREATE TABLE listings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      seller_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      workshop_id uuid REFERENCES workshops(id) ON DELETE SET NULL,
      status text NOT NULL DEFAULT 'draft'
        CONSTRAINT listings_status_known CHECK (status IN ('draft','held','live','sold','withdrawn','removed')),
      category text NOT NULL
        CONSTRAINT listings_category_known CHECK (category IN ('integrated_amplifier','power_amplifier','preamplifier',
          'receiver','phono_stage','turntable','tape_deck','loudspeaker')),
      maker text CHECK (maker IS NULL OR length(btrim(maker)) BETWEEN 1 AND 80),
      model text CHECK (model IS NULL OR length(btrim(model)) BETWEEN 1 AND 80),
      year_from smallint CHECK (year_from BETWEEN 1900 AND 2100),
      year_to smallint CHECK (year_to BETWEEN 1900 AND 2100),
      serial_number text,
      mains_voltage_v smallint CHECK (mains_voltage_v BETWEEN 90 AND 260),
      mains_frequency_hz smallint CHECK (mains_frequency_hz IN (50, 60)),
      mains_switchable boolean NOT NULL DEFAULT false,
      weight_g integer CHECK (weight_g > 0 AND weight_g <= 500000),
      boxed_length_mm integer CHECK (boxed_length_mm > 0 AND boxed_length_mm <= 5000),
      boxed_width_mm integer CHECK (boxed_width_mm > 0 AND boxed_width_mm <= 5000),
      boxed_height_mm integer CHECK (boxed_height_mm > 0 AND boxed_height_mm <= 5000),
      includes_manual boolean NOT NULL DEFAULT false,
      includes_remote boolean NOT NULL DEFAULT false,
      includes_original_packing boolean NOT NULL DEFAULT false,
      price_minor integer CHECK (price_minor > 0),
      currency char(3) NOT NULL DEFAULT 'EUR' CHECK (currency ~ '^[A-Z]{3}$'),
      offers_welcome boolean NOT NULL DEFAULT false,
      country char(2) CHECK (country ~ '^[A-Z]{2}$'),
      region text,
      town text,
      postcode text,
      shipping_options jsonb NOT NULL DEFAULT '[]'::jsonb CHECK (jsonb_typeof(shipping_options) = 'array'),
      handling_days smallint CHECK (handling_days BETWEEN 0 AND 30),
      cosmetic_grade text
        CONSTRAINT listings_cosmetic_known CHECK (cosmetic_grade IN ('showroom','clean','lived_in','rough')),
      service_state text
        CONSTRAINT listings_service_known CHECK (service_state IN ('serviced_measured','working_unserviced','needs_work','parts_only')),
      condition_note text,
      bench_verified boolean NOT NULL DEFAULT false,
      published_at timestamptz,
      held_reason text,
      power_8ohm_w double precision CHECK (power_8ohm_w > 0),
      power_4ohm_w double precision CHECK (power_4ohm_w > 0),
      thd_pct double precision CHECK (thd_pct >= 0),
      snr_db double precision,
      bandwidth_hz double precision CHECK (bandwidth_hz > 0),
      wow_flutter_pct double precision CHECK (wow_flutter_pct >= 0),
      sensitivity_db double precision,
      impedance_ohm double precision CHECK (impedance_ohm > 0),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT listings_era_order CHECK (year_from IS NULL OR year_to IS NULL OR year_from <= year_to),
      -- Anything past draft has what a buyer needs to decide.
      CONSTRAINT listings_publishable CHECK (status = 'draft' OR (
        maker IS NOT NULL AND model IS NOT NULL AND price_minor IS NOT NULL AND country IS NOT NULL
        AND cosmetic_grade IS NOT NULL AND service_state IS NOT NULL AND published_at IS NOT NULL)),
      CONSTRAINT listings_held_has_reason CHECK (status <> 'held' OR held_reason IS NOT NULL)
    )`);
  await q(`CREATE INDEX listings_seller_idx ON listings (seller_id, status, updated_at DESC)`);
  await q(`CREATE INDEX listings_workshop_idx ON listings (workshop_id) WHERE workshop_id IS NOT NULL`);
  // Market queries only ever read live listings: partial indexes keep them small.
  await q(`CREATE INDEX listings_live_recent_idx ON listings (published_at DESC, id) WHERE status = 'live'`);
  await q(`CREATE INDEX listings_live_category_idx ON listings (category, published_at DESC, id) WHERE status = 'live'`);
  await q(`CREATE INDEX listings_live_verified_idx ON listings (published_at DESC, id) WHERE status = 'live' AND bench_verified`);
  await q(`CREATE INDEX listings_live_price_idx ON listings (category, price_minor) WHERE status = 'live'`);
  await q(`CREATE INDEX listings_live_power_idx ON listings (category, power_8ohm_w) WHERE status = 'live' AND power_8ohm_w IS NOT NULL`);
  await q(`CREATE INDEX listings_live_maker_model_idx ON listings (lower(maker), lower(model)) WHERE status IN ('live','sold')`);
  await q(`CREATE INDEX listings_held_idx ON listings (updated_at) WHERE status = 'held'`);

  await q(sql`
    CREATE TABLE listing_photos (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      position smallint NOT NULL CHECK (position BETWEEN 0 AND 23),
      is_cover boolean NOT NULL DEFAULT false,
      status text NOT NULL DEFAULT 'processing'
        CONSTRAINT listing_photos_status_known CHECK (status IN ('processing','ready','failed')),
      original_key text NOT NULL,
      thumb_key text,
      listing_key text,
      zoom_key text,
      content_type text,
      byte_size integer CHECK (byte_size >= 0),
      width integer CHECK (width > 0),
      height integer CHECK (height > 0),
      phash text,
      error text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT listing_photos_ready_has_sizes CHECK (status <> 'ready' OR (
        thumb_key IS NOT NULL AND listing_key IS NOT NULL AND zoom_key IS NOT NULL
        AND width IS NOT NULL AND height IS NOT NULL AND phash IS NOT NULL)),
      CONSTRAINT listing_photos_failed_has_error CHECK (status <> 'failed' OR error IS NOT NULL),
      -- Deferred so a reorder can swap positions inside one transaction.
      CONSTRAINT listing_photos_position_unique UNIQUE (listing_id, position) DEFERRABLE INITIALLY DEFERRED
    )`);
  await q(`CREATE UNIQUE INDEX listing_photos_one_cover ON listing_photos (listing_id) WHERE is_cover`);
  await q(`CREATE INDEX listing_photos_phash_idx ON listing_photos (phash) WHERE phash IS NOT NULL`);

  await q(sql`
    CREATE TABLE bench_sheets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      listing_id uuid NOT NULL UNIQUE REFERENCES listings(id) ON DELETE CASCADE,
      sheet jsonb NOT NULL CHECK (jsonb_typeof(sheet) = 'object'),
      verdict jsonb CHECK (verdict IS NULL OR jsonb_typeof(verdict) = 'object'),
      checked_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT bench_sheets_verdict_has_time CHECK ((verdict IS NULL) = (checked_at IS NULL))
    )`);

  await q(sql`
    CREATE TABLE restoration_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      done_on date NOT NULL CHECK (done_on >= DATE '1900-01-01'),
      work text NOT NULL CHECK (length(btrim(work)) BETWEEN 1 AND 4000),
      parts jsonb NOT NULL DEFAULT '[]'::jsonb CHECK (jsonb_typeof(parts) = 'array'),
      technician text,
      readings_before jsonb NOT NULL DEFAULT '[]'::jsonb CHECK (jsonb_typeof(readings_before) = 'array'),
      readings_after jsonb NOT NULL DEFAULT '[]'::jsonb CHECK (jsonb_typeof(readings_after) = 'array'),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE INDEX restoration_entries_listing_idx ON restoration_entries (listing_id, done_on)`);
};

export const down: Migration = async ({ context: qi }) => {
  for (const table of ["restoration_entries", "bench_sheets", "listing_photos", "listings", "workshops"]) {
    await qi.sequelize.query(`DROP TABLE IF EXISTS ${table}`);
  }
};
