import type { Migration } from "../migrator";

// Bench certificates: what identifies a printed certificate — the listing, a SHA-256 of its bench sheet
// as certified, the day it was issued. One certificate per listing and sheet version, so printing it
// again gives the same id. The public page compares the hash with the sheet as it is now; the trigger
// notes when a certified sheet first changed, so "superseded" can say since when.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE bench_certificates (
      id uuid PRIMARY KEY,
      listing_id uuid NOT NULL REFERENCES listings(id) ON DELETE CASCADE,
      sheet_hash text NOT NULL CHECK (sheet_hash ~ '^[0-9a-f]{64}$'),
      issued_at timestamptz NOT NULL DEFAULT now(),
      superseded_at timestamptz NULL,
      UNIQUE (listing_id, sheet_hash)
    )`);
  await qi.sequelize.query(`
    CREATE FUNCTION bench_certificates_supersede() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' OR NEW.sheet IS DISTINCT FROM OLD.sheet THEN
        UPDATE bench_certificates SET superseded_at = now()
         WHERE listing_id = OLD.listing_id AND superseded_at IS NULL;
      END IF;
      RETURN NULL;
    END $$`);
  await qi.sequelize.query(`
    CREATE TRIGGER bench_sheets_supersede_certificates AFTER UPDATE OR DELETE ON bench_sheets
      FOR EACH ROW EXECUTE FUNCTION bench_certificates_supersede()`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TRIGGER IF EXISTS bench_sheets_supersede_certificates ON bench_sheets`);
  await qi.sequelize.query(`DROP FUNCTION IF EXISTS bench_certificates_supersede()`);
  await qi.sequelize.query(`DROP TABLE IF EXISTS bench_certificates`);
};
