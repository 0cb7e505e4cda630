import type { Migration } from "../migrator";

// Photos' perceptual hashes change scheme (our own DCT hash, docs/decisions/0023): the old ones cannot
// be compared with the new. Rows stored so far are marked scheme 1 (a ready photo must keep a hash,
// so they are not cleared); new rows are scheme 2; the copied-photo check compares scheme 2 only, and
// the worker's photo-rehash job hashes scheme 1 photos again from their thumbnails. The check reads
// hashes as 64-bit strings in SQL, so only 16 lower-case hex digits may be stored.

export const up: Migration = async ({ context: qi }) => {
  const q = (sql: string) => qi.sequelize.query(sql);
  await q(`ALTER TABLE listing_photos ADD COLUMN phash_scheme smallint NOT NULL DEFAULT 1`);
  await q(`ALTER TABLE listing_photos ALTER COLUMN phash_scheme SET DEFAULT 2`);
  await q(`ALTER TABLE listing_photos ADD CONSTRAINT listing_photos_phash_hex CHECK (phash IS NULL OR phash ~ '^[0-9a-f]{16}$')`);
  await q(`CREATE INDEX listing_photos_phash_scheme_old ON listing_photos (id) WHERE phash_scheme = 1`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE listing_photos DROP CONSTRAINT IF EXISTS listing_photos_phash_hex`);
  await qi.sequelize.query(`DROP INDEX IF EXISTS listing_photos_phash_scheme_old`);
  await qi.sequelize.query(`ALTER TABLE listing_photos DROP COLUMN IF EXISTS phash_scheme`);
};
