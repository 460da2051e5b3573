import type { Migration } from '@server/db/migrator'

// Batches poured from recipes, the ingredient lots they consumed, and the append-only stock ledger.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE TABLE batches (
      id                    serial PRIMARY KEY,
      product_id            integer NOT NULL REFERENCES products(id),
      recipe_id             integer NOT NULL REFERENCES recipes(id),
      -- the recipe as it was when poured (items, percentages, superfat, water, cure days)
      recipe_snapshot       jsonb NOT NULL,
      lot_code              text NOT NULL UNIQUE,
      pour_date             date NOT NULL,
      cure_days             integer NOT NULL CHECK (cure_days BETWEEN 0 AND 365),
      ready_date            date NOT NULL,
      oil_weight_g          numeric(10,2) NOT NULL CHECK (oil_weight_g > 0),
      bars_cut              integer NOT NULL CHECK (bars_cut >= 0),
      bars_kept_back        integer NOT NULL DEFAULT 0 CHECK (bars_kept_back >= 0),
      kept_back_reason      text,
      ingredient_cost_cents integer NOT NULL DEFAULT 0 CHECK (ingredient_cost_cents >= 0),
      cost_per_bar_cents    integer CHECK (cost_per_bar_cents IS NULL OR cost_per_bar_cents >= 0),
      location              text CHECK (location IS NULL OR length(location) <= 60),
      notes                 text,
      created_by            integer REFERENCES users(id),
      created_at            timestamptz NOT NULL DEFAULT now(),
      updated_at            timestamptz NOT NULL DEFAULT now(),
      CHECK (ready_date = pour_date + cure_days),
      CHECK (bars_kept_back <= bars_cut)
    );
    CREATE INDEX batches_product_ready_idx ON batches (product_id, ready_date, id);

    CREATE TABLE batch_lots (
      id                  serial PRIMARY KEY,
      batch_id            integer NOT NULL REFERENCES batches(id),
      ingredient_lot_id   integer NOT NULL REFERENCES ingredient_lots(id),
      quantity            numeric(14,4) NOT NULL CHECK (quantity > 0),
      cost_cents          numeric(14,4) NOT NULL CHECK (cost_cents >= 0),
      UNIQUE (batch_id, ingredient_lot_id)
    );
    CREATE INDEX batch_lots_lot_idx ON batch_lots (ingredient_lot_id);

    -- The ledger of bars per batch. Two signed columns: free (sellable or curing, unreserved) and
    -- reserved. made +n/0, reserved -n/+n, released +n/-n, shipped 0/-n, written_off -n/0, adjusted ±n/0.
    -- Rows are only ever inserted; batch_stock keeps the running balance under CHECKs.
    CREATE TABLE stock_moves (
      id              bigserial PRIMARY KEY,
      batch_id        integer NOT NULL REFERENCES batches(id),
      kind            text NOT NULL CHECK (kind IN ('made', 'reserved', 'released', 'shipped', 'written_off', 'adjusted')),
      bars            integer NOT NULL CHECK (bars <> 0),
      free_delta      integer NOT NULL,
      reserved_delta  integer NOT NULL,
      reason          text,
      note            text,
      order_id        integer,
      order_line_id   integer,
      user_id         integer REFERENCES users(id),
      created_at      timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX stock_moves_batch_idx ON stock_moves (batch_id);
    CREATE INDEX stock_moves_order_idx ON stock_moves (order_id) WHERE order_id IS NOT NULL;

    CREATE FUNCTION stock_moves_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'stock_moves is append-only';
    END $$;
    CREATE TRIGGER stock_moves_no_update BEFORE UPDATE OR DELETE ON stock_moves
      FOR EACH ROW EXECUTE FUNCTION stock_moves_append_only();

    -- One row per batch: the sums of its moves, kept by a trigger so that a CHECK holds them >= 0.
    CREATE TABLE batch_stock (
      batch_id   integer PRIMARY KEY REFERENCES batches(id),
      free       integer NOT NULL DEFAULT 0 CHECK (free >= 0),
      reserved   integer NOT NULL DEFAULT 0 CHECK (reserved >= 0)
    );

    CREATE FUNCTION stock_moves_apply() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO batch_stock (batch_id, free, reserved) VALUES (NEW.batch_id, NEW.free_delta, NEW.reserved_delta)
      ON CONFLICT (batch_id) DO UPDATE
        SET free = batch_stock.free + EXCLUDED.free, reserved = batch_stock.reserved + EXCLUDED.reserved;
      RETURN NEW;
    END $$;
    CREATE TRIGGER stock_moves_balance AFTER INSERT ON stock_moves
      FOR EACH ROW EXECUTE FUNCTION stock_moves_apply();
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    DROP TABLE batch_stock, stock_moves, batch_lots, batches CASCADE;
    DROP FUNCTION IF EXISTS stock_moves_apply();
    DROP FUNCTION IF EXISTS stock_moves_append_only();
  `)
}
