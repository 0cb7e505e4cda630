import type { Migration } from "../migrator";

// The review desk that acts: an append-only audit trail of moderators' actions (who, what, why,
// before and after), claims so two moderators do not act on one item, flags raised by the photo
// check, the price check and people's reports, and the note a moderator leaves when asking a seller
// for changes. The trail is append-only in the database itself (the orders migration's
// loadline_append_only trigger), so no code path can rewrite history; TRUNCATE stays allowed because
// the tests empty tables between files.

const sql = String.raw;

export const up: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(sql`
    CREATE TABLE audit_records (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      -- null: the system acted (a job), not a person
      actor_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      action text NOT NULL CHECK (action ~ '^[a-z][a-z_]*$'),
      subject_type text NOT NULL CHECK (subject_type IN ('listing','user','workshop','order','review','flag','thread')),
      subject_id uuid NOT NULL,
      note text NOT NULL,
      before jsonb,
      after jsonb,
      created_at timestamptz NOT NULL DEFAULT now()
    )`);
  await q(`CREATE INDEX audit_records_subject_idx ON audit_records (subject_type, subject_id, created_at)`);
  await q(
    `CREATE TRIGGER audit_records_append_only BEFORE UPDATE OR DELETE ON audit_records FOR EACH ROW EXECUTE FUNCTION loadline_append_only()`,
  );

  await q(sql`
    CREATE TABLE desk_claims (
      subject_type text NOT NULL,
      subject_id uuid NOT NULL,
      moderator_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      claimed_at timestamptz NOT NULL,
      expires_at timestamptz NOT NULL,
      PRIMARY KEY (subject_type, subject_id)
    )`);

  await q(sql`
    CREATE TABLE desk_flags (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      kind text NOT NULL CHECK (kind IN ('copied_photo','low_price','report')),
      listing_id uuid REFERENCES listings(id) ON DELETE CASCADE,
      thread_id uuid REFERENCES message_threads(id) ON DELETE CASCADE,
      reporter_id uuid REFERENCES users(id) ON DELETE SET NULL,
      reason text NOT NULL,
      note text,
      details jsonb NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now(),
      resolved_at timestamptz,
      resolved_by uuid REFERENCES users(id) ON DELETE SET NULL,
      resolution text,
      CHECK (listing_id IS NOT NULL OR thread_id IS NOT NULL),
      CHECK ((resolved_at IS NULL) = (resolution IS NULL))
    )`);
  // The queue reads open flags oldest first; a listing page reads its own open ones.
  await q(`CREATE INDEX desk_flags_open_idx ON desk_flags (created_at) WHERE resolved_at IS NULL`);
  await q(`CREATE INDEX desk_flags_listing_idx ON desk_flags (listing_id) WHERE listing_id IS NOT NULL`);
  await q(`CREATE INDEX desk_flags_thread_idx ON desk_flags (thread_id) WHERE thread_id IS NOT NULL`);
  // One open report per person and item (a listing or a thread); a second is refused by the database.
  await q(sql`
    CREATE UNIQUE INDEX desk_flags_one_open_report ON desk_flags
      (reporter_id, coalesce(listing_id, '00000000-0000-0000-0000-000000000000'), coalesce(thread_id, '00000000-0000-0000-0000-000000000000'))
      WHERE kind = 'report' AND resolved_at IS NULL AND reporter_id IS NOT NULL`);

  await q(`ALTER TABLE listings ADD COLUMN review_note text`);
};

export const down: Migration = async ({ context: qi }) => {
  const q = (text: string) => qi.sequelize.query(text);
  await q(`ALTER TABLE listings DROP COLUMN IF EXISTS review_note`);
  await q(`DROP TABLE IF EXISTS desk_flags`);
  await q(`DROP TABLE IF EXISTS desk_claims`);
  await q(`DROP TABLE IF EXISTS audit_records`);
};
