/**
 * The benchmark's own PostgreSQL: a throw-away cluster (fsync off) on a free loopback port, one
 * database migrated and filled with the demo scenario, deleted when the run ends.
 */
import { randomBytes } from 'node:crypto'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import pg from 'pg'
import { Sequelize } from 'sequelize'
import { migrate, seeder } from '../../server/db/migrator'
import { freePort } from '../lib/ports'
import { destroyCluster, ensureDatabase, startCluster } from '../lib/postgres'
import type { Cluster } from '../lib/postgres'

export type BenchDb = { cluster: Cluster; url: string; superUrl: string; base: string; destroy(): void }

export async function startBenchDb(log: (l: string) => void): Promise<BenchDb> {
  const base = fs.mkdtempSync(path.join(os.tmpdir(), 'lathercase-bench-'))
  fs.chmodSync(base, 0o755)
  const cluster = startCluster({
    dataDir: path.join(base, 'pg'),
    port: await freePort(),
    superPassword: randomBytes(12).toString('hex'),
    fast: true,
    log,
  })
  let gone = false
  const destroy = () => {
    if (gone) return
    gone = true
    destroyCluster(cluster)
    fs.rmSync(base, { recursive: true, force: true })
  }
  process.once('exit', destroy)
  const url = await ensureDatabase(cluster, 'lathercase_bench', 'lathercase', randomBytes(12).toString('hex'))
  const s = new Sequelize(url, { dialect: 'postgres', dialectModule: pg, logging: false })
  try {
    await migrate(s)
    await seeder(s).up()
  } finally {
    await s.close()
  }
  return { cluster, url, superUrl: cluster.superUrl('lathercase_bench'), base, destroy }
}
