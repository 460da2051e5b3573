/**
 * Per test file: a database of its own, copied from the demo template, and the environment the
 * server modules read at import. Runs before the test file imports anything from server/.
 */
import { afterAll, inject } from 'vitest'
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
})

afterAll(async () => {
  const { closeDb } = await import('@server/db/sequelize')
  await closeDb()
  await db.drop()
})
