import type { Migration } from "../migrator";

// Working in bulk, a workshop's side: CSV imports of units as drafts and restoration templates.
// An import keeps the file's rows, already checked, only until its job has written the drafts (rows is
// cleared when it ends), so nothing of the upload outlives the import; the row keeps the outcome and
// the progress the page polls. A template is a common service job (title, work done, parts) the
// workshop applies to a unit's restoration log.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE listing_imports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      file_name text NOT NULL CHECK (length(file_name) BETWEEN 1 AND 200),
      status text NOT NULL DEFAULT 'queued'
        CONSTRAINT listing_imports_status_known CHECK (status IN ('queued','running','done','failed')),
      total_rows integer NOT NULL CHECK (total_rows > 0),
      done_rows integer NOT NULL DEFAULT 0 CHECK (done_rows >= 0 AND done_rows <= total_rows),
      rows jsonb,
      error text,
      created_at timestamptz NOT NULL DEFAULT now(),
      finished_at timestamptz,
      CONSTRAINT listing_imports_rows_until_done CHECK ((status IN ('done','failed')) = (rows IS NULL)),
      CONSTRAINT listing_imports_finished CHECK ((status IN ('done','failed')) = (finished_at IS NOT NULL))
    )`);
  await qi.sequelize.query(`CREATE INDEX listing_imports_by_owner ON listing_imports (owner_id, created_at DESC)`);
  await qi.sequelize.query(`
    CREATE TABLE restoration_templates (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      title text NOT NULL CHECK (length(btrim(title)) BETWEEN 1 AND 120),
      work text NOT NULL CHECK (length(btrim(work)) BETWEEN 1 AND 4000),
      parts jsonb NOT NULL DEFAULT '[]',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
  await qi.sequelize.query(`CREATE UNIQUE INDEX restoration_templates_title ON restoration_templates (owner_id, lower(title))`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS restoration_templates`);
  await qi.sequelize.query(`DROP TABLE IF EXISTS listing_imports`);
};
