import { useMemo, useState } from 'react'
import { useQueryClient } from '@tanstack/react-query'
import { isValidIsoDate } from '@shared/domain/dates/dates'
import { COST_RULE } from '@shared/schemas/ingredients'
import { Button, LinkButton } from '@/components/ui/button'
import { Input, Select } from '@/components/ui/field'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { ingredientKeys, useIngredients } from '@/features/ingredients/api/ingredients'
import { usePurchases } from '@/features/purchases/api/purchases'
import { PurchaseDialog } from '@/features/purchases/components/purchase-dialog'
import { PurchasesTable } from '@/features/purchases/components/purchases-table'
import { useSettings } from '@/features/studio/api/studio'
import { useSearchFilters } from '@/lib/search-params'

export function Component() {
  const [search, setParam] = useSearchFilters()
  const ingredientId = Number(search.get('ingredient')) || undefined
  const from = isValidIsoDate(search.get('from')) ? search.get('from')! : undefined
  const to = isValidIsoDate(search.get('to')) ? search.get('to')! : undefined
  const purchases = usePurchases({ ingredientId, from, to })
  // Archived ingredients still have their purchases to look at; only active ones can be bought.
  const everything = useIngredients({ includeArchived: true })
  const currency = useSettings().data?.currency ?? 'USD'
  const qc = useQueryClient()
  const [recording, setRecording] = useState(false)

  const all = useMemo(() => everything.data?.items ?? [], [everything.data])
  const active = useMemo(() => all.filter((i) => !i.archived), [all])
  const suppliers = useMemo(
    () => [...new Set((purchases.data ?? []).map((p) => p.supplier))].sort(),
    [purchases.data],
  )

  return (
    <>
      <PageHeader
        title="Purchases"
        description="Each delivery of an ingredient is a lot: what it cost per g or item, freight included, and how much of it is left."
        actions={
          <>
            <LinkButton variant="secondary" to={paths.owner.purchaseImport}>
              Import a CSV
            </LinkButton>
            <Button onClick={() => setRecording(true)}>Record a purchase</Button>
          </>
        }
      />
      {purchases.isPending || !purchases.data ? (
        <LoadingBlock />
      ) : (
        <PurchasesTable
          items={purchases.data}
          currency={currency}
          toolbar={
            <>
              <label className="flex flex-col gap-1 w-56">
                <span className="text-sm font-medium text-ink-800">Ingredient</span>
                <Select
                  value={ingredientId ?? ''}
                  onChange={(e) => setParam('ingredient', e.target.value || null)}
                >
                  <option value="">All ingredients</option>
                  {all.map((i) => (
                    <option key={i.id} value={i.id}>
                      {i.name}
                      {i.archived ? ' (archived)' : ''}
                    </option>
                  ))}
                </Select>
              </label>
              <label className="flex flex-col gap-1">
                <span className="text-sm font-medium text-ink-800">Received from</span>
                <Input
                  type="date"
                  value={from ?? ''}
                  onChange={(e) => setParam('from', e.target.value || null)}
                />
              </label>
              <label className="flex flex-col gap-1">
                <span className="text-sm font-medium text-ink-800">Received to</span>
                <Input
                  type="date"
                  value={to ?? ''}
                  onChange={(e) => setParam('to', e.target.value || null)}
                />
              </label>
            </>
          }
        />
      )}
      <p className="mt-4 max-w-prose text-sm text-ink-700">
        <span className="font-medium text-ink-800">Unit cost</span> is (cost + freight) ÷ the quantity bought.{' '}
        <span className="font-medium text-ink-800">Current cost: </span>
        {COST_RULE}
      </p>
      <PurchaseDialog
        open={recording}
        onClose={() => setRecording(false)}
        ingredients={active}
        suppliers={suppliers}
        currency={currency}
        onSaved={() => qc.invalidateQueries({ queryKey: ingredientKeys.all })}
      />
    </>
  )
}
