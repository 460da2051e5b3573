import type { Migration } from '@server/db/migrator'

// A line taken off an order by an edit stays as a row: its reserved and released stock moves point
// at it, and the ledger is append-only. `removed_at` marks it; every reader of an order's lines
// skips removed ones (they count towards no total, no pick list and no invoice).
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    ALTER TABLE order_lines ADD COLUMN removed_at timestamptz;
    ALTER TABLE order_lines ADD COLUMN removed_by integer REFERENCES users(id);
    -- Pending pre-orders are looked up by product, in the order they were placed.
    CREATE INDEX order_lines_preorder_idx ON order_lines (product_id, order_id) WHERE preorder AND removed_at IS NULL;
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    DROP INDEX IF EXISTS order_lines_preorder_idx;
    ALTER TABLE order_lines DROP COLUMN removed_by;
    ALTER TABLE order_lines DROP COLUMN removed_at;
  `)
}
