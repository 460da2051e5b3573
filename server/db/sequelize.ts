import pg from 'pg'
import { Sequelize } from 'sequelize'
import { env } from '@server/config/env'

// DATE columns stay ISO strings ('YYYY-MM-DD'): a JS Date would shift them by the time zone.
pg.types.setTypeParser(1082, (v) => v)

export const sequelize = new Sequelize(env.DATABASE_URL, {
  dialect: 'postgres',
  dialectModule: pg,
  logging: false,
  define: { underscored: true, timestamps: true },
  pool: { max: env.DB_POOL_MAX, min: 0, idle: 10_000, acquire: 30_000 },
})

/** A plain pg pool for the session store and hot read paths that skip the ORM. */
export const pool = new pg.Pool({
  connectionString: env.DATABASE_URL,
  max: Math.max(2, Math.ceil(env.DB_POOL_MAX / 2)),
})

export async function closeDb() {
  await Promise.allSettled([sequelize.close(), pool.end()])
}
