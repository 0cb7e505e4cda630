import { QueryTypes, type Sequelize, type Transaction } from "sequelize";
import type { Migration } from "../migrator";
import { parseBenchSheet } from "../../shared/bench/schema";
import { listingFacets, type ListingFacets } from "../../shared/listing-facets";

// Search: the facet columns every measured-figure filter reads, the full-text document, prices in
// euros for filtering and sorting across currencies, and the indexes the market's filters and sorts use.
// Facets are the bench's measured readings only (shared/listing-facets.ts), recomputed here for every
// listing with a sheet. Rates are the admin's (`currency_rates`); triggers keep `price_eur_minor` in
// step with them (docs/decisions/0011). All market indexes are partial on live rows.

const sql = String.raw;

// Rates for a fresh database, foreign currency per euro; the admin keeps them current.
const STARTING_RATES: [string, string, number][] = [
  ["EUR", "1", 2],
  ["GBP", "0.86", 2],
  ["USD", "1.08", 2],
  ["CHF", "0.95", 2],
  ["SEK", "11.4", 2],
  ["NOK", "11.6", 2],
  ["DKK", "7.46", 2],
  ["PLN", "4.3", 2],
  ["CZK", "25", 2],
  ["CAD", "1.47", 2],
  ["AUD", "1.65", 2],
  ["JPY", "160", 0],
];

const NEW_FACETS = sql`
  ADD COLUMN thdn_pct double precision CHECK (thdn_pct >= 0),
  ADD COLUMN f3_low_hz double precision CHECK (f3_low_hz > 0),
  ADD COLUMN damping_factor double precision CHECK (damping_factor > 0),
  ADD COLUMN riaa_deviation_db double precision CHECK (riaa_deviation_db >= 0),
  ADD COLUMN gain_db double precision,
  ADD COLUMN noise_uv double precision CHECK (noise_uv > 0),
  ADD COLUMN speed_error_pct double precision CHECK (speed_error_pct >= 0)`;

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });

    // Facets. The upper −3 dB point keeps its values under a name that says which point it is; the
    // impedance column now holds the measured minimum only (it held the rated figure when there was one).
    await q(`ALTER TABLE listings RENAME COLUMN bandwidth_hz TO f3_high_hz`);
    await q(`ALTER TABLE listings RENAME COLUMN impedance_ohm TO impedance_min_ohm`);
    await q(`ALTER TABLE listings ${NEW_FACETS}`);
    await q(`COMMENT ON COLUMN listings.thd_pct IS 'THD %, worse channel; THD+N where only that was measured (it bounds THD from above)'`);
    await q(`COMMENT ON COLUMN listings.thdn_pct IS 'THD+N %, worse channel'`);
    await backfillFacets(qi.sequelize, transaction);

    // Full text: maker and model as typed and split at punctuation ("XQ/55" also as "xq" "55"), the
    // category's words, the seller's description; unaccented; each in the plain and the English
    // configuration so a query matches a word's stem and its prefix.
    await q(`CREATE EXTENSION IF NOT EXISTS unaccent`);
    await q(sql`
      CREATE FUNCTION loadline_unaccent(text) RETURNS text
      LANGUAGE sql IMMUTABLE PARALLEL SAFE STRICT
      AS $$ SELECT public.unaccent('public.unaccent'::regdictionary, $1) $$`);
    await q(sql`
      CREATE FUNCTION loadline_category_words(category text) RETURNS text
      LANGUAGE sql IMMUTABLE PARALLEL SAFE STRICT
      AS $$ SELECT CASE category
        WHEN 'integrated_amplifier' THEN 'integrated amplifier amp stereo'
        WHEN 'power_amplifier' THEN 'power amplifier amp endstage'
        WHEN 'preamplifier' THEN 'preamplifier preamp control amplifier'
        WHEN 'receiver' THEN 'receiver tuner amplifier amp'
        WHEN 'phono_stage' THEN 'phono stage preamp riaa'
        WHEN 'turntable' THEN 'turntable record player deck'
        WHEN 'tape_deck' THEN 'tape deck cassette recorder'
        WHEN 'loudspeaker' THEN 'loudspeaker speaker speakers'
        ELSE '' END $$`);
    await q(sql`
      CREATE FUNCTION loadline_search_doc(maker text, model text, category text, note text) RETURNS tsvector
      LANGUAGE sql IMMUTABLE PARALLEL SAFE
      AS $$ SELECT
        setweight(to_tsvector('simple'::regconfig, loadline_unaccent(coalesce(maker, '') || ' ' || coalesce(model, ''))), 'A') ||
        setweight(to_tsvector('simple'::regconfig,
          regexp_replace(loadline_unaccent(coalesce(maker, '') || ' ' || coalesce(model, '')), '[^[:alnum:]]+', ' ', 'g')), 'A') ||
        setweight(to_tsvector('english'::regconfig, loadline_category_words(category)), 'B') ||
        setweight(to_tsvector('simple'::regconfig, loadline_category_words(category)), 'B') ||
        setweight(to_tsvector('english'::regconfig, loadline_unaccent(coalesce(note, ''))), 'C') ||
        setweight(to_tsvector('simple'::regconfig, loadline_unaccent(coalesce(note, ''))), 'C') $$`);
    // A buyer's words to a query: every word must match, as a prefix of a word or of its stem; common
    // English words are left out unless nothing else was typed. Null when nothing searchable was typed.
    await q(sql`
      CREATE FUNCTION loadline_search_query(q text) RETURNS tsquery
      LANGUAGE sql IMMUTABLE PARALLEL SAFE STRICT
      AS $$
        WITH words AS (
          SELECT w.lexeme AS word,
                 (SELECT min(e.lexeme) FROM unnest(to_tsvector('english'::regconfig, w.lexeme)) e) AS stem
            FROM unnest(to_tsvector('simple'::regconfig, loadline_unaccent(q))) w
        ), kept AS (
          SELECT * FROM words WHERE stem IS NOT NULL OR NOT EXISTS (SELECT 1 FROM words WHERE stem IS NOT NULL)
        )
        SELECT string_agg(
                 CASE WHEN stem IS NULL OR stem = word THEN format('%L:*', word)
                      ELSE format('(%L:* | %L:*)', word, stem) END, ' & ' ORDER BY word)::tsquery
          FROM kept $$`);
    await q(sql`
      ALTER TABLE listings ADD COLUMN search_doc tsvector
        GENERATED ALWAYS AS (loadline_search_doc(maker, model, category, condition_note)) STORED`);

    // The zones a courier (parcel or freight) serves, from the shipping options: deliverTo reads it.
    await q(sql`
      ALTER TABLE listings ADD COLUMN courier_zones text[] NOT NULL GENERATED ALWAYS AS (array_remove(ARRAY[
        CASE WHEN jsonb_path_exists(shipping_options,
          '$[*] ? ((@.method == "parcel" || @.method == "freight") && exists(@.prices.domestic))') THEN 'domestic' END,
        CASE WHEN jsonb_path_exists(shipping_options,
          '$[*] ? ((@.method == "parcel" || @.method == "freight") && exists(@.prices.nearby))') THEN 'nearby' END,
        CASE WHEN jsonb_path_exists(shipping_options,
          '$[*] ? ((@.method == "parcel" || @.method == "freight") && exists(@.prices.worldwide))') THEN 'worldwide' END
      ], NULL)) STORED`);

    // Currencies.
    await q(sql`
      CREATE TABLE currency_rates (
        currency char(3) PRIMARY KEY CHECK (currency ~ '^[A-Z]{3}$'),
        per_eur numeric NOT NULL CHECK (per_eur > 0),
        minor_digits smallint NOT NULL DEFAULT 2 CHECK (minor_digits BETWEEN 0 AND 3),
        updated_at timestamptz NOT NULL DEFAULT now(),
        updated_by uuid REFERENCES users(id) ON DELETE SET NULL
      )`);
    for (const [currency, perEur, digits] of STARTING_RATES) {
      await qi.sequelize.query(`INSERT INTO currency_rates (currency, per_eur, minor_digits) VALUES (:currency, :perEur, :digits)`, {
        replacements: { currency, perEur, digits },
        transaction,
      });
    }
    // An amount in a currency's minor units to euro cents at the admin's rate; null without a rate.
    await q(sql`
      CREATE FUNCTION loadline_eur_minor(amount_minor bigint, currency_code char(3)) RETURNS bigint
      LANGUAGE sql STABLE PARALLEL SAFE STRICT
      AS $$ SELECT round(amount_minor * power(10::numeric, 2 - r.minor_digits) / r.per_eur)::bigint
              FROM currency_rates r WHERE r.currency = currency_code $$`);
    await q(`ALTER TABLE listings ADD COLUMN price_eur_minor bigint`);
    await q(sql`
      CREATE FUNCTION listings_price_eur() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        NEW.price_eur_minor := loadline_eur_minor(NEW.price_minor, NEW.currency);
        RETURN NEW;
      END $$`);
    await q(sql`
      CREATE TRIGGER listings_price_eur BEFORE INSERT OR UPDATE OF price_minor, currency ON listings
        FOR EACH ROW EXECUTE FUNCTION listings_price_eur()`);
    await q(sql`
      CREATE FUNCTION currency_rates_reprice() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        UPDATE listings SET price_eur_minor = loadline_eur_minor(price_minor, currency)
         WHERE currency = NEW.currency AND price_eur_minor IS DISTINCT FROM loadline_eur_minor(price_minor, currency);
        RETURN NULL;
      END $$`);
    await q(sql`
      CREATE TRIGGER currency_rates_reprice AFTER INSERT OR UPDATE OF per_eur, minor_digits ON currency_rates
        FOR EACH ROW EXECUTE FUNCTION currency_rates_reprice()`);
    await q(`UPDATE listings SET price_eur_minor = loadline_eur_minor(price_minor, currency)`);

    // Indexes. Newest-first and the category already have theirs (catalogue migration).
    await q(`DROP INDEX listings_live_price_idx`);
    await q(`CREATE INDEX listings_live_search_idx ON listings USING gin (search_doc) WHERE status = 'live'`);
    await q(`CREATE INDEX listings_live_price_eur_idx ON listings (price_eur_minor, id) WHERE status = 'live'`);
    await q(`CREATE INDEX listings_live_category_price_idx ON listings (category, price_eur_minor, id) WHERE status = 'live'`);
    // Price per measured watt into 8 Ω; units without the figure sort last (infinity). Two expressions:
    // figures from any measured sheet, or from bench-verified sheets only.
    await q(sql`
      CREATE FUNCTION loadline_per_watt(price_eur_minor bigint, watts double precision) RETURNS double precision
      LANGUAGE sql IMMUTABLE PARALLEL SAFE
      AS $$ SELECT coalesce(price_eur_minor / watts, 'Infinity'::double precision) $$`);
    await q(
      `CREATE INDEX listings_live_per_watt_idx ON listings (loadline_per_watt(price_eur_minor, power_8ohm_w), id) WHERE status = 'live'`,
    );
    await q(sql`
      CREATE INDEX listings_live_per_verified_watt_idx
        ON listings (loadline_per_watt(price_eur_minor, CASE WHEN bench_verified THEN power_8ohm_w END), id) WHERE status = 'live'`);
    await q(`DROP INDEX listings_live_power_idx`);
    for (const column of FACET_COLUMNS) {
      await q(`CREATE INDEX listings_live_${column}_idx ON listings (${column}) WHERE status = 'live' AND ${column} IS NOT NULL`);
    }
  });
};

/** Facet columns with an index of their own (each is present on a few categories' rows only). */
const FACET_COLUMNS = [
  "power_8ohm_w",
  "power_4ohm_w",
  "thd_pct",
  "thdn_pct",
  "snr_db",
  "f3_low_hz",
  "f3_high_hz",
  "damping_factor",
  "riaa_deviation_db",
  "gain_db",
  "noise_uv",
  "sensitivity_db",
  "impedance_min_ohm",
  "speed_error_pct",
  "wow_flutter_pct",
];

const COLUMN_OF: Record<keyof ListingFacets, string> = {
  power8ohmW: "power_8ohm_w",
  power4ohmW: "power_4ohm_w",
  thdPct: "thd_pct",
  thdnPct: "thdn_pct",
  snrDb: "snr_db",
  f3LowHz: "f3_low_hz",
  f3HighHz: "f3_high_hz",
  dampingFactor: "damping_factor",
  riaaDeviationDb: "riaa_deviation_db",
  gainDb: "gain_db",
  noiseUv: "noise_uv",
  sensitivityDb: "sensitivity_db",
  impedanceMinOhm: "impedance_min_ohm",
  speedErrorPct: "speed_error_pct",
  wowFlutterPct: "wow_flutter_pct",
};

// Recomputed through the one facet function, so existing rows read exactly as new ones will.
async function backfillFacets(sequelize: Sequelize, transaction: Transaction) {
  const rows = await sequelize.query<{ listing_id: string; sheet: unknown }>(`SELECT listing_id, sheet FROM bench_sheets`, {
    type: QueryTypes.SELECT,
    transaction,
  });
  const entries = Object.entries(COLUMN_OF) as [keyof ListingFacets, string][];
  for (const row of rows) {
    const parsed = parseBenchSheet(row.sheet);
    const facets = listingFacets(parsed.ok ? parsed.sheet : null);
    await sequelize.query(`UPDATE listings SET ${entries.map(([key, column]) => `${column} = :${key}`).join(", ")} WHERE id = :id`, {
      replacements: { ...facets, id: row.listing_id },
      transaction,
    });
  }
}

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });
    for (const column of FACET_COLUMNS) await q(`DROP INDEX IF EXISTS listings_live_${column}_idx`);
    await q(`CREATE INDEX listings_live_power_idx ON listings (category, power_8ohm_w) WHERE status = 'live' AND power_8ohm_w IS NOT NULL`);
    await q(`DROP INDEX listings_live_per_verified_watt_idx`);
    await q(`DROP INDEX listings_live_per_watt_idx`);
    await q(`DROP FUNCTION loadline_per_watt(bigint, double precision)`);
    await q(`DROP INDEX listings_live_category_price_idx`);
    await q(`DROP INDEX listings_live_price_eur_idx`);
    await q(`DROP INDEX listings_live_search_idx`);
    await q(`CREATE INDEX listings_live_price_idx ON listings (category, price_minor) WHERE status = 'live'`);

    await q(`DROP TRIGGER currency_rates_reprice ON currency_rates`);
    await q(`DROP FUNCTION currency_rates_reprice()`);
    await q(`DROP TRIGGER listings_price_eur ON listings`);
    await q(`DROP FUNCTION listings_price_eur()`);
    await q(`ALTER TABLE listings DROP COLUMN price_eur_minor`);
    await q(`DROP FUNCTION loadline_eur_minor(bigint, char)`);
    await q(`DROP TABLE currency_rates`);

    await q(`ALTER TABLE listings DROP COLUMN courier_zones`);
    await q(`ALTER TABLE listings DROP COLUMN search_doc`);
    await q(`DROP FUNCTION loadline_search_query(text)`);
    await q(`DROP FUNCTION loadline_search_doc(text, text, text, text)`);
    await q(`DROP FUNCTION loadline_category_words(text)`);
    await q(`DROP FUNCTION loadline_unaccent(text)`);
    // The extension stays: dropping it could take another schema's use of it along.

    // The old column held THD+N else THD.
    await q(`UPDATE listings SET thd_pct = coalesce(thdn_pct, thd_pct)`);
    await q(`COMMENT ON COLUMN listings.thd_pct IS NULL`);
    for (const column of ["thdn_pct", "f3_low_hz", "damping_factor", "riaa_deviation_db", "gain_db", "noise_uv", "speed_error_pct"]) {
      await q(`ALTER TABLE listings DROP COLUMN ${column}`);
    }
    await q(`ALTER TABLE listings RENAME COLUMN impedance_min_ohm TO impedance_ohm`);
    await q(`ALTER TABLE listings RENAME COLUMN f3_high_hz TO bandwidth_hz`);
  });
};
