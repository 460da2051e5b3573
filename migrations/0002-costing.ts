import type { Migration } from '@server/db/migrator'

// Ingredients and their purchases, recipes, products, and prices per tier and case count.
export const up: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(`
    CREATE TABLE ingredients (
      id              serial PRIMARY KEY,
      name            text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      kind            text NOT NULL CHECK (kind IN ('oil', 'lye', 'liquid', 'fragrance', 'colourant', 'additive', 'packaging')),
      inci            text CHECK (inci IS NULL OR length(inci) <= 200),
      -- g NaOH per g of oil; sap_koh (mg KOH per g) is kept as entered or derived (CIAAW molar masses)
      sap_naoh        numeric(9,7) CHECK (sap_naoh IS NULL OR (sap_naoh > 0 AND sap_naoh < 0.4)),
      sap_koh         numeric(7,3) CHECK (sap_koh IS NULL OR (sap_koh > 0 AND sap_koh < 500)),
      purity_pct      numeric(5,2) CHECK (purity_pct IS NULL OR (purity_pct > 0 AND purity_pct <= 100)),
      max_usage_pct   numeric(5,2) CHECK (max_usage_pct IS NULL OR (max_usage_pct > 0 AND max_usage_pct <= 100)),
      vanillin_pct    numeric(5,2) CHECK (vanillin_pct IS NULL OR (vanillin_pct >= 0 AND vanillin_pct <= 100)),
      unit            text NOT NULL DEFAULT 'g' CHECK (unit IN ('g', 'each')),
      reorder_level   numeric(12,3) CHECK (reorder_level IS NULL OR reorder_level >= 0),
      notes           text,
      archived_at     timestamptz,
      created_at      timestamptz NOT NULL DEFAULT now(),
      updated_at      timestamptz NOT NULL DEFAULT now(),
      CHECK (kind = 'oil' OR (sap_naoh IS NULL AND sap_koh IS NULL)),
      CHECK (kind <> 'oil' OR sap_naoh IS NOT NULL),
      CHECK ((kind = 'packaging') = (unit = 'each'))
    );
    CREATE UNIQUE INDEX ingredients_name_key ON ingredients (lower(name)) WHERE archived_at IS NULL;

    -- A purchase of one ingredient. quantity and remaining are in the ingredient's unit (g or each);
    -- remaining goes down only inside the transaction that records a batch consuming it.
    CREATE TABLE ingredient_lots (
      id                  serial PRIMARY KEY,
      ingredient_id       integer NOT NULL REFERENCES ingredients(id),
      supplier            text NOT NULL CHECK (length(supplier) BETWEEN 1 AND 120),
      supplier_lot_code   text CHECK (supplier_lot_code IS NULL OR length(supplier_lot_code) <= 60),
      received_on         date NOT NULL,
      entered_quantity    numeric(12,3) NOT NULL CHECK (entered_quantity > 0),
      entered_unit        text NOT NULL CHECK (entered_unit IN ('g', 'kg', 'oz', 'lb', 'each')),
      quantity            numeric(14,4) NOT NULL CHECK (quantity > 0),
      remaining           numeric(14,4) NOT NULL CHECK (remaining >= 0),
      cost_cents          integer NOT NULL CHECK (cost_cents >= 0),
      freight_cents       integer NOT NULL DEFAULT 0 CHECK (freight_cents >= 0),
      notes               text,
      created_by          integer REFERENCES users(id),
      created_at          timestamptz NOT NULL DEFAULT now(),
      updated_at          timestamptz NOT NULL DEFAULT now(),
      CHECK (remaining <= quantity)
    );
    CREATE INDEX ingredient_lots_ingredient_idx ON ingredient_lots (ingredient_id, received_on, id);

    CREATE TABLE recipes (
      id                      serial PRIMARY KEY,
      name                    text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      notes                   text,
      superfat_pct            numeric(5,2) NOT NULL CHECK (superfat_pct >= 0 AND superfat_pct <= 20),
      water_mode              text NOT NULL CHECK (water_mode IN ('concentration', 'ratio')),
      lye_concentration_pct   numeric(5,2) CHECK (lye_concentration_pct IS NULL OR (lye_concentration_pct >= 20 AND lye_concentration_pct <= 50)),
      water_lye_ratio         numeric(5,3) CHECK (water_lye_ratio IS NULL OR (water_lye_ratio >= 1 AND water_lye_ratio <= 4)),
      lye_ingredient_id       integer REFERENCES ingredients(id),
      water_ingredient_id     integer REFERENCES ingredients(id),
      labour_minutes          integer NOT NULL DEFAULT 0 CHECK (labour_minutes >= 0),
      cure_days               integer NOT NULL DEFAULT 28 CHECK (cure_days BETWEEN 0 AND 365),
      bar_weight_g            numeric(8,2) NOT NULL CHECK (bar_weight_g > 0),
      bars_per_mould          integer NOT NULL CHECK (bars_per_mould > 0),
      bars_kept_back          integer NOT NULL DEFAULT 0 CHECK (bars_kept_back >= 0),
      mould_oil_weight_g      numeric(10,2) NOT NULL CHECK (mould_oil_weight_g > 0),
      archived_at             timestamptz,
      created_at              timestamptz NOT NULL DEFAULT now(),
      updated_at              timestamptz NOT NULL DEFAULT now(),
      CHECK ((water_mode = 'concentration') = (lye_concentration_pct IS NOT NULL)),
      CHECK ((water_mode = 'ratio') = (water_lye_ratio IS NOT NULL)),
      CHECK (bars_kept_back < bars_per_mould)
    );
    CREATE UNIQUE INDEX recipes_name_key ON recipes (lower(name)) WHERE archived_at IS NULL;

    -- oils and fragrances as % of total oils; additives and colourants in g per kg of oils; packaging per bar.
    CREATE TABLE recipe_items (
      id              serial PRIMARY KEY,
      recipe_id       integer NOT NULL REFERENCES recipes(id) ON DELETE CASCADE,
      ingredient_id   integer NOT NULL REFERENCES ingredients(id),
      role            text NOT NULL CHECK (role IN ('oil', 'fragrance', 'additive', 'packaging')),
      pct_of_oils     numeric(7,3) CHECK (pct_of_oils IS NULL OR (pct_of_oils > 0 AND pct_of_oils <= 100)),
      g_per_kg_oils   numeric(9,3) CHECK (g_per_kg_oils IS NULL OR g_per_kg_oils > 0),
      qty_per_bar     numeric(9,3) CHECK (qty_per_bar IS NULL OR qty_per_bar > 0),
      sort_order      integer NOT NULL DEFAULT 0,
      UNIQUE (recipe_id, ingredient_id, role),
      CHECK ((role IN ('oil', 'fragrance')) = (pct_of_oils IS NOT NULL)),
      CHECK ((role = 'additive') = (g_per_kg_oils IS NOT NULL)),
      CHECK ((role = 'packaging') = (qty_per_bar IS NOT NULL))
    );
    CREATE INDEX recipe_items_recipe_idx ON recipe_items (recipe_id);

    CREATE TABLE products (
      id                        serial PRIMARY KEY,
      sku                       text NOT NULL CHECK (sku ~ '^[A-Z0-9]+(-[A-Z0-9]+)*$' AND length(sku) <= 12),
      name                      text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      scent_notes               text CHECK (scent_notes IS NULL OR length(scent_notes) <= 200),
      description               text CHECK (description IS NULL OR length(description) <= 2000),
      photo_upload_id           integer REFERENCES uploads(id),
      recipe_id                 integer NOT NULL REFERENCES recipes(id),
      net_weight_g              integer NOT NULL CHECK (net_weight_g > 0),
      cut_weight_g              integer NOT NULL CHECK (cut_weight_g > 0),
      case_pack                 integer NOT NULL CHECK (case_pack BETWEEN 1 AND 500),
      msrp_cents                integer NOT NULL CHECK (msrp_cents >= 0),
      gtin                      text CHECK (gtin IS NULL OR gtin ~ '^([0-9]{8}|[0-9]{12,14})$'),
      declaration               text,
      declaration_confirmed_at  timestamptz,
      active                    boolean NOT NULL DEFAULT true,
      created_at                timestamptz NOT NULL DEFAULT now(),
      updated_at                timestamptz NOT NULL DEFAULT now(),
      CHECK (net_weight_g <= cut_weight_g)
    );
    CREATE UNIQUE INDEX products_sku_key ON products (sku);
    CREATE UNIQUE INDEX products_gtin_key ON products (gtin) WHERE gtin IS NOT NULL;

    -- The buyer pays the break of the case count on the line: the greatest min_cases <= cases.
    CREATE TABLE price_breaks (
      id                serial PRIMARY KEY,
      tier_id           integer NOT NULL REFERENCES price_tiers(id),
      product_id        integer NOT NULL REFERENCES products(id),
      min_cases         integer NOT NULL CHECK (min_cases >= 1),
      unit_price_cents  integer NOT NULL CHECK (unit_price_cents > 0),
      created_at        timestamptz NOT NULL DEFAULT now(),
      updated_at        timestamptz NOT NULL DEFAULT now(),
      UNIQUE (tier_id, product_id, min_cases)
    );
    CREATE INDEX price_breaks_product_idx ON price_breaks (product_id);
  `)
}

export const down: Migration = async ({ context: { sequelize } }) => {
  await sequelize.query(
    'DROP TABLE price_breaks, products, recipe_items, recipes, ingredient_lots, ingredients CASCADE',
  )
}
