import type { Migration } from "../migrator";

// Currencies: who changed which exchange rate, from what to what, and the display currency a signed-in
// buyer chose (so it follows them to another browser). The change log is append-only: a trigger
// refuses edits and deletions, except the database's own ON DELETE SET NULL when an admin's account is
// removed (the name seen at the time stays with the line).

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const q = (text: string) => qi.sequelize.query(text, { transaction });
    await q(sql`
      CREATE TABLE currency_rate_changes (
        id bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
        currency char(3) NOT NULL REFERENCES currency_rates(currency),
        old_per_eur numeric NOT NULL CHECK (old_per_eur > 0),
        new_per_eur numeric NOT NULL CHECK (new_per_eur > 0),
        changed_by uuid REFERENCES users(id) ON DELETE SET NULL,
        changed_by_name text NOT NULL,
        changed_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q(`CREATE INDEX currency_rate_changes_recent_idx ON currency_rate_changes (changed_at DESC, id DESC)`);
    await q(sql`
      CREATE FUNCTION currency_rate_changes_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'UPDATE' AND NEW.changed_by IS NULL
           AND (NEW.id, NEW.currency, NEW.old_per_eur, NEW.new_per_eur, NEW.changed_by_name, NEW.changed_at)
               IS NOT DISTINCT FROM (OLD.id, OLD.currency, OLD.old_per_eur, OLD.new_per_eur, OLD.changed_by_name, OLD.changed_at) THEN
          RETURN NEW;
        END IF;
        RAISE EXCEPTION 'currency_rate_changes is append-only' USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q(sql`
      CREATE TRIGGER currency_rate_changes_append_only BEFORE UPDATE OR DELETE ON currency_rate_changes
        FOR EACH ROW EXECUTE FUNCTION currency_rate_changes_append_only()`);
    await q(`ALTER TABLE users ADD COLUMN display_currency char(3) CHECK (display_currency ~ '^[A-Z]{3}$')`);
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query(`ALTER TABLE users DROP COLUMN IF EXISTS display_currency`, { transaction });
    await qi.sequelize.query(`DROP TABLE IF EXISTS currency_rate_changes`, { transaction });
    await qi.sequelize.query(`DROP FUNCTION IF EXISTS currency_rate_changes_append_only()`, { transaction });
  });
};
