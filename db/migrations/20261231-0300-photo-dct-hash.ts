import type { Migration } from "../migrator";

// Photos' perceptual hashes change scheme (our own DCT hash, docs/decisions/0023): the old ones cannot
// be compared with the new, so they are cleared, and the worker's photo-rehash job hashes every ready
// photo again from its stored thumbnail. The copied-photo check reads hashes as 64-bit strings in
// SQL, so only 16 lower-case hex digits may be stored.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`UPDATE listing_photos SET phash = NULL WHERE phash IS NOT NULL`);
  await qi.sequelize.query(
    `ALTER TABLE listing_photos ADD CONSTRAINT listing_photos_phash_hex CHECK (phash IS NULL OR phash ~ '^[0-9a-f]{16}$')`,
  );
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE listing_photos DROP CONSTRAINT IF EXISTS listing_photos_phash_hex`);
};
