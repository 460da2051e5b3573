/**
 * db:backup and db:restore, beyond equal row counts (tests/api/backup.test.ts): every table's
 * content is the same row for row (uploaded files' bytes too), the sequences carry on where they
 * were (a restored studio's next order or invoice cannot collide with an old one), and the
 * restored database still guards itself: the ledger stays append-only, invoices cannot be deleted,
 * the balance trigger still keeps batch_stock.
 */
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createApp } from '@server/app'
import { clientAs } from '@tests/factories/api-client'
import { makeOrder, makeSellable } from '@tests/factories/fulfilment'
import { backupDatabase, restoreDatabase, withDb } from '../../scripts/lib/backup'
import { findPgBinDir } from '../../scripts/lib/postgres'
import { PNG } from './records'

const services = inject('services')
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lathercase-backup-'))
const target = `restored_${Date.now()}`
afterAll(async () => {
  fs.rmSync(dir, { recursive: true, force: true })
  const admin = new pg.Client({ connectionString: services.superUrl })
  await admin.connect()
  await admin.query(`DROP DATABASE IF EXISTS ${target} WITH (FORCE)`)
  await admin.end()
})

async function withClient<T>(url: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: url })
  await c.connect()
  try {
    return await fn(c)
  } finally {
    await c.end()
  }
}

/** A fingerprint of the whole database: each table's rows, the sequences, and the guards. */
async function fingerprint(url: string) {
  return withClient(url, async (c) => {
    const tables = (
      await c.query<{ t: string }>(
        `SELECT tablename AS t FROM pg_tables WHERE schemaname = 'public' ORDER BY 1`,
      )
    ).rows.map((r) => r.t)
    const content: Record<string, { rows: number; md5: string }> = {}
    for (const t of tables) {
      const r = await c.query<{ rows: number; md5: string }>(
        `SELECT count(*)::int AS rows, md5(COALESCE(string_agg(x::text, E'\\n' ORDER BY x::text), '')) AS md5 FROM "${t}" x`,
      )
      content[t] = r.rows[0]!
    }
    const sequences = (
      await c.query<{ name: string; last: string | null }>(
        `SELECT sequencename AS name, last_value::text AS last FROM pg_sequences WHERE schemaname = 'public' ORDER BY 1`,
      )
    ).rows
    const guards = (
      await c.query<{ kind: string; name: string }>(
        `SELECT 'trigger' AS kind, tgrelid::regclass || '.' || tgname AS name FROM pg_trigger WHERE NOT tgisinternal
         UNION ALL SELECT 'constraint', conrelid::regclass || '.' || conname FROM pg_constraint WHERE connamespace = 'public'::regnamespace
         UNION ALL SELECT 'index', indexname FROM pg_indexes WHERE schemaname = 'public'
         UNION ALL SELECT 'function', proname FROM pg_proc WHERE pronamespace = 'public'::regnamespace
         ORDER BY 1, 2`,
      )
    ).rows
    return { content, sequences, guards }
  })
}

beforeAll(async () => {
  // Beyond the demo: an uploaded file (bytes), an order through shipping (ledger, invoice).
  const app = createApp({ pruneSessions: false })
  const owner = await clientAs(app, 'owner')
  const s = await makeSellable(owner, { bars: 60 })
  const photo = await owner.agent
    .post(`/api/products/${s.productId}/photo`)
    .set('X-CSRF-Token', await owner.token())
    .attach('photo', PNG, { filename: 'bar.png', contentType: 'image/png' })
  expect(photo.status).toBe(200)
  await makeOrder({
    shop: 'A',
    lines: [{ productId: s.productId, cases: 2 }],
    status: 'shipped',
    notify: false,
  })
  await makeOrder({
    shop: 'C',
    lines: [{ productId: s.productId, cases: 1 }],
    status: 'confirmed',
    notify: false,
  })
})

describe('a restored backup', () => {
  it('is the same database: every row, every file, every sequence, every guard', async () => {
    const bindir = findPgBinDir()!
    const source = process.env.DATABASE_URL!
    const file = path.join(dir, 'studio.dump')
    backupDatabase({ bindir, url: source, file })
    await restoreDatabase({ bindir, superUrl: services.superUrl, db: target, owner: services.appUser, file })
    const restoredUrl = withDb(services.superUrl, target)
    const [before, after] = await Promise.all([fingerprint(source), fingerprint(restoredUrl)])
    expect(before.content.uploads!.rows).toBeGreaterThan(0)
    expect(before.content.stock_moves!.rows).toBeGreaterThan(0)
    expect(before.content.invoices!.rows).toBeGreaterThan(0)
    expect(after.content).toEqual(before.content)
    expect(after.sequences).toEqual(before.sequences)
    expect(after.guards).toEqual(before.guards)
    console.info(
      `backup: ${Object.keys(before.content).length} tables, ${Object.values(before.content).reduce((n, t) => n + t.rows, 0)} rows, ` +
        `${before.sequences.length} sequences, ${before.guards.length} triggers/constraints/indexes/functions, dump ${fs.statSync(file).size} bytes`,
    )
  })

  it('still guards itself: append-only ledger, undeletable invoices, the balance trigger', async () => {
    await withClient(withDb(services.superUrl, target), async (c) => {
      await expect(
        c.query('UPDATE stock_moves SET bars = bars WHERE id = (SELECT min(id) FROM stock_moves)'),
      ).rejects.toThrow(/append-only/)
      await expect(
        c.query('DELETE FROM invoices WHERE id = (SELECT min(id) FROM invoices)'),
      ).rejects.toThrow()
      const batch = (
        await c.query<{ id: number; free: number }>(
          'SELECT batch_id AS id, free FROM batch_stock WHERE free > 0 LIMIT 1',
        )
      ).rows[0]!
      await c.query(
        `INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta) VALUES ($1, 'adjusted', 1, 1, 0)`,
        [batch.id],
      )
      const now = (
        await c.query<{ free: number }>('SELECT free FROM batch_stock WHERE batch_id = $1', [batch.id])
      ).rows[0]!
      expect(now.free).toBe(batch.free + 1)
      // A new order row takes an id after every restored one.
      const ids = (
        await c.query<{ max: number; next: string }>(
          `SELECT max(id) AS max, nextval('orders_id_seq')::text AS next FROM orders`,
        )
      ).rows[0]!
      expect(Number(ids.next)).toBeGreaterThan(ids.max)
    })
  })
})
