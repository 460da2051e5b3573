import type { Migration } from '@server/db/migrator'

// The orders table's search box matches any part of an order number or PO number (ILIKE '%…%'),
// which no b-tree can serve: with 50,000 orders it read the whole table on every keystroke.
// Trigram indexes (pg_trgm, a trusted extension the database owner may create) serve both
// columns; the planner ORs them with a bitmap scan.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS pg_trgm;
    CREATE INDEX orders_number_trgm_idx ON orders USING gin (number gin_trgm_ops);
    CREATE INDEX orders_po_number_trgm_idx ON orders USING gin (po_number gin_trgm_ops);
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    DROP INDEX IF EXISTS orders_po_number_trgm_idx;
    DROP INDEX IF EXISTS orders_number_trgm_idx;
  `)
}
