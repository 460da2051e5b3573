import type { PurchaseRow } from '@shared/schemas/ingredients'
import { PurchaseLotsTable } from '@/components/purchases/purchase-lots-table'

/** One ingredient's purchases, newest first, each linking to its own page. */
export function IngredientLotsTable({ lots, currency }: { lots: PurchaseRow[]; currency: string }) {
  return (
    <PurchaseLotsTable
      items={lots}
      currency={currency}
      view="ingredient"
      label="Purchases of this ingredient"
      emptyMessage="No purchases recorded yet."
    />
  )
}
