import type { Migration } from '@server/db/migrator'

// Carts, case orders with frozen prices, the batch allocations behind every line, and order numbers.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    -- One cart per shop, kept on the server; a line is whole cases of one product.
    CREATE TABLE cart_lines (
      shop_id     integer NOT NULL REFERENCES shops(id),
      product_id  integer NOT NULL REFERENCES products(id),
      cases       integer NOT NULL CHECK (cases BETWEEN 1 AND 10000),
      preorder    boolean NOT NULL DEFAULT false,
      updated_by  integer REFERENCES users(id),
      updated_at  timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (shop_id, product_id, preorder)
    );

    -- Gapless per year: the row is locked by the transaction that takes the next number.
    CREATE TABLE order_sequences (
      year  integer PRIMARY KEY,
      last  integer NOT NULL CHECK (last >= 0)
    );

    CREATE TABLE orders (
      id                   serial PRIMARY KEY,
      number               text NOT NULL UNIQUE,
      year                 integer NOT NULL,
      seq                  integer NOT NULL,
      shop_id              integer NOT NULL REFERENCES shops(id),
      placed_by            integer REFERENCES users(id),
      po_number            text CHECK (po_number IS NULL OR length(po_number) <= 40),
      note                 text CHECK (note IS NULL OR length(note) <= 1000),
      status               text NOT NULL DEFAULT 'placed'
                           CHECK (status IN ('placed', 'confirmed', 'packing', 'packed', 'shipped', 'cancelled')),
      requested_ship_date  date,
      is_opening_order     boolean NOT NULL DEFAULT false,
      subtotal_cents       integer NOT NULL CHECK (subtotal_cents >= 0),
      shipping_cents       integer NOT NULL DEFAULT 0 CHECK (shipping_cents >= 0),
      tax_cents            integer NOT NULL DEFAULT 0 CHECK (tax_cents >= 0),
      total_cents          integer NOT NULL CHECK (total_cents >= 0),
      weight_g             integer NOT NULL DEFAULT 0 CHECK (weight_g >= 0),
      tax_exempt           boolean NOT NULL DEFAULT false,
      tax_rate_pct         numeric(5,2) NOT NULL DEFAULT 0,
      idempotency_key      text CHECK (idempotency_key IS NULL OR length(idempotency_key) BETWEEN 1 AND 200),
      request_hash         char(64),
      confirmed_at         timestamptz,
      confirmed_by         integer REFERENCES users(id),
      cancelled_at         timestamptz,
      cancelled_by         integer REFERENCES users(id),
      cancel_reason        text,
      packer_id            integer REFERENCES users(id),
      packing_started_at   timestamptz,
      packed_at            timestamptz,
      cartons              integer CHECK (cartons IS NULL OR cartons > 0),
      packed_weight_g      integer CHECK (packed_weight_g IS NULL OR packed_weight_g > 0),
      shipped_at           timestamptz,
      created_at           timestamptz NOT NULL DEFAULT now(),
      updated_at           timestamptz NOT NULL DEFAULT now(),
      UNIQUE (year, seq),
      CHECK (total_cents = subtotal_cents + shipping_cents + tax_cents)
    );
    CREATE UNIQUE INDEX orders_idempotency_key ON orders (shop_id, idempotency_key) WHERE idempotency_key IS NOT NULL;
    CREATE INDEX orders_shop_created_idx ON orders (shop_id, created_at DESC, id DESC);
    CREATE INDEX orders_status_created_idx ON orders (status, created_at DESC, id DESC);
    CREATE INDEX orders_created_idx ON orders (created_at DESC, id DESC);

    -- Prices are frozen on the line when the order is placed.
    CREATE TABLE order_lines (
      id                 serial PRIMARY KEY,
      order_id           integer NOT NULL REFERENCES orders(id),
      product_id         integer NOT NULL REFERENCES products(id),
      sku                text NOT NULL,
      name               text NOT NULL,
      cases              integer NOT NULL CHECK (cases > 0),
      case_pack          integer NOT NULL CHECK (case_pack > 0),
      bars               integer NOT NULL CHECK (bars > 0),
      unit_price_cents   integer NOT NULL CHECK (unit_price_cents >= 0),
      line_total_cents   integer NOT NULL CHECK (line_total_cents >= 0),
      preorder           boolean NOT NULL DEFAULT false,
      promised_date      date,
      sort_order         integer NOT NULL DEFAULT 0,
      CHECK (bars = cases * case_pack),
      CHECK (line_total_cents = bars * unit_price_cents),
      CHECK (preorder = (promised_date IS NOT NULL))
    );
    CREATE INDEX order_lines_order_idx ON order_lines (order_id);
    CREATE INDEX order_lines_product_idx ON order_lines (product_id);

    -- Which batch's bars serve which line (oldest ready batch first).
    CREATE TABLE allocations (
      id             serial PRIMARY KEY,
      order_line_id  integer NOT NULL REFERENCES order_lines(id),
      batch_id       integer NOT NULL REFERENCES batches(id),
      bars           integer NOT NULL CHECK (bars > 0),
      created_at     timestamptz NOT NULL DEFAULT now(),
      UNIQUE (order_line_id, batch_id)
    );
    CREATE INDEX allocations_batch_idx ON allocations (batch_id);

    ALTER TABLE stock_moves ADD FOREIGN KEY (order_id) REFERENCES orders(id);
    ALTER TABLE stock_moves ADD FOREIGN KEY (order_line_id) REFERENCES order_lines(id);
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    ALTER TABLE stock_moves DROP CONSTRAINT IF EXISTS stock_moves_order_id_fkey;
    ALTER TABLE stock_moves DROP CONSTRAINT IF EXISTS stock_moves_order_line_id_fkey;
    DROP TABLE allocations, order_lines, orders, order_sequences, cart_lines CASCADE;
  `)
}
