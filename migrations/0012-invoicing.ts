import type { Migration } from '@server/db/migrator'

// Shipments, invoices with their gapless yearly series, credit notes, payments and the overdue
// reminders sent. Invoices are never deleted or renumbered: a wrong one is voided and a credit
// note of the same totals takes the next number of the series.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    -- One shipment per order: the carrier's tracking number and what left the door.
    CREATE TABLE shipments (
      id               serial PRIMARY KEY,
      order_id         integer NOT NULL UNIQUE REFERENCES orders(id),
      carrier          text NOT NULL CHECK (length(carrier) BETWEEN 1 AND 60),
      tracking_number  text NOT NULL CHECK (length(tracking_number) BETWEEN 1 AND 80),
      ship_date        date NOT NULL,
      cartons          integer NOT NULL CHECK (cartons > 0),
      weight_g         integer NOT NULL CHECK (weight_g > 0),
      created_by       integer REFERENCES users(id),
      created_at       timestamptz NOT NULL DEFAULT now()
    );

    -- Gapless per year: the row is taken with INSERT … ON CONFLICT DO UPDATE … RETURNING inside
    -- the transaction that issues the invoice, so its lock queues the next issuer and a rollback
    -- gives the number back.
    CREATE TABLE invoice_sequences (
      year  integer PRIMARY KEY CHECK (year BETWEEN 1000 AND 9999),
      last  integer NOT NULL CHECK (last BETWEEN 1 AND 999999)
    );

    CREATE TABLE invoices (
      id                  serial PRIMARY KEY,
      number              text NOT NULL UNIQUE,
      year                integer NOT NULL,
      seq                 integer NOT NULL CHECK (seq BETWEEN 1 AND 999999),
      kind                text NOT NULL DEFAULT 'invoice' CHECK (kind IN ('invoice', 'credit_note')),
      order_id            integer NOT NULL REFERENCES orders(id),
      shop_id             integer NOT NULL REFERENCES shops(id),
      credits_invoice_id  integer REFERENCES invoices(id),
      issue_date          date NOT NULL,
      due_date            date NOT NULL,
      terms               text NOT NULL CHECK (terms IN ('prepay', 'net_15', 'net_30')),
      po_number           text,
      -- The bill-to as it stood when the invoice was issued (legal and trading name, address, tax id).
      bill_to             jsonb NOT NULL,
      subtotal_cents      integer NOT NULL CHECK (subtotal_cents >= 0),
      shipping_cents      integer NOT NULL DEFAULT 0 CHECK (shipping_cents >= 0),
      tax_cents           integer NOT NULL DEFAULT 0 CHECK (tax_cents >= 0),
      total_cents         integer NOT NULL CHECK (total_cents >= 0),
      tax_rate_pct        numeric(5,2) NOT NULL DEFAULT 0,
      tax_exempt          boolean NOT NULL DEFAULT false,
      -- Kept by the payments trigger, in the transaction that records the payment.
      paid_cents          integer NOT NULL DEFAULT 0 CHECK (paid_cents >= 0),
      voided_at           timestamptz,
      voided_by           integer REFERENCES users(id),
      void_reason         text CHECK (void_reason IS NULL OR length(void_reason) BETWEEN 1 AND 500),
      created_by          integer REFERENCES users(id),
      created_at          timestamptz NOT NULL DEFAULT now(),
      updated_at          timestamptz NOT NULL DEFAULT now(),
      UNIQUE (year, seq),
      CHECK (year = extract(year FROM issue_date)),
      CHECK (due_date >= issue_date),
      CHECK (total_cents = subtotal_cents + shipping_cents + tax_cents),
      CHECK (paid_cents <= total_cents),
      CHECK ((kind = 'credit_note') = (credits_invoice_id IS NOT NULL)),
      CHECK (kind = 'invoice' OR (voided_at IS NULL AND paid_cents = 0)),
      CHECK ((voided_at IS NULL) = (void_reason IS NULL))
    );
    -- One live invoice per order (a voided one may be replaced), one credit note per invoice.
    CREATE UNIQUE INDEX invoices_one_per_order ON invoices (order_id) WHERE kind = 'invoice' AND voided_at IS NULL;
    CREATE UNIQUE INDEX invoices_one_credit_note ON invoices (credits_invoice_id) WHERE kind = 'credit_note';
    -- Receivables: a shop's invoices by date, and the open ones by due date.
    CREATE INDEX invoices_shop_issue_idx ON invoices (shop_id, issue_date DESC, id DESC);
    CREATE INDEX invoices_issue_idx ON invoices (issue_date DESC, id DESC);
    CREATE INDEX invoices_open_due_idx ON invoices (due_date, shop_id)
      WHERE kind = 'invoice' AND voided_at IS NULL AND paid_cents < total_cents;
    CREATE INDEX invoices_order_idx ON invoices (order_id);

    -- The number, series, kind, parties and amounts of an issued invoice never change, and no
    -- invoice is ever deleted; only payments (paid_cents) and a void may touch it afterwards.
    CREATE FUNCTION invoices_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'invoices are never deleted (void one instead)';
      END IF;
      IF NEW.number <> OLD.number OR NEW.year <> OLD.year OR NEW.seq <> OLD.seq OR NEW.kind <> OLD.kind
         OR NEW.order_id <> OLD.order_id OR NEW.shop_id <> OLD.shop_id
         OR NEW.credits_invoice_id IS DISTINCT FROM OLD.credits_invoice_id
         OR NEW.issue_date <> OLD.issue_date OR NEW.due_date <> OLD.due_date OR NEW.terms <> OLD.terms
         OR NEW.subtotal_cents <> OLD.subtotal_cents OR NEW.shipping_cents <> OLD.shipping_cents
         OR NEW.tax_cents <> OLD.tax_cents OR NEW.total_cents <> OLD.total_cents THEN
        RAISE EXCEPTION 'an issued invoice keeps its number, parties, dates and amounts';
      END IF;
      IF OLD.voided_at IS NOT NULL AND NEW.voided_at IS DISTINCT FROM OLD.voided_at THEN
        RAISE EXCEPTION 'a void invoice stays void';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER invoices_guard BEFORE UPDATE OR DELETE ON invoices
      FOR EACH ROW EXECUTE FUNCTION invoices_guard();

    -- The lines as invoiced (copied from the order lines, so later edits of a product change nothing).
    CREATE TABLE invoice_lines (
      id                serial PRIMARY KEY,
      invoice_id        integer NOT NULL REFERENCES invoices(id),
      order_line_id     integer REFERENCES order_lines(id),
      sku               text NOT NULL,
      description       text NOT NULL,
      cases             integer NOT NULL CHECK (cases > 0),
      case_pack         integer NOT NULL CHECK (case_pack > 0),
      bars              integer NOT NULL CHECK (bars > 0),
      unit_price_cents  integer NOT NULL CHECK (unit_price_cents >= 0),
      line_total_cents  integer NOT NULL CHECK (line_total_cents >= 0),
      sort_order        integer NOT NULL DEFAULT 0,
      CHECK (bars = cases * case_pack),
      CHECK (line_total_cents = bars * unit_price_cents)
    );
    CREATE INDEX invoice_lines_invoice_idx ON invoice_lines (invoice_id, sort_order, id);

    CREATE TABLE payments (
      id            serial PRIMARY KEY,
      invoice_id    integer NOT NULL REFERENCES invoices(id),
      method        text NOT NULL CHECK (method IN ('bank_transfer', 'cheque', 'card')),
      amount_cents  integer NOT NULL CHECK (amount_cents > 0),
      received_on   date NOT NULL,
      reference     text CHECK (reference IS NULL OR length(reference) BETWEEN 1 AND 80),
      recorded_by   integer REFERENCES users(id),
      created_at    timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX payments_invoice_idx ON payments (invoice_id, received_on, id);
    CREATE INDEX payments_received_idx ON payments (received_on DESC, id DESC);

    -- A payment adds to its invoice's paid_cents in the same transaction; the invoice's CHECK
    -- (paid_cents <= total_cents) refuses an overpayment even from a writer that forgot the lock.
    -- Payments go only on live invoices, and are never edited or deleted.
    CREATE FUNCTION payments_apply() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE inv invoices%ROWTYPE;
    BEGIN
      SELECT * INTO inv FROM invoices WHERE id = NEW.invoice_id FOR UPDATE;
      IF inv.kind <> 'invoice' OR inv.voided_at IS NOT NULL THEN
        RAISE EXCEPTION 'payments go only on live invoices' USING ERRCODE = 'check_violation';
      END IF;
      UPDATE invoices SET paid_cents = paid_cents + NEW.amount_cents, updated_at = now() WHERE id = NEW.invoice_id;
      RETURN NEW;
    END $$;
    CREATE TRIGGER payments_apply AFTER INSERT ON payments
      FOR EACH ROW EXECUTE FUNCTION payments_apply();

    CREATE FUNCTION payments_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'payments are append-only';
    END $$;
    CREATE TRIGGER payments_no_update BEFORE UPDATE OR DELETE ON payments
      FOR EACH ROW EXECUTE FUNCTION payments_append_only();

    -- Overdue reminders sent: the daily job sends at most one per invoice in 7 days.
    CREATE TABLE invoice_reminders (
      id          serial PRIMARY KEY,
      invoice_id  integer NOT NULL REFERENCES invoices(id),
      sent_on     date NOT NULL,
      sent_to     text NOT NULL,
      source      text NOT NULL CHECK (source IN ('owner', 'daily')),
      sent_by     integer REFERENCES users(id),
      created_at  timestamptz NOT NULL DEFAULT now(),
      UNIQUE (invoice_id, sent_on)
    );
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    DROP TABLE invoice_reminders, payments, invoice_lines, invoices, invoice_sequences, shipments CASCADE;
    DROP FUNCTION IF EXISTS payments_apply();
    DROP FUNCTION IF EXISTS payments_append_only();
    DROP FUNCTION IF EXISTS invoices_guard();
  `)
}
