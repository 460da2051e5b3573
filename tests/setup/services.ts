/**
 * Global setup for the API and browser projects: a PostgreSQL cluster of their own in a temp
 * folder on a free loopback port (fsync off), two template databases (migrated; migrated and
 * seeded with the demo scenario) that each test file copies, and a mail catcher. All of it is
 * stopped and deleted at teardown and on exit.
 */
import { randomBytes } from 'node:crypto'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import pg from 'pg'
import { Sequelize } from 'sequelize'
import type { TestProject } from 'vitest/node'
import { migrate, seeder } from '../../server/db/migrator'
import { startCardServiceFake } from '../../scripts/lib/card-service-fake'
import { startMailCatcher } from '../../scripts/lib/mail-catcher'
import { freePorts } from '../../scripts/lib/ports'
import { destroyCluster, ensureDatabase, startCluster } from '../../scripts/lib/postgres'

export type TestServices = {
  pgPort: number
  superUrl: string
  appUser: string
  appPassword: string
  smtpPort: number
  mailUrl: string
  /** The local card-service fake: the SDK's host/port, and the secret it signs webhooks with. */
  cardPort: number
  cardUrl: string
  cardWebhookSecret: string
}

declare module 'vitest' {
  export interface ProvidedContext {
    services: TestServices
  }
}

export default async function setup(project: TestProject) {
  process.env.BCRYPT_ROUNDS = '4'
  const base = fs.mkdtempSync(path.join(os.tmpdir(), 'lathercase-test-'))
  fs.chmodSync(base, 0o755)
  const superPassword = randomBytes(12).toString('hex')
  // Chosen together, so the database and the mail catcher's two ports cannot be handed the same one.
  const [pgPort, smtpPort, webPort] = await freePorts(3)
  const cluster = startCluster({
    dataDir: path.join(base, 'pg'),
    port: pgPort!,
    superPassword,
    fast: true,
    log: () => {},
  })
  let stopped = false
  const mail = await startMailCatcher({
    smtpPort: smtpPort!,
    webPort: webPort!,
    dir: path.join(base, 'mail'),
  })
  const cardWebhookSecret = `whsec_${randomBytes(24).toString('hex')}`
  const card = await startCardServiceFake({ webhookSecret: cardWebhookSecret })
  const teardown = async () => {
    if (stopped) return
    stopped = true
    await card.stop().catch(() => {})
    await mail.stop().catch(() => {})
    destroyCluster(cluster)
    fs.rmSync(base, { recursive: true, force: true })
  }
  process.once('exit', () => {
    if (!stopped) destroyCluster(cluster)
  })

  const appPassword = randomBytes(12).toString('hex')
  for (const [db, seed] of [
    ['tpl_empty', false],
    ['tpl_demo', true],
  ] as const) {
    const url = await ensureDatabase(cluster, db, 'lathercase', appPassword)
    const s = new Sequelize(url, { dialect: 'postgres', dialectModule: pg, logging: false })
    await migrate(s)
    if (seed) await seeder(s).up()
    await s.close()
  }
  // Copies need the role to create databases.
  const admin = new pg.Client({ connectionString: cluster.superUrl() })
  await admin.connect()
  await admin.query('ALTER ROLE lathercase CREATEDB')
  await admin.end()

  const services: TestServices = {
    pgPort: cluster.port,
    superUrl: cluster.superUrl(),
    appUser: 'lathercase',
    appPassword,
    smtpPort: mail.smtpPort,
    mailUrl: mail.url,
    cardPort: card.port,
    cardUrl: card.url,
    cardWebhookSecret,
  }
  project.provide('services', services)
  process.env.LC_TEST_SERVICES = JSON.stringify(services)
  return teardown
}
