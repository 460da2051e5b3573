import fs from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import compression from 'compression'
import connectPgSimple from 'connect-pg-simple'
import express from 'express'
import session from 'express-session'
import helmet from 'helmet'
import { env } from '@server/config/env'
import { pool } from '@server/db/sequelize'
import { csrfProtection } from '@server/middlewares/csrf'
import { knownSession } from '@server/middlewares/known-session'
import { errorHandler, notFound } from '@server/middlewares/error-handler'
import { applicationsRoutes } from '@server/modules/applications/applications.routes'
import type { ApplicationLimits } from '@server/modules/applications/applications.routes'
import { authRoutes } from '@server/modules/auth/auth.routes'
import { batchesRoutes } from '@server/modules/batches/batches.routes'
import { benchRoutes } from '@server/modules/bench/bench.routes'
import { createPassport } from '@server/modules/auth/passport'
import { rememberingStore } from '@server/modules/auth/session-cache'
import { batchSheetRoutes } from '@server/modules/batch-sheet/batch-sheet.routes'
import { cartRoutes } from '@server/modules/cart/cart.routes'
import { cardPaymentsRoutes, cardWebhookRoutes } from '@server/modules/card-payments/card-payments.routes'
import { catalogueRoutes } from '@server/modules/catalogue/catalogue.routes'
import { healthRoutes } from '@server/modules/health/health.routes'
import { homeRoutes } from '@server/modules/home/home.routes'
import { unsentMailRoutes } from '@server/modules/mail/unsent-mail.routes'
import { ingredientsRoutes } from '@server/modules/ingredients/ingredients.routes'
import { invoicesRoutes } from '@server/modules/invoices/invoices.routes'
import { ordersCsvRoutes, ordersRoutes } from '@server/modules/orders/orders.routes'
import { packingRoutes } from '@server/modules/packing/packing.routes'
import { paymentsRoutes } from '@server/modules/payments/payments.routes'
import { planningRoutes } from '@server/modules/planning/planning.routes'
import { priceTiersRoutes } from '@server/modules/price-tiers/price-tiers.routes'
import { pricingRoutes } from '@server/modules/pricing/pricing.routes'
import { purchasesRoutes } from '@server/modules/purchases/purchases.routes'
import { productsRoutes } from '@server/modules/products/products.routes'
import { recipesRoutes } from '@server/modules/recipes/recipes.routes'
import { salesRoutes } from '@server/modules/sales/sales.routes'
import { settingsRoutes, studioRoutes } from '@server/modules/settings/settings.routes'
import { shipmentsRoutes } from '@server/modules/shipments/shipments.routes'
import { shopsRoutes } from '@server/modules/shops/shops.routes'
import { traceRoutes } from '@server/modules/trace/trace.routes'
import { usersRoutes } from '@server/modules/users/users.routes'
import '@server/db/associations'

// The repository folder, from server/ (run through tsx) or from dist/server/ (the built server).
const here = path.dirname(fileURLToPath(import.meta.url))
const root = [path.resolve(here, '..'), path.resolve(here, '..', '..')].find((d) =>
  fs.existsSync(path.join(d, 'package.json')),
)!
export const CLIENT_DIR = path.join(root, 'dist', 'client')

export type AppOptions = {
  /** Serve the built client from dist/client (the started product); tests of the API leave it off. */
  serveClient?: boolean
  /** Delete expired sessions every 15 minutes; off in tests so no timer outlives them. */
  pruneSessions?: boolean
  /** Throttle of the public wholesale application per IP address (defaults: 5 accepted, 30 attempts an hour). */
  applicationLimits?: ApplicationLimits
}

/** Builds the Express app without listening (tests import it). */
export function createApp(opts: AppOptions = {}) {
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', env.TRUST_PROXY ? 1 : false)
  app.set('query parser', 'extended')

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          baseUri: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          objectSrc: ["'none'"],
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  )

  // gzip for every answer over 1 KB that a client takes it for (the built client's scripts and
  // styles, JSON lists, CSV); PDFs and photos are compressed already and pass as they are. The
  // catalogue sends its own stored gzip (catalogue.controller.ts) and skips the wrapper altogether.
  const compress = compression()
  app.use((req, res, next) => (req.path === '/api/catalogue' ? next() : compress(req, res, next)))

  const PgStore = connectPgSimple(session)
  const passport = createPassport()
  const api = express.Router()
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store')
    next()
  })
  // The card service's signed events need the raw bytes: read before the JSON parser.
  api.use('/webhooks/card', cardWebhookRoutes())
  // A pasted purchases CSV may be up to 1 MB (more once JSON-escaped); every other body stays small.
  api.use('/purchases/import', express.json({ limit: '2mb' }))
  api.use(express.json({ limit: '256kb' }))
  // The buyers' catalogue skips the session machinery for a cookie this process has already
  // checked (middlewares/known-session.ts): most of its time went there, not to the answer.
  const known = knownSession(['/catalogue'])
  api.use(known.shortcut)
  api.use(
    known.unlessKnown(
      session({
        name: 'lc.sid',
        secret: env.SESSION_SECRET,
        // Written through to PostgreSQL, read from memory while known (auth/session-cache.ts).
        store: rememberingStore(
          new PgStore({
            pool,
            tableName: 'sessions',
            createTableIfMissing: false,
            pruneSessionInterval: opts.pruneSessions === false ? false : 15 * 60,
            // With rolling: false the browser's cookie expires a fixed time after sign-in, so moving
            // the stored expiry on every request (an UPDATE per GET) bought nothing.
            disableTouch: true,
          }),
        ),
        resave: false,
        saveUninitialized: false,
        rolling: false,
        cookie: {
          httpOnly: true,
          sameSite: 'lax',
          secure: 'auto',
          maxAge: 7 * 24 * 60 * 60 * 1000,
          path: '/',
        },
      }),
    ),
  )
  api.use(known.unlessKnown(passport.initialize()))
  api.use(known.unlessKnown(passport.session()))
  api.use(known.remember)
  api.use(csrfProtection(['/webhooks/']))

  // The buyers' catalogue first: it is the busiest route, and every router mounted without a
  // prefix below (packing, invoices, payments…) would otherwise test its paths on each request.
  api.use('/catalogue', catalogueRoutes())
  api.use('/health', healthRoutes())
  api.use('/auth', authRoutes(passport))
  api.use('/users', usersRoutes())
  api.use('/shops', shopsRoutes())
  api.use('/applications', applicationsRoutes(opts.applicationLimits))
  api.use('/settings', settingsRoutes())
  api.use('/studio', studioRoutes())
  api.use('/products', productsRoutes())
  api.use('/price-tiers', priceTiersRoutes())
  api.use('/pricing', pricingRoutes())
  api.use('/recipes', recipesRoutes())
  api.use(batchSheetRoutes()) // /batch-sheet and /recipes/:id/batch-sheet(.pdf)
  api.use('/batches', batchesRoutes())
  api.use('/trace', traceRoutes())
  api.use('/ingredients', ingredientsRoutes())
  api.use('/purchases', purchasesRoutes())
  api.use(packingRoutes()) // /packing/*, /pick-list(.pdf), /orders/:id/{claim,packed,packing-slip.pdf}
  api.use(shipmentsRoutes()) // /orders/:id/ship
  api.use(invoicesRoutes()) // /invoices(.csv), /invoices/:id/*, /orders/:id/invoice
  api.use(paymentsRoutes()) // /invoices/:id/{payments,remind}, /payments(.csv), /receivables
  api.use(cardPaymentsRoutes()) // /invoices/:id/card-checkout(s), /payments/:id/refunds, /card-payments/*
  api.use('/home', homeRoutes())
  api.use('/unsent-mail', unsentMailRoutes())
  api.use('/planning', planningRoutes())
  api.use(salesRoutes()) // /sales(.csv)
  api.use('/cart', cartRoutes())
  api.use('/orders.csv', ordersCsvRoutes())
  api.use('/orders', ordersRoutes())
  api.use(notFound)
  // The benchmark's bare baselines, beside the API and outside its session (LC_BENCH=1 only).
  if (env.LC_BENCH) app.use('/api/bench', benchRoutes())
  app.use('/api', api)

  if (opts.serveClient && fs.existsSync(path.join(CLIENT_DIR, 'index.html'))) {
    app.use(
      express.static(CLIENT_DIR, {
        index: false,
        setHeaders: (res, file) => {
          if (file.includes(`${path.sep}assets${path.sep}`))
            res.set('Cache-Control', 'public, max-age=31536000, immutable')
        },
      }),
    )
    const indexHtml = fs.readFileSync(path.join(CLIENT_DIR, 'index.html'), 'utf8')
    app.get(/^(?!\/api\/).*/, (_req, res) => {
      res.set('Cache-Control', 'no-cache').type('html').send(indexHtml)
    })
  }

  app.use(errorHandler)
  return app
}
