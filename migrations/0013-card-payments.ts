import type { Migration } from '@server/db/migrator'

// Paying an invoice by card through the hosted card-payment service: the checkout sessions made
// for an invoice, every webhook event received (its id unique, so an event delivered twice is
// handled once), the card payments with the provider's payment reference, refunds (which take
// money back off the invoice's paid_cents), and the problems the owner must look at (a completed
// payment whose amount or currency does not match what was asked).
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE TABLE card_checkouts (
      id            serial PRIMARY KEY,
      invoice_id    integer NOT NULL REFERENCES invoices(id),
      session_id    text NOT NULL UNIQUE CHECK (length(session_id) BETWEEN 1 AND 255),
      amount_cents  integer NOT NULL CHECK (amount_cents > 0),
      currency      text NOT NULL CHECK (currency ~ '^[a-z]{3}$'),
      status        text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'paid', 'problem')),
      created_by    integer REFERENCES users(id),
      created_at    timestamptz NOT NULL DEFAULT now(),
      completed_at  timestamptz
    );
    CREATE INDEX card_checkouts_invoice_idx ON card_checkouts (invoice_id, created_at DESC);

    -- Every event the provider delivered, once: the unique id makes a second delivery a no-op.
    CREATE TABLE card_events (
      id           serial PRIMARY KEY,
      event_id     text NOT NULL UNIQUE CHECK (length(event_id) BETWEEN 1 AND 255),
      type         text NOT NULL,
      outcome      text NOT NULL CHECK (outcome IN ('payment', 'problem', 'ignored')),
      received_at  timestamptz NOT NULL DEFAULT now()
    );

    -- A payment taken by card through the service: the payment it recorded and the provider's
    -- payment reference, which refunds name.
    CREATE TABLE card_payments (
      payment_id         integer PRIMARY KEY REFERENCES payments(id),
      checkout_id        integer NOT NULL UNIQUE REFERENCES card_checkouts(id),
      payment_intent_id  text NOT NULL UNIQUE CHECK (length(payment_intent_id) BETWEEN 1 AND 255),
      event_id           text NOT NULL UNIQUE REFERENCES card_events(event_id),
      currency           text NOT NULL CHECK (currency ~ '^[a-z]{3}$')
    );

    CREATE TABLE payment_refunds (
      id                  serial PRIMARY KEY,
      payment_id          integer NOT NULL REFERENCES payments(id),
      amount_cents        integer NOT NULL CHECK (amount_cents > 0),
      provider_refund_id  text NOT NULL UNIQUE CHECK (length(provider_refund_id) BETWEEN 1 AND 255),
      reason              text CHECK (reason IS NULL OR length(reason) BETWEEN 1 AND 200),
      refunded_on         date NOT NULL,
      created_by          integer REFERENCES users(id),
      created_at          timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX payment_refunds_payment_idx ON payment_refunds (payment_id, id);

    -- A refund takes its amount back off the invoice's paid_cents in the same transaction, with
    -- the invoice row locked; refunds of one payment never add up to more than it paid. Refunds
    -- are append-only, like payments.
    CREATE FUNCTION payment_refunds_apply() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE pay payments%ROWTYPE; refunded integer;
    BEGIN
      SELECT * INTO pay FROM payments WHERE id = NEW.payment_id;
      PERFORM 1 FROM invoices WHERE id = pay.invoice_id FOR UPDATE;
      SELECT coalesce(sum(amount_cents), 0) INTO refunded FROM payment_refunds WHERE payment_id = NEW.payment_id;
      IF refunded > pay.amount_cents THEN
        RAISE EXCEPTION 'refunds exceed the payment' USING ERRCODE = 'check_violation';
      END IF;
      UPDATE invoices SET paid_cents = paid_cents - NEW.amount_cents, updated_at = now() WHERE id = pay.invoice_id;
      RETURN NEW;
    END $$;
    CREATE TRIGGER payment_refunds_apply AFTER INSERT ON payment_refunds
      FOR EACH ROW EXECUTE FUNCTION payment_refunds_apply();
    CREATE TRIGGER payment_refunds_no_update BEFORE UPDATE OR DELETE ON payment_refunds
      FOR EACH ROW EXECUTE FUNCTION payments_append_only();

    -- A completed card payment that was not recorded as a payment: the owner sees it and dismisses it.
    CREATE TABLE card_payment_problems (
      id                 serial PRIMARY KEY,
      invoice_id         integer REFERENCES invoices(id),
      checkout_id        integer REFERENCES card_checkouts(id),
      event_id           text NOT NULL UNIQUE REFERENCES card_events(event_id),
      session_id         text NOT NULL,
      payment_intent_id  text,
      expected_cents     integer,
      expected_currency  text,
      received_cents     integer NOT NULL,
      received_currency  text NOT NULL,
      message            text NOT NULL,
      created_at         timestamptz NOT NULL DEFAULT now(),
      dismissed_at       timestamptz,
      dismissed_by       integer REFERENCES users(id),
      CHECK ((dismissed_at IS NULL) = (dismissed_by IS NULL))
    );
    CREATE INDEX card_payment_problems_open_idx ON card_payment_problems (created_at DESC) WHERE dismissed_at IS NULL;
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    DROP TABLE card_payment_problems, payment_refunds, card_payments, card_events, card_checkouts CASCADE;
    DROP FUNCTION IF EXISTS payment_refunds_apply();
  `)
}
