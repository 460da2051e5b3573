import type { Migration } from '@server/db/migrator'

// Pours the owner has planned from the pour plan. A planned pour is not a batch: it has no lot
// code, draws no lots and enters no bars into the ledger. It counts as supply in the plan (ready on
// its pour date + the recipe's cure days) until the batch form records the batch that pours it,
// which marks it poured and names the batch, or the owner drops it.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE TABLE planned_pours (
      id             serial PRIMARY KEY,
      product_id     integer NOT NULL REFERENCES products(id),
      pour_date      date NOT NULL,
      moulds         integer NOT NULL CHECK (moulds BETWEEN 1 AND 100),
      oil_weight_g   numeric(10,2) NOT NULL CHECK (oil_weight_g > 0),
      expected_bars  integer NOT NULL CHECK (expected_bars > 0),
      status         text NOT NULL DEFAULT 'planned' CHECK (status IN ('planned', 'poured', 'dropped')),
      batch_id       integer UNIQUE REFERENCES batches(id),
      note           text CHECK (note IS NULL OR length(note) <= 500),
      created_by     integer REFERENCES users(id),
      created_at     timestamptz NOT NULL DEFAULT now(),
      updated_at     timestamptz NOT NULL DEFAULT now(),
      CHECK ((status = 'poured') = (batch_id IS NOT NULL))
    );
    CREATE INDEX planned_pours_open_idx ON planned_pours (product_id, pour_date) WHERE status = 'planned';
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query('DROP TABLE IF EXISTS planned_pours')
}
