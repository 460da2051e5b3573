import type { Transaction } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

type PgError = {
  parent?: { code?: string; constraint?: string }
  original?: { code?: string; constraint?: string }
}

export function pgErrorCode(err: unknown): string | undefined {
  const e = err as PgError
  return e?.parent?.code ?? e?.original?.code
}

export function isUniqueViolation(err: unknown, constraint: string): boolean {
  const e = err as PgError
  return pgErrorCode(err) === '23505' && (e.parent?.constraint ?? e.original?.constraint) === constraint
}

/**
 * A transaction that is tried again (up to three more times, after a short random pause) when
 * PostgreSQL breaks a deadlock or a serialization conflict by aborting it. Stock rows are locked
 * in ready-date order everywhere, so this is rare; when it happens nothing was written.
 */
export async function retryingTransaction<T>(work: (t: Transaction) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await sequelize.transaction(work)
    } catch (err) {
      const code = pgErrorCode(err)
      if ((code !== '40P01' && code !== '40001') || attempt >= 4) throw err
      await new Promise((r) => setTimeout(r, 5 + Math.random() * 20 * attempt))
    }
  }
}
