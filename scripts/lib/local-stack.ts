/**
 * The local stack that `npm start` and `npm run dev` share: secrets kept under .data/, the
 * PostgreSQL cluster, the database with migrations and (on an empty database) the demo data,
 * and the mail catcher.
 */
import { randomBytes } from 'node:crypto'
import fs from 'node:fs'
import path from 'node:path'
import { Sequelize } from 'sequelize'
import pg from 'pg'
import { migrate, seedIfEmpty } from '../../server/db/migrator'
import { startMailCatcher } from './mail-catcher'
import type { MailCatcher } from './mail-catcher'
import { isPortFree, freePort } from './ports'
import { ensureDatabase, runningPort, startCluster } from './postgres'
import type { Cluster } from './postgres'
import { ROOT } from './root'

export { ROOT }

export const DATA_DIR = path.join(ROOT, '.data')

type Secrets = {
  sessionSecret: string
  pgSuperPassword: string
  pgAppPassword: string
  /** The test key and webhook secret of the local card-service fake. */
  cardSecretKey: string
  cardWebhookSecret: string
}

/** Random secrets made on first start and kept in .data/secrets.json (mode 0600); new ones are added to an older file. */
export function loadSecrets(): Secrets {
  const file = path.join(DATA_DIR, 'secrets.json')
  fs.mkdirSync(DATA_DIR, { recursive: true })
  const kept = fs.existsSync(file) ? (JSON.parse(fs.readFileSync(file, 'utf8')) as Partial<Secrets>) : {}
  const s: Secrets = {
    sessionSecret: kept.sessionSecret ?? randomBytes(48).toString('base64url'),
    pgSuperPassword: kept.pgSuperPassword ?? randomBytes(24).toString('base64url'),
    pgAppPassword: kept.pgAppPassword ?? randomBytes(24).toString('base64url'),
    cardSecretKey: kept.cardSecretKey ?? `sk_test_${randomBytes(16).toString('hex')}`,
    cardWebhookSecret: kept.cardWebhookSecret ?? `whsec_${randomBytes(24).toString('hex')}`,
  }
  if (Object.keys(s).some((k) => !(k in kept))) {
    fs.writeFileSync(file, JSON.stringify(s, null, 2) + '\n', { mode: 0o600 })
  }
  return s
}

export type LocalStack = {
  cluster: Cluster
  databaseUrl: string
  mail: MailCatcher
  seeded: boolean
  stop(): Promise<void>
}

async function pickPort(wanted: number, what: string, log: (l: string) => void) {
  if (await isPortFree(wanted)) return wanted
  const port = await freePort()
  log(`Port ${wanted} for ${what} is taken; using ${port} instead.`)
  return port
}

export async function startLocalStack(log: (l: string) => void = console.log): Promise<LocalStack> {
  const secrets = loadSecrets()
  const dataDir = path.join(DATA_DIR, 'pg')
  const wantedPg = Number(process.env.PG_PORT ?? 54329)
  const already = runningPort(dataDir)
  const pgPort = already ?? (await pickPort(wantedPg, 'PostgreSQL', log))
  const cluster = startCluster({ dataDir, port: pgPort, superPassword: secrets.pgSuperPassword, log })
  log(
    `PostgreSQL ${cluster.startedHere ? 'started' : 'already running'} on 127.0.0.1:${cluster.port} (${cluster.dataDir})`,
  )
  const databaseUrl = await ensureDatabase(cluster, 'lathercase', 'lathercase', secrets.pgAppPassword)

  const sequelize = new Sequelize(databaseUrl, { dialect: 'postgres', dialectModule: pg, logging: false })
  let seeded = false
  try {
    const done = await migrate(sequelize)
    if (done.length) log(`Applied ${done.length} migration(s).`)
    const seeding = await seedIfEmpty(sequelize)
    seeded = seeding === 'seeded'
    if (seeded) log('Loaded the demo data into the empty database.')
    if (seeding === 'topped-up') log('Added the newer parts of the demo scenario.')
  } finally {
    await sequelize.close()
  }

  const smtpPort = await pickPort(Number(process.env.MAIL_SMTP_PORT ?? 1025), 'the mail catcher (SMTP)', log)
  const webPort = await pickPort(Number(process.env.MAIL_WEB_PORT ?? 1080), 'the mail catcher (web)', log)
  const mail = await startMailCatcher({ smtpPort, webPort, dir: path.join(DATA_DIR, 'mail') })

  return {
    cluster,
    databaseUrl,
    mail,
    seeded,
    async stop() {
      await mail.stop().catch(() => {})
      if (cluster.startedHere) cluster.stop()
    },
  }
}
