import type { Migration } from "../migrator";

// A number that moves whenever a live listing changes (or a listing goes live or leaves the market):
// the market's counts are kept per value of it, so a count is reused until the market it describes
// changes. A sequence, not a row: moving it takes no lock and is not rolled back.

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });
    await q(`CREATE SEQUENCE market_epoch`);
    await q(sql`
      CREATE FUNCTION market_epoch_move() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM nextval('market_epoch');
        RETURN NULL;
      END $$`);
    await q(sql`
      CREATE TRIGGER listings_market_epoch_insert AFTER INSERT ON listings
        FOR EACH ROW WHEN (NEW.status = 'live') EXECUTE FUNCTION market_epoch_move()`);
    await q(sql`
      CREATE TRIGGER listings_market_epoch_update AFTER UPDATE ON listings
        FOR EACH ROW WHEN (OLD.status = 'live' OR NEW.status = 'live') EXECUTE FUNCTION market_epoch_move()`);
    await q(sql`
      CREATE TRIGGER listings_market_epoch_delete AFTER DELETE ON listings
        FOR EACH ROW WHEN (OLD.status = 'live') EXECUTE FUNCTION market_epoch_move()`);
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });
    for (const t of ["insert", "update", "delete"]) await q(`DROP TRIGGER listings_market_epoch_${t} ON listings`);
    await q(`DROP FUNCTION market_epoch_move()`);
    await q(`DROP SEQUENCE market_epoch`);
  });
};
