import type { ReactNode } from 'react'
import { VANILLIN_WARN_PCT } from '@shared/domain/batch-sheet/batch-sheet'
import { INGREDIENT_KIND_LABELS, formatBaseQuantity, formatUnitCost } from '@shared/schemas/ingredients'
import type { IngredientRow } from '@shared/schemas/ingredients'
import { Badge } from '@/components/ui/badge'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { Stat } from '@/components/ui/stat'

/** "0.13545 / 190.0": g NaOH per g, then mg KOH per g. */
function sapText(i: Pick<IngredientRow, 'sapNaoh' | 'sapKoh'>): string {
  if (i.sapNaoh === null || i.sapKoh === null) return '—'
  return `${i.sapNaoh.toFixed(5)} / ${i.sapKoh.toFixed(1)}`
}

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-sm text-ink-700">{label}</dt>
      <dd className="mt-0.5 font-medium text-ink-900">{children}</dd>
    </div>
  )
}

/** Headline figures and the recorded facts of one ingredient. */
export function IngredientSummary({
  ingredient: i,
  currency,
}: {
  ingredient: IngredientRow
  currency: string
}) {
  return (
    <div className="flex flex-col gap-6">
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-3">
        <Stat
          label="On hand"
          value={formatBaseQuantity(i.onHand, i.unit)}
          hint={
            i.reorderLevel !== null
              ? `Reorder at ${formatBaseQuantity(i.reorderLevel, i.unit)}${i.belowReorder ? ' — time to reorder' : ''}`
              : 'No reorder level set'
          }
          tone={i.belowReorder ? 'clay' : 'default'}
        />
        <Stat
          label="Current cost"
          value={
            i.currentUnitCost === null ? 'None on hand' : formatUnitCost(i.currentUnitCost, i.unit, currency)
          }
          hint="Weighted over the purchases on hand"
        />
        <Stat label="Purchases" value={i.lots} hint={`${i.lotsOnHand} with stock left`} />
      </div>
      <Card>
        <CardHeader title="Details" as="h2" />
        <CardBody>
          <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            <Item label="Kind">{INGREDIENT_KIND_LABELS[i.kind]}</Item>
            <Item label="INCI name">{i.inci ?? '—'}</Item>
            <Item label="Counted in">{i.unit === 'each' ? 'Items' : 'Grams'}</Item>
            {i.kind === 'oil' ? (
              <>
                <Item label="SAP (NaOH / KOH)">{sapText(i)}</Item>
                <Item label="In words">
                  {i.sapNaoh!.toFixed(5)} g NaOH or {i.sapKoh!.toFixed(1)} mg KOH saponify 1 g of oil
                </Item>
              </>
            ) : null}
            {i.kind === 'lye' ? <Item label="Purity">{i.purityPct ?? 100} %</Item> : null}
            {i.kind === 'fragrance' ? (
              <>
                <Item label="Maximum usage (IFRA category 9)">
                  {i.maxUsagePct !== null ? `${i.maxUsagePct} % of oils` : 'Not recorded'}
                </Item>
                <Item label="Vanillin">
                  {i.vanillinPct !== null ? `${i.vanillinPct} %` : 'Not recorded'}{' '}
                  {i.vanillinPct !== null && i.vanillinPct > VANILLIN_WARN_PCT ? (
                    <Badge tone="honey">Browns as it cures</Badge>
                  ) : null}
                </Item>
              </>
            ) : null}
            <Item label="Status">
              {i.archived ? <Badge>Archived</Badge> : <Badge tone="green">In use</Badge>}
            </Item>
            {i.notes ? (
              <div className="sm:col-span-2 lg:col-span-3">
                <dt className="text-sm text-ink-700">Notes</dt>
                <dd className="mt-0.5 whitespace-pre-line text-ink-900">{i.notes}</dd>
              </div>
            ) : null}
          </dl>
        </CardBody>
      </Card>
    </div>
  )
}
