/**
 * Who may call what: one line per API route, read against the server's own route table
 * (tests/reliability/route-table.ts). A route the server answers without a line here, or a line
 * whose route no longer exists, fails tests/reliability/access-matrix.test.ts.
 *
 * Each line gives the outcome for five callers, in this order:
 *   signed out · buyer of shop A · buyer of shop B · packer · owner
 * Path parameters are filled with shop A's records (its order, invoice, shop, buyer), so the
 * buyer of shop B asking for them must get 404, never a hint that they exist.
 *
 *   ok   the caller gets past the gate: a GET answers 2xx; a write answers 2xx or a 4xx about the
 *        request itself (the matrix sends `{}`: 400 invalid_input, 409 a state conflict, 422…)
 *   401  signed out      403  wrong role      404  not theirs (or not there)
 *
 * Options: `fuzz: false` (with the reason) keeps a write out of the hostile-body tests;
 * `query` is sent with a GET that needs one; `fresh` signs each caller in again around the call
 * (a route that ends the session).
 */

export const CALLERS = ['anon', 'buyerA', 'buyerB', 'packer', 'owner'] as const
export type Caller = (typeof CALLERS)[number]
export type Outcome = 'ok' | '401' | '403' | '404'

export type MatrixEntry = {
  access: Record<Caller, Outcome>
  query?: string
  fresh?: boolean
  fuzz?: false | { skip: string }
}

type Options = Omit<MatrixEntry, 'access'>

/** `r('401 ok 404 ok ok')`: the outcomes for anon, buyer A, buyer B, packer, owner. */
function r(outcomes: string, opts: Options = {}): MatrixEntry {
  const parts = outcomes.trim().split(/\s+/)
  if (parts.length !== CALLERS.length || parts.some((p) => !['ok', '401', '403', '404'].includes(p)))
    throw new Error(`a matrix line needs five outcomes (ok, 401, 403, 404): "${outcomes}"`)
  return {
    ...opts,
    access: Object.fromEntries(CALLERS.map((c, i) => [c, parts[i]])) as Record<Caller, Outcome>,
  }
}

// Shorthands for the common rows.
const OWNER = r('401 403 403 403 ok')
const STAFF = r('401 403 403 ok ok')
const BUYER = r('401 ok ok 403 403')
const EVERYONE_SIGNED_IN = r('401 ok ok ok ok')
const PUBLIC = r('ok ok ok ok ok')
/** A's record: A's buyer and the owner; B's buyer is told it does not exist. */
const A_AND_OWNER = r('401 ok 404 403 ok')
/** A's order: A's buyer, the packer and the owner. */
const A_STAFF = r('401 ok 404 ok ok')

export const ACCESS_MATRIX: Record<string, MatrixEntry> = {
  'GET /api/health': PUBLIC,
  'GET /api/auth/csrf': PUBLIC,
  'GET /api/auth/me': EVERYONE_SIGNED_IN,
  'POST /api/auth/login': PUBLIC,
  'POST /api/auth/logout': r('ok ok ok ok ok', {
    fresh: true,
    fuzz: { skip: 'ends the session of the caller' },
  }),
  'POST /api/auth/password-reset': PUBLIC,
  'GET /api/auth/tokens/:token': PUBLIC,
  'POST /api/auth/set-password': PUBLIC,
  'PUT /api/auth/password': EVERYONE_SIGNED_IN,

  'GET /api/users': OWNER,
  'POST /api/users': OWNER,
  'PATCH /api/users/:id': OWNER,
  'POST /api/users/:id/invitation': OWNER,

  'GET /api/shops/mine': BUYER,
  'GET /api/shops/mine/certificate': BUYER,
  'PUT /api/shops/mine/certificate': BUYER,
  'GET /api/shops': OWNER,
  'GET /api/shops/:id': OWNER,
  'PATCH /api/shops/:id': OWNER,
  'POST /api/shops/:id/approve': OWNER,
  'POST /api/shops/:id/decline': OWNER,
  'POST /api/shops/:id/hold': OWNER,
  'POST /api/shops/:id/close': OWNER,
  'POST /api/shops/:id/reactivate': OWNER,
  'POST /api/shops/:id/buyers': OWNER,
  'GET /api/shops/:id/certificate': A_AND_OWNER,
  'PUT /api/shops/:id/certificate': OWNER,
  'POST /api/applications': PUBLIC,

  'GET /api/settings': OWNER,
  'PUT /api/settings/studio': OWNER,
  'PUT /api/settings/planning': OWNER,
  'GET /api/studio': EVERYONE_SIGNED_IN,

  'GET /api/products/:id/photo': EVERYONE_SIGNED_IN,
  'GET /api/products': OWNER,
  'GET /api/products/recipe-options': OWNER,
  'POST /api/products': OWNER,
  'GET /api/products/:id': OWNER,
  'PATCH /api/products/:id': OWNER,
  'POST /api/products/:id/photo': OWNER,
  'DELETE /api/products/:id/photo': r('401 403 403 403 ok', { fuzz: { skip: 'takes no body' } }),
  'GET /api/products/:id/declaration': OWNER,
  'POST /api/products/:id/declaration': OWNER,

  'GET /api/price-tiers': OWNER,
  'POST /api/price-tiers': OWNER,
  'PATCH /api/price-tiers/:id': OWNER,
  'GET /api/pricing': OWNER,
  'POST /api/pricing/accept': OWNER,
  'PUT /api/pricing/:productId/:tierId': OWNER,

  'GET /api/recipes': OWNER,
  'POST /api/recipes': OWNER,
  'GET /api/recipes/ingredient-options': OWNER,
  'GET /api/recipes/:id': OWNER,
  'PUT /api/recipes/:id': OWNER,
  'POST /api/recipes/:id/archive': OWNER,
  'POST /api/recipes/:id/restore': OWNER,
  'GET /api/recipes/:id/cost-sheet': OWNER,
  'POST /api/batch-sheet': OWNER,
  'GET /api/recipes/:id/batch-sheet': OWNER,
  'GET /api/recipes/:id/batch-sheet.pdf': OWNER,

  'GET /api/batches/products': STAFF,
  'GET /api/batches/suggest-lots': r('401 403 403 403 ok', { query: 'productId=:productId&oilWeightG=1000' }),
  'GET /api/batches': STAFF,
  'POST /api/batches': OWNER,
  'GET /api/batches/:id': STAFF,
  'PATCH /api/batches/:id': OWNER,
  'POST /api/batches/:id/moves': STAFF,
  'GET /api/trace/ingredient-lots': r('401 403 403 403 ok', { query: 'ingredientId=:ingredientId' }),
  'GET /api/trace/ingredient-lots/:lotId.csv': OWNER,
  'GET /api/trace/ingredient-lots/:lotId': OWNER,

  'GET /api/ingredients': OWNER,
  'POST /api/ingredients': OWNER,
  'GET /api/ingredients/:id': OWNER,
  'PATCH /api/ingredients/:id': OWNER,
  'POST /api/ingredients/:id/archive': OWNER,
  'POST /api/ingredients/:id/restore': OWNER,
  'GET /api/purchases': OWNER,
  'POST /api/purchases': OWNER,
  'POST /api/purchases/import/preview': OWNER,
  'POST /api/purchases/import/confirm': OWNER,
  'GET /api/purchases/:id': OWNER,
  'PATCH /api/purchases/:id': OWNER,

  'GET /api/packing/queue': STAFF,
  'GET /api/packing/orders/:id': STAFF,
  'POST /api/orders/:id/claim': STAFF,
  'POST /api/orders/:id/packed': STAFF,
  'GET /api/orders/:id/packing-slip.pdf': STAFF,
  'GET /api/pick-list': r('401 403 403 ok ok', { query: 'orders=:orderId' }),
  'GET /api/pick-list.pdf': r('401 403 403 ok ok', { query: 'orders=:orderId' }),
  'POST /api/orders/:id/ship': STAFF,

  'GET /api/invoices': r('401 ok ok 403 ok'),
  'GET /api/invoices.csv': OWNER,
  'GET /api/invoices/:id': A_AND_OWNER,
  'GET /api/invoices/:id/pdf': A_AND_OWNER,
  'POST /api/invoices/:id/void': OWNER,
  'POST /api/invoices/:id/send': OWNER,
  'POST /api/orders/:id/invoice': OWNER,
  'POST /api/invoices/:id/payments': OWNER,
  'POST /api/invoices/:id/remind': OWNER,
  'GET /api/payments': OWNER,
  'GET /api/payments.csv': OWNER,
  'GET /api/receivables': OWNER,
  'POST /api/webhooks/card': r('ok ok ok ok ok', {
    fuzz: { skip: 'signed by the card service: unsigned bodies are 400, in tests/api/card-payments.test.ts' },
  }),
  'GET /api/card-payments/status': EVERYONE_SIGNED_IN,
  'POST /api/invoices/:id/card-checkout': r('401 ok 404 403 403', {
    fuzz: { skip: 'takes no body; each call opens a checkout at the card service' },
  }),
  'GET /api/invoices/:id/card-checkouts/:sessionId': r('401 ok 404 403 403'),
  'POST /api/payments/:id/refunds': OWNER,
  'GET /api/card-payments/problems': OWNER,
  'POST /api/card-payments/problems/:id/dismiss': r('401 403 403 403 ok', {
    fuzz: { skip: 'takes no body' },
  }),

  'GET /api/home/today': OWNER,
  'GET /api/unsent-mail': OWNER,
  'POST /api/unsent-mail/:id/send': r('401 403 403 403 ok', { fuzz: { skip: 'takes no body' } }),
  'POST /api/unsent-mail/:id/dismiss': r('401 403 403 403 ok', { fuzz: { skip: 'takes no body' } }),
  'GET /api/planning/plan': OWNER,
  'POST /api/planning/pours': OWNER,
  'GET /api/planning/pours/:id': OWNER,
  'DELETE /api/planning/pours/:id': r('401 403 403 403 ok', { fuzz: { skip: 'takes no body' } }),
  'GET /api/sales': r('401 403 403 403 ok', { query: 'from=2026-01-01&to=2026-12-31&by=shop' }),
  'GET /api/sales.csv': r('401 403 403 403 ok', { query: 'from=2026-01-01&to=2026-12-31' }),

  'GET /api/catalogue': BUYER,
  'GET /api/cart': BUYER,
  'DELETE /api/cart': r('401 ok ok 403 403', { fuzz: { skip: 'takes no body' } }),
  'PUT /api/cart/lines/:productId': BUYER,
  'DELETE /api/cart/lines/:productId': r('401 ok ok 403 403', { fuzz: { skip: 'takes no body' } }),
  'GET /api/orders.csv': r('401 ok ok 403 ok'),
  'GET /api/orders': EVERYONE_SIGNED_IN,
  'POST /api/orders': BUYER,
  'POST /api/orders/preorders/allocate': OWNER,
  'GET /api/orders/:id': A_STAFF,
  'POST /api/orders/:id/confirm': OWNER,
  'POST /api/orders/:id/cancel': A_AND_OWNER,
  'GET /api/orders/:id/product-options': OWNER,
  'PATCH /api/orders/:id/lines': OWNER,
  'POST /api/orders/:id/reorder': r('401 ok 404 403 403'),
}
