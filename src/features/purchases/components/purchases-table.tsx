import type { ReactNode } from 'react'
import type { PurchaseRow } from '@shared/schemas/ingredients'
import { PurchaseLotsTable } from '@/components/purchases/purchase-lots-table'

/** Every purchase (lot) with what it cost per g or item and what is left of it. */
export function PurchasesTable({
  items,
  currency,
  toolbar,
}: {
  items: PurchaseRow[]
  currency: string
  toolbar?: ReactNode
}) {
  return (
    <PurchaseLotsTable
      items={items}
      currency={currency}
      view="all"
      label="Purchases"
      searchable
      searchPlaceholder="Ingredient, supplier or lot"
      toolbar={toolbar}
      paginate
      emptyMessage="No purchases match. Record one, or import a CSV from a supplier’s invoices."
    />
  )
}
