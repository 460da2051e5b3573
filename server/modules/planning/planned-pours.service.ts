import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'

/**
 * Marks a planned pour poured by the batch just recorded, inside the batch's own transaction, so
 * a batch and its plan are written together or not at all. The plan must still be open and be for
 * the batch's product.
 */
export async function markPlannedPourPoured(
  plannedPourId: number,
  productId: number,
  batchId: number,
  t: Transaction,
): Promise<void> {
  const [row] = await sequelize.query<{ product_id: number; status: string }>(
    'SELECT product_id, status FROM planned_pours WHERE id = $1 FOR UPDATE',
    { bind: [plannedPourId], type: QueryTypes.SELECT, transaction: t },
  )
  if (!row) throw AppError.field('plannedPourId', 'There is no planned pour with that id.')
  if (row.status !== 'planned') {
    throw AppError.conflict('plan_closed', 'That planned pour was already poured or dropped.', [
      { field: 'plannedPourId', message: `This planned pour is ${row.status}.` },
    ])
  }
  if (row.product_id !== productId) {
    throw AppError.unprocessable('plan_product_mismatch', 'The planned pour is for another product.', [
      { field: 'productId', message: 'Pour the product the plan names, or start a batch without the plan.' },
    ])
  }
  await sequelize.query(
    `UPDATE planned_pours SET status = 'poured', batch_id = $2, updated_at = now() WHERE id = $1`,
    { bind: [plannedPourId, batchId], transaction: t },
  )
}
