/**
 * Backup and restore of the Lathercase database with PostgreSQL's own tools: pg_dump's custom
 * archive format (compressed, restorable table by table) and pg_restore into an empty database.
 */
import { spawnSync } from 'node:child_process'
import path from 'node:path'
import pg from 'pg'

function run(bin: string, args: string[], password: string) {
  const r = spawnSync(bin, args, { encoding: 'utf8', env: { ...process.env, PGPASSWORD: password } })
  if (r.status !== 0) throw new Error(`${path.basename(bin)} failed (${r.status}): ${r.stderr || r.stdout}`)
  return r
}

function parts(url: string) {
  const u = new URL(url)
  return {
    host: u.hostname,
    port: u.port || '5432',
    user: decodeURIComponent(u.username),
    password: decodeURIComponent(u.password),
    db: u.pathname.slice(1),
  }
}

/** Writes a pg_dump custom-format archive of the database at `url` to `file`. */
export function backupDatabase(opts: { bindir: string; url: string; file: string }) {
  const p = parts(opts.url)
  run(
    path.join(opts.bindir, 'pg_dump'),
    [
      '-h',
      p.host,
      '-p',
      p.port,
      '-U',
      p.user,
      '-d',
      p.db,
      '-Fc',
      '--no-owner',
      '--no-privileges',
      '-f',
      opts.file,
    ],
    p.password,
  )
}

/**
 * Restores an archive into database `db` owned by `owner`, which must be empty or missing; with
 * `replace` an existing database is dropped first. One transaction: a failed restore leaves nothing.
 */
export async function restoreDatabase(opts: {
  bindir: string
  superUrl: string
  db: string
  owner: string
  file: string
  replace?: boolean
}) {
  const admin = new pg.Client({ connectionString: opts.superUrl })
  await admin.connect()
  const ident = (s: string) => '"' + s.replace(/"/g, '""') + '"'
  try {
    const exists =
      (await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [opts.db])).rowCount! > 0
    if (exists) {
      if (!opts.replace) {
        const target = new pg.Client({ connectionString: withDb(opts.superUrl, opts.db) })
        await target.connect()
        const tables = await target.query(
          "SELECT count(*)::int AS n FROM information_schema.tables WHERE table_schema = 'public'",
        )
        await target.end()
        if (tables.rows[0].n > 0) {
          throw new Error(`The database ${opts.db} is not empty. Restore with --replace to drop it first.`)
        }
      } else {
        await admin.query(`DROP DATABASE ${ident(opts.db)} WITH (FORCE)`)
      }
    }
    if (!exists || opts.replace)
      await admin.query(`CREATE DATABASE ${ident(opts.db)} OWNER ${ident(opts.owner)}`)
  } finally {
    await admin.end()
  }
  const p = parts(opts.superUrl)
  run(
    path.join(opts.bindir, 'pg_restore'),
    [
      '-h',
      p.host,
      '-p',
      p.port,
      '-U',
      p.user,
      '-d',
      opts.db,
      '--no-owner',
      '--no-privileges',
      `--role=${opts.owner}`,
      '--single-transaction',
      '--exit-on-error',
      opts.file,
    ],
    p.password,
  )
}

export function withDb(url: string, db: string) {
  const u = new URL(url)
  u.pathname = `/${db}`
  return u.toString()
}
