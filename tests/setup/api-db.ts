/**
 * Per test file: a database of its own, copied from the demo template, and the environment the
 * server modules read at import. Runs before the test file imports anything from server/.
 */
import { randomBytes } from 'node:crypto'
import { afterAll, afterEach, inject } from 'vitest'
import { createTestDatabase } from './test-db'

const services = inject('services')
const db = await createTestDatabase(services)

Object.assign(process.env, {
  NODE_ENV: 'test',
  DATABASE_URL: db.url,
  DB_POOL_MAX: '6',
  SMTP_HOST: '127.0.0.1',
  SMTP_PORT: String(services.smtpPort),
  MAIL_CATCHER_URL: services.mailUrl,
  BCRYPT_ROUNDS: '4',
  LOG_LEVEL: 'warn',
  APP_URL: 'http://127.0.0.1:3999',
  JOBS: 'false',
  // The card-service fake; a key of its own per file, so each file's webhook endpoint is its own.
  CARD_SECRET_KEY: `sk_test_${randomBytes(12).toString('hex')}`,
  CARD_WEBHOOK_SECRET: services.cardWebhookSecret,
  CARD_API_HOST: '127.0.0.1',
  CARD_API_PORT: String(services.cardPort),
  CARD_API_PROTOCOL: 'http',
})

// pg warns (once per process) when a query is sent on a connection still busy with another, as
// Promise.all over one transaction's queries does; pg 9 will refuse it. Any such warning fails
// the test that was running.
let pgWarnings: string[] = []
process.on('warning', (w) => {
  if (w.name === 'DeprecationWarning' && w.message.includes('pg@9')) pgWarnings.push(w.message)
})
afterEach(() => {
  const seen = pgWarnings
  pgWarnings = []
  if (seen.length > 0) throw new Error(`pg warned: ${seen[0]}`)
})

afterAll(async () => {
  // Mail still going out reads the database: let it finish before the database closes (a mail
  // that fails still logs its warning; one that hangs is named here instead of waited on).
  const { drainMail } = await import('@server/modules/invoices/mail-queue')
  const left = await drainMail(20_000)
  if (left > 0) console.warn(`${left} e-mails were still being sent when the test file ended.`)
  const { closeDb } = await import('@server/db/sequelize')
  await closeDb()
  await db.drop()
})
