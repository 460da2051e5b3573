import type { Migration } from '@server/db/migrator'

// E-mails that a change owes its people (an order placed, an invoice raised, a parcel shipped, a
// card payment received or refunded) are written here in the transaction of the change, and
// deleted once the relay has taken them. A row that outlives its process (a restart, a crash) or
// whose relay refused it is sent again by the outbox job, with growing waits, until it gives up.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE TABLE mail_outbox (
      id bigserial PRIMARY KEY,
      job jsonb NOT NULL CHECK (jsonb_typeof(job) = 'object' AND job ? 'kind'),
      label text NOT NULL,
      attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      last_error text,
      next_attempt_at timestamptz NOT NULL,
      gave_up_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX mail_outbox_due_idx ON mail_outbox (next_attempt_at) WHERE gave_up_at IS NULL;
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query('DROP TABLE IF EXISTS mail_outbox')
}
