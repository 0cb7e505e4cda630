import type { Migration } from "../migrator";

// A seller's application to be a workshop: what the desk checks (business name, address, registration
// number) and the document that proves it, kept in the private bucket (only its key is here). The
// workshop's own row (workshops) carries the public side and its verification status; each application
// is kept, so a refused business that applies again leaves its earlier attempt on file. One waiting
// application per workshop.

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE workshop_applications (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workshop_id uuid NOT NULL REFERENCES workshops(id) ON DELETE CASCADE,
      applicant_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      business_name text NOT NULL CHECK (length(btrim(business_name)) BETWEEN 2 AND 120),
      address text NOT NULL CHECK (length(btrim(address)) BETWEEN 5 AND 400),
      registration_number text NOT NULL CHECK (length(btrim(registration_number)) BETWEEN 3 AND 40),
      document_key text NOT NULL UNIQUE,
      document_type text NOT NULL
        CONSTRAINT workshop_applications_document_type CHECK (document_type IN ('application/pdf','image/jpeg','image/png')),
      document_name text NOT NULL,
      document_bytes integer NOT NULL CHECK (document_bytes > 0),
      status text NOT NULL DEFAULT 'waiting'
        CONSTRAINT workshop_applications_status_known CHECK (status IN ('waiting','verified','refused')),
      decided_at timestamptz,
      decided_by uuid REFERENCES users(id) ON DELETE RESTRICT,
      decision_note text,
      -- Set by the mail job once the applicant has been told, so a retried job does not mail twice.
      decision_mailed_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT workshop_applications_decided CHECK ((status = 'waiting') = (decided_at IS NULL)
        AND (status = 'waiting') = (decided_by IS NULL) AND (status = 'waiting') = (decision_note IS NULL))
    )`);
  await qi.sequelize.query(
    `CREATE UNIQUE INDEX workshop_applications_one_waiting ON workshop_applications (workshop_id) WHERE status = 'waiting'`,
  );
  await qi.sequelize.query(`CREATE INDEX workshop_applications_by_workshop ON workshop_applications (workshop_id, created_at)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS workshop_applications`);
};
