import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import pg from 'pg'
import { afterAll, describe, expect, inject, it } from 'vitest'
import { backupDatabase, restoreDatabase, withDb } from '../../scripts/lib/backup'
import { findPgBinDir } from '../../scripts/lib/postgres'

const services = inject('services')
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lathercase-backup-'))
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }))

async function rowCounts(url: string) {
  const c = new pg.Client({ connectionString: url })
  await c.connect()
  try {
    const tables = await c.query<{ t: string }>(
      "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY 1",
    )
    const counts: Record<string, number> = {}
    for (const { t } of tables.rows)
      counts[t] = (await c.query(`SELECT count(*)::int AS n FROM "${t}"`)).rows[0].n
    return counts
  } finally {
    await c.end()
  }
}

describe('db:backup and db:restore', () => {
  it('round-trips the demo database without losing a row', async () => {
    const bindir = findPgBinDir()!
    const source = process.env.DATABASE_URL!
    const file = path.join(dir, 'demo.dump')
    backupDatabase({ bindir, url: source, file })
    expect(fs.statSync(file).size).toBeGreaterThan(1000)
    expect(fs.readFileSync(file).subarray(0, 5).toString()).toBe('PGDMP')

    const target = `restored_${Date.now()}`
    await restoreDatabase({ bindir, superUrl: services.superUrl, db: target, owner: services.appUser, file })
    const before = await rowCounts(source)
    const after = await rowCounts(withDb(services.superUrl, target))
    expect(Object.keys(before).length).toBeGreaterThan(5)
    expect(after).toEqual(before)
    expect(before.users).toBeGreaterThan(0)

    await expect(
      restoreDatabase({ bindir, superUrl: services.superUrl, db: target, owner: services.appUser, file }),
    ).rejects.toThrow(/not empty/)
    await restoreDatabase({
      bindir,
      superUrl: services.superUrl,
      db: target,
      owner: services.appUser,
      file,
      replace: true,
    })
    expect(await rowCounts(withDb(services.superUrl, target))).toEqual(before)

    const admin = new pg.Client({ connectionString: services.superUrl })
    await admin.connect()
    await admin.query(`DROP DATABASE ${target} WITH (FORCE)`)
    await admin.end()
  })
})
