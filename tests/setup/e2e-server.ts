/**
 * Global setup for the browser tests: the built client and the API served by the real server
 * process (as `npm start` runs it) on a free port, against a database copied from the demo template.
 */
import { spawn } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import type { TestProject } from 'vitest/node'
import { freePort } from '../../scripts/lib/ports'
import type { TestServices } from './services'
import { createTestDatabase } from './test-db'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    /** The server's database, for a test that must set up what no screen can (a relay's refusals). */
    databaseUrl: string
  }
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..')

export default async function setup(project: TestProject) {
  if (!fs.existsSync(path.join(root, 'dist', 'client', 'index.html'))) {
    throw new Error('The browser tests need the built client: run `npm run build:client` (npm test does it).')
  }
  const services = JSON.parse(process.env.LC_TEST_SERVICES ?? 'null') as TestServices | null
  if (!services) throw new Error('tests/setup/services.ts must run before e2e-server.ts')
  const db = await createTestDatabase(services)
  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  const logFile = path.join(root, 'test-results', 'e2e-server.log')
  fs.mkdirSync(path.dirname(logFile), { recursive: true })
  const log = fs.openSync(logFile, 'w')
  // The card-service fake calls this server back with its webhook events.
  const cardKey = `sk_test_${randomBytes(12).toString('hex')}`
  const endpoint = await fetch(`${services.cardUrl}/v1/webhook_endpoints`, {
    method: 'POST',
    headers: { authorization: `Bearer ${cardKey}`, 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ url: `${baseUrl}/api/webhooks/card`, 'enabled_events[0]': '*' }),
  })
  if (!endpoint.ok) throw new Error(`the card-service fake refused the webhook endpoint (${endpoint.status})`)
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'server', 'index.ts')], {
    cwd: root,
    stdio: ['ignore', log, log],
    env: {
      ...process.env,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      APP_URL: baseUrl,
      DATABASE_URL: db.url,
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(services.smtpPort),
      MAIL_CATCHER_URL: services.mailUrl,
      BCRYPT_ROUNDS: '4',
      LOG_LEVEL: 'warn',
      LOGIN_MAX_FAILURES: '50',
      CARD_SECRET_KEY: cardKey,
      CARD_WEBHOOK_SECRET: services.cardWebhookSecret,
      CARD_API_HOST: '127.0.0.1',
      CARD_API_PORT: String(services.cardPort),
      CARD_API_PROTOCOL: 'http',
    },
  })
  const until = Date.now() + 60_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited (${child.exitCode}); see ${logFile}`)
    try {
      const r = await fetch(`${baseUrl}/api/health`)
      if (r.ok) break
    } catch {
      // not listening yet
    }
    if (Date.now() > until) throw new Error(`the server did not answer within 60 s; see ${logFile}`)
    await new Promise((r) => setTimeout(r, 200))
  }
  project.provide('baseUrl', baseUrl)
  project.provide('databaseUrl', db.url)
  return async () => {
    child.kill('SIGTERM')
    await new Promise((r) => (child.exitCode !== null ? r(null) : child.once('exit', r)))
    fs.closeSync(log)
    await db.drop()
  }
}
