import { formatBaseQuantity, formatUnitCost } from '@shared/schemas/ingredients'
import type { IngredientRow, PurchaseRow } from '@shared/schemas/ingredients'
import { Card, CardBody, CardHeader } from '@/components/ui/card'

/** The current-cost rule in words, then with this ingredient's own lots on hand. */
export function CostRule({
  rule,
  ingredient,
  lots,
  currency,
}: {
  rule: string
  ingredient: IngredientRow
  lots: PurchaseRow[]
  currency: string
}) {
  const onHand = lots.filter((l) => l.remaining > 0)
  return (
    <Card>
      <CardHeader title="How the current cost is worked out" as="h2" />
      <CardBody className="flex flex-col gap-3 text-sm text-ink-800">
        <p>{rule}</p>
        {onHand.length === 0 ? (
          <p className="text-ink-700">
            Nothing is on hand, so there is no current cost until the next purchase is recorded.
          </p>
        ) : (
          <>
            <ul className="flex flex-col gap-1" aria-label="Purchases on hand">
              {onHand.map((l) => (
                <li key={l.id} className="tabular-nums">
                  {formatBaseQuantity(l.remaining, l.unit)} left of {l.supplierLotCode ?? `purchase #${l.id}`}{' '}
                  at {formatUnitCost(l.unitCost, l.unit, currency)}
                </li>
              ))}
            </ul>
            <p className="font-medium text-ink-900">
              Weighted by what is left:{' '}
              {ingredient.currentUnitCost === null
                ? '—'
                : formatUnitCost(ingredient.currentUnitCost, ingredient.unit, currency)}{' '}
              over {formatBaseQuantity(ingredient.onHand, ingredient.unit)}.
            </p>
          </>
        )}
      </CardBody>
    </Card>
  )
}
