/**
 * Database chores on the local cluster under .data/ (started if needed, stopped afterwards if we
 * started it):
 *   npm run db:migrate             apply pending migrations
 *   npm run db:seed                load the demo scenario into an empty database
 *   npm run db:backup [FILE]       write a pg_dump archive (default .data/backups/lathercase-<time>.dump)
 *   npm run db:restore FILE [--replace]
 *                                  bring an archive back into an empty database (--replace drops the current one)
 */
import fs from 'node:fs'
import path from 'node:path'
import pg from 'pg'
import { Sequelize } from 'sequelize'
import { migrate, seedIfEmpty } from '../server/db/migrator'
import { backupDatabase, restoreDatabase } from './lib/backup'
import { DATA_DIR, loadSecrets } from './lib/local-stack'
import { ensureDatabase, runningPort, startCluster } from './lib/postgres'

async function main() {
  const [command, ...rest] = process.argv.slice(2)
  const secrets = loadSecrets()
  const dataDir = path.join(DATA_DIR, 'pg')
  const port = runningPort(dataDir) ?? Number(process.env.PG_PORT ?? 54329)
  const cluster = startCluster({ dataDir, port, superPassword: secrets.pgSuperPassword, log: () => {} })
  try {
    if (command === 'restore') {
      const file = rest.find((a) => !a.startsWith('--'))
      if (!file || !fs.existsSync(file))
        throw new Error('Usage: npm run db:restore FILE [--replace] (the file must exist)')
      await ensureDatabase(cluster, 'postgres', 'lathercase', secrets.pgAppPassword)
      await restoreDatabase({
        bindir: cluster.bindir,
        superUrl: cluster.superUrl(),
        db: 'lathercase',
        owner: 'lathercase',
        file: path.resolve(file),
        replace: rest.includes('--replace'),
      })
      console.log(`Restored ${file} into the lathercase database.`)
      return
    }
    const url = await ensureDatabase(cluster, 'lathercase', 'lathercase', secrets.pgAppPassword)
    if (command === 'backup') {
      const stamp = new Date().toISOString().replace(/[:.]/g, '-').slice(0, 19)
      const file = path.resolve(rest[0] ?? path.join(DATA_DIR, 'backups', `lathercase-${stamp}.dump`))
      fs.mkdirSync(path.dirname(file), { recursive: true })
      backupDatabase({ bindir: cluster.bindir, url, file })
      console.log(`Wrote ${file} (${fs.statSync(file).size} bytes).`)
      return
    }
    if (command === 'migrate' || command === 'seed') {
      const s = new Sequelize(url, { dialect: 'postgres', dialectModule: pg, logging: false })
      try {
        const done = await migrate(s)
        console.log(`Applied ${done.length} migration(s).`)
        if (command === 'seed') console.log(`Demo data: ${await seedIfEmpty(s)}.`)
      } finally {
        await s.close()
      }
      return
    }
    throw new Error('Usage: npm run db:migrate | db:seed | db:backup [FILE] | db:restore FILE [--replace]')
  } finally {
    if (cluster.startedHere) cluster.stop()
  }
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : String(err))
  process.exit(1)
})
