import type { Migration } from '@server/db/migrator'

// Accounts, people, sign-in sessions, settings, uploads and the audit trail.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE TABLE uploads (
      id            serial PRIMARY KEY,
      purpose       text NOT NULL CHECK (purpose IN ('resale_certificate', 'product_photo', 'other')),
      filename      text NOT NULL CHECK (length(filename) BETWEEN 1 AND 200),
      content_type  text NOT NULL,
      size_bytes    integer NOT NULL CHECK (size_bytes > 0),
      sha256        char(64) NOT NULL,
      data          bytea NOT NULL,
      uploaded_by   integer,
      created_at    timestamptz NOT NULL DEFAULT now(),
      updated_at    timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE price_tiers (
      id                 serial PRIMARY KEY,
      name               text NOT NULL UNIQUE CHECK (length(name) BETWEEN 1 AND 60),
      target_margin_pct  numeric(5,2) NOT NULL CHECK (target_margin_pct >= 0 AND target_margin_pct < 100),
      sort_order         integer NOT NULL DEFAULT 0,
      created_at         timestamptz NOT NULL DEFAULT now(),
      updated_at         timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE shops (
      id                      serial PRIMARY KEY,
      legal_name              text NOT NULL CHECK (length(legal_name) BETWEEN 1 AND 160),
      trading_name            text NOT NULL CHECK (length(trading_name) BETWEEN 1 AND 160),
      contact_name            text NOT NULL,
      contact_email           text NOT NULL,
      contact_phone           text,
      billing_address         jsonb NOT NULL,
      shipping_address        jsonb NOT NULL,
      tax_id                  text,
      certificate_upload_id   integer REFERENCES uploads(id),
      certificate_expires_on  date,
      tier_id                 integer REFERENCES price_tiers(id),
      payment_terms           text NOT NULL DEFAULT 'prepay' CHECK (payment_terms IN ('prepay', 'net_15', 'net_30')),
      status                  text NOT NULL DEFAULT 'applied' CHECK (status IN ('applied', 'active', 'on_hold', 'closed', 'declined')),
      opening_order_done      boolean NOT NULL DEFAULT false,
      store_type              text,
      website                 text,
      notes                   text,
      decline_reason          text,
      created_at              timestamptz NOT NULL DEFAULT now(),
      updated_at              timestamptz NOT NULL DEFAULT now(),
      CHECK (status IN ('applied', 'declined') OR tier_id IS NOT NULL)
    );
    CREATE INDEX shops_status_idx ON shops (status);

    CREATE TABLE users (
      id             serial PRIMARY KEY,
      email          text NOT NULL CHECK (email = lower(email) AND length(email) BETWEEN 3 AND 254),
      name           text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      role           text NOT NULL CHECK (role IN ('owner', 'packer', 'buyer')),
      shop_id        integer REFERENCES shops(id),
      password_hash  text,
      active         boolean NOT NULL DEFAULT true,
      last_login_at  timestamptz,
      created_at     timestamptz NOT NULL DEFAULT now(),
      updated_at     timestamptz NOT NULL DEFAULT now(),
      CHECK ((role = 'buyer') = (shop_id IS NOT NULL))
    );
    CREATE UNIQUE INDEX users_email_key ON users (email);
    CREATE INDEX users_shop_idx ON users (shop_id);
    ALTER TABLE uploads ADD FOREIGN KEY (uploaded_by) REFERENCES users(id);

    -- Single-use tokens for password resets and invitations; only their SHA-256 is kept.
    CREATE TABLE auth_tokens (
      id          serial PRIMARY KEY,
      user_id     integer NOT NULL REFERENCES users(id),
      purpose     text NOT NULL CHECK (purpose IN ('reset', 'invite')),
      token_hash  char(64) NOT NULL UNIQUE,
      expires_at  timestamptz NOT NULL,
      used_at     timestamptz,
      created_at  timestamptz NOT NULL DEFAULT now(),
      updated_at  timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX auth_tokens_user_idx ON auth_tokens (user_id);

    -- express-session through connect-pg-simple
    CREATE TABLE sessions (
      sid     varchar NOT NULL PRIMARY KEY,
      sess    json NOT NULL,
      expire  timestamp(6) NOT NULL
    );
    CREATE INDEX sessions_expire_idx ON sessions (expire);

    CREATE TABLE settings (
      key         text PRIMARY KEY,
      value       jsonb NOT NULL,
      updated_at  timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE audit_events (
      id          bigserial PRIMARY KEY,
      user_id     integer REFERENCES users(id),
      action      text NOT NULL,
      entity      text NOT NULL,
      entity_id   integer,
      data        jsonb,
      created_at  timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX audit_events_entity_idx ON audit_events (entity, entity_id);
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(
    'DROP TABLE audit_events, settings, sessions, auth_tokens, users, shops, price_tiers, uploads CASCADE',
  )
}
