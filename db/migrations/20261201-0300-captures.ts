import type { Migration } from "../migrator";

// Captures: raw measurement files (WAV, CSV) in object storage, with the conditions they were
// uploaded with and the analysis the background job made of them.

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(sql`
    CREATE TABLE captures (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      kind text NOT NULL CONSTRAINT captures_kind_known CHECK (kind IN ('sine','square','sweep')),
      status text NOT NULL DEFAULT 'queued'
        CONSTRAINT captures_status_known CHECK (status IN ('queued','running','done','failed')),
      file_name text NOT NULL CHECK (length(file_name) BETWEEN 1 AND 255),
      content_type text NOT NULL,
      byte_size integer NOT NULL CHECK (byte_size > 0 AND byte_size <= 52428800),
      -- Null once a file the analysis refused has been removed from storage.
      storage_key text UNIQUE,
      -- json, not jsonb: the API hands these back as written, keys in their reading order.
      format json NOT NULL CHECK (json_typeof(format) = 'object'),
      conditions json NOT NULL CHECK (json_typeof(conditions) = 'object'),
      analysis json CHECK (analysis IS NULL OR json_typeof(analysis) = 'object'),
      readings json CHECK (readings IS NULL OR json_typeof(readings) = 'array'),
      sweep json CHECK (sweep IS NULL OR json_typeof(sweep) = 'object'),
      error_code text,
      error_message text,
      started_at timestamptz,
      finished_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT captures_done_has_analysis CHECK ((status = 'done') = (analysis IS NOT NULL AND readings IS NOT NULL)),
      CONSTRAINT captures_failed_has_error CHECK ((status = 'failed') = (error_code IS NOT NULL AND error_message IS NOT NULL)),
      CONSTRAINT captures_finished_has_time CHECK ((status IN ('done','failed')) = (finished_at IS NOT NULL)),
      CONSTRAINT captures_open_has_file CHECK (status = 'failed' OR storage_key IS NOT NULL)
    )`);
  await q(`CREATE INDEX captures_owner_idx ON captures (owner_id, created_at DESC)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS captures`);
};
