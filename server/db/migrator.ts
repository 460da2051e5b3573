import path from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import type { QueryInterface, Sequelize } from 'sequelize'
import { SequelizeStorage, Umzug } from 'umzug'

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..')

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize }
export type Migration = (params: { context: MigrationContext }) => Promise<void>

function make(sequelize: Sequelize, folder: 'migrations' | 'seeders', tableName: string) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['*.ts', { cwd: path.join(root, folder), ignore: ['*.test.ts', '*.d.ts'] }],
      // Import the file ourselves so the same code works under tsx and inside vitest.
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () => (await import(pathToFileURL(file!).href)).up({ context }),
        down: async () => (await import(pathToFileURL(file!).href)).down?.({ context }),
      }),
    },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName }),
    logger: undefined,
  })
}

export const migrator = (s: Sequelize) => make(s, 'migrations', 'schema_migrations')
export const seeder = (s: Sequelize) => make(s, 'seeders', 'seed_runs')

export async function migrate(s: Sequelize) {
  return migrator(s).up()
}

/**
 * Demo data goes only into an empty database (one with no users). A database that was filled with
 * the demo scenario also gets the demo seeders added since (new parts of the scenario); a studio's
 * own database, never seeded, is left alone.
 */
export async function seedIfEmpty(s: Sequelize): Promise<'seeded' | 'topped-up' | 'untouched'> {
  const [rows] = await s.query('SELECT count(*)::int AS n FROM users')
  const n = (rows as { n: number }[])[0]?.n ?? 0
  const seeds = seeder(s)
  if (n === 0) {
    await seeds.up()
    return 'seeded'
  }
  if ((await seeds.executed()).length === 0) return 'untouched'
  const pending = await seeds.pending()
  if (pending.length === 0) return 'untouched'
  await seeds.up()
  return 'topped-up'
}
