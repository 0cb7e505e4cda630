import type { Migration } from "../migrator";

// Order mails go once per timeline row and side: the 'order-mail' job writes its mark here in the
// transaction that sends, so a retried or doubled job finds the mark and sends nothing (a failed send
// rolls the mark back, and the retry tries again).

export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE order_mail_marks (
      event_id uuid NOT NULL REFERENCES order_events (id),
      audience text NOT NULL CHECK (audience IN ('buyer', 'seller')),
      sent_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (event_id, audience)
    )`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE IF EXISTS order_mail_marks`);
};
