import type { Migration } from '@server/db/migrator'

// The balance trigger of 0003 upserted with INSERT … ON CONFLICT DO UPDATE. PostgreSQL checks a
// table's CHECK constraints on the row proposed for insertion before it looks for the conflict,
// so every move with a negative delta (written_off, reserved, shipped, a recount down) failed
// `free >= 0` on the proposed row (free = −n) even when the balance had room. The row is now made
// first (zeros, no conflict possible on the CHECK) and then updated, so the CHECK judges the real
// balance after the move, and still refuses an overdraw.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE OR REPLACE FUNCTION stock_moves_apply() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO batch_stock (batch_id, free, reserved) VALUES (NEW.batch_id, 0, 0)
      ON CONFLICT (batch_id) DO NOTHING;
      UPDATE batch_stock
         SET free = free + NEW.free_delta, reserved = reserved + NEW.reserved_delta
       WHERE batch_id = NEW.batch_id;
      RETURN NEW;
    END $$;
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE OR REPLACE FUNCTION stock_moves_apply() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO batch_stock (batch_id, free, reserved) VALUES (NEW.batch_id, NEW.free_delta, NEW.reserved_delta)
      ON CONFLICT (batch_id) DO UPDATE
        SET free = batch_stock.free + EXCLUDED.free, reserved = batch_stock.reserved + EXCLUDED.reserved;
      RETURN NEW;
    END $$;
  `)
}
