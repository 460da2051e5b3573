import type { Transaction } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

/** One row in the audit trail; inside the caller's transaction when it has one. */
export async function audit(
  event: { userId: number | null; action: string; entity: string; entityId?: number | null; data?: unknown },
  transaction?: Transaction,
) {
  await sequelize.query(
    'INSERT INTO audit_events (user_id, action, entity, entity_id, data) VALUES ($1, $2, $3, $4, $5)',
    {
      bind: [
        event.userId,
        event.action,
        event.entity,
        event.entityId ?? null,
        JSON.stringify(event.data ?? null),
      ],
      transaction,
    },
  )
}
