import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { SettingsSchema } from '@shared/schemas/settings'
import type { Settings } from '@shared/schemas/settings'
import { sequelize } from '@server/db/sequelize'

let cache: Settings | null = null

/** All settings, defaults filled in; kept in memory until a write. */
export async function getSettings(transaction?: Transaction): Promise<Settings> {
  if (cache && !transaction) return cache
  const rows = await sequelize.query<{ key: string; value: unknown }>('SELECT key, value FROM settings', {
    type: QueryTypes.SELECT,
    transaction,
  })
  const parsed = SettingsSchema.parse(Object.fromEntries(rows.map((r) => [r.key, r.value])))
  if (!transaction) cache = parsed
  return parsed
}

export async function updateSettings(patch: Partial<Settings>, transaction?: Transaction): Promise<Settings> {
  const merged = SettingsSchema.parse({ ...(await getSettings(transaction)), ...patch })
  for (const key of Object.keys(patch) as (keyof Settings)[]) {
    await sequelize.query(
      `INSERT INTO settings (key, value, updated_at) VALUES ($1, $2, now())
       ON CONFLICT (key) DO UPDATE SET value = EXCLUDED.value, updated_at = now()`,
      { bind: [key, JSON.stringify(merged[key])], transaction },
    )
  }
  cache = null
  return merged
}

export function clearSettingsCache() {
  cache = null
}
