import { useMemo, useState } from 'react'
import type { PriceLevel } from '@shared/domain/pricing/pricing'
import type { PricingCell, PricingItem, PricingOverview, TierRow } from '@shared/schemas/pricing'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Select } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { Money } from '@/components/ui/money'
import { toast } from '@/components/ui/toast'
import { useAcceptSuggestions } from '@/features/pricing/api/pricing'
import { PriceBreakEditor } from '@/features/pricing/components/price-break-editor'
import { ApiError } from '@/lib/api-client'

type Row = { key: string; item: PricingItem; tier: TierRow; cell: PricingCell }

const LEVEL: Record<PriceLevel, { tone: 'green' | 'honey' | 'clay'; label: string }> = {
  ok: { tone: 'green', label: 'On target' },
  under_margin: { tone: 'honey', label: 'Under margin' },
  under_cost: { tone: 'clay', label: 'Under cost' },
}

const BLOCKED: Record<NonNullable<PricingCell['suggestionBlocked']>, string> = {
  same_price: 'Already the price',
  price_rises: 'A larger break costs more: edit the breaks',
  no_cost: 'No cost yet',
}

const col = dataTableColumnHelper<Row>()
const selectable = (r: Row) => r.cell.suggestionBlocked === null

function pct(n: number | null) {
  return n == null ? '—' : `${n.toFixed(1)} %`
}

export function PricingTable({ data }: { data: PricingOverview }) {
  const accept = useAcceptSuggestions()
  const [tierFilter, setTierFilter] = useState<string>('all')
  const [selected, setSelected] = useState<Set<string>>(new Set())
  const [editing, setEditing] = useState<Row | null>(null)
  const [error, setError] = useState<{ message: string; lines: string[] } | null>(null)
  const { currency } = data

  const rows = useMemo<Row[]>(
    () =>
      data.items.flatMap((item) =>
        data.tiers
          .filter((t) => tierFilter === 'all' || String(t.id) === tierFilter)
          .map((tier) => ({
            key: `${item.productId}:${tier.id}`,
            item,
            tier,
            cell: item.cells.find((c) => c.tierId === tier.id)!,
          })),
      ),
    [data, tierFilter],
  )
  // A row that can no longer be accepted (its suggestion was just taken) drops out of the selection.
  const chosen = rows.filter((r) => selected.has(r.key) && selectable(r))
  const keystoneTier = data.tiers.find((t) => t.id === data.keystoneTierId)

  const columns = useMemo(
    () =>
      col.columns([
        col.display({
          id: 'select',
          header: () => <span className="sr-only">Select</span>,
          cell: (c) => {
            const r = c.row.original
            return (
              <input
                type="checkbox"
                className="size-5 cursor-pointer accent-olive-700 disabled:cursor-not-allowed disabled:opacity-40 sm:size-4"
                aria-label={`Select the suggestion for ${r.item.sku} in ${r.tier.name}`}
                checked={selected.has(r.key) && selectable(r)}
                disabled={!selectable(r)}
                onChange={(e) => {
                  const on = e.target.checked
                  setSelected((prev) => {
                    const next = new Set(prev)
                    if (on) next.add(r.key)
                    else next.delete(r.key)
                    return next
                  })
                }}
              />
            )
          },
          meta: { className: 'w-10' },
        }),
        col.accessor((r) => `${r.item.sku} ${r.item.name}`, {
          id: 'product',
          header: 'Product',
          cell: (c) => {
            const { item } = c.row.original
            return (
              <span>
                <span className="block font-medium text-ink-900">{item.sku}</span>
                <span className="block max-w-52 truncate text-xs text-ink-800" title={item.name}>
                  {item.name}
                </span>
                <span className="block text-xs text-ink-700">
                  MSRP <Money cents={item.msrpCents} currency={currency} />
                  {item.keystoneMsrpCents != null ? (
                    <>
                      {' '}
                      · keystone <Money cents={item.keystoneMsrpCents} currency={currency} />
                    </>
                  ) : null}
                </span>
              </span>
            )
          },
        }),
        col.accessor((r) => r.tier.name, {
          id: 'tier',
          header: 'Tier',
          cell: (c) => (
            <span>
              <span className="block">{c.getValue()}</span>
              <span className="block text-xs text-ink-700">
                target {c.row.original.tier.targetMarginPct} %
              </span>
            </span>
          ),
        }),
        col.accessor((r) => r.item.costPerBarCents ?? -1, {
          id: 'cost',
          header: 'Cost',
          meta: { align: 'end' },
          cell: (c) => {
            const { item } = c.row.original
            if (item.costPerBarCents == null) return <span className="text-ink-600">—</span>
            return (
              <span className="inline-flex flex-col items-end">
                <Money cents={item.costPerBarCents} currency={currency} />
                {item.missingCosts.length > 0 ? (
                  <span className="text-xs text-honey-700" title={item.missingCosts.join(', ')}>
                    incomplete
                  </span>
                ) : null}
              </span>
            )
          },
        }),
        col.accessor((r) => r.cell.singleCasePriceCents ?? -1, {
          id: 'price',
          header: '1-case price',
          meta: { align: 'end' },
          cell: (c) => {
            const { cell } = c.row.original
            return (
              <span className="inline-flex flex-col items-end">
                {cell.singleCasePriceCents == null ? (
                  <span className="text-ink-600">—</span>
                ) : (
                  <Money cents={cell.singleCasePriceCents} currency={currency} />
                )}
                {cell.breaks.length > 1 ? (
                  <span className="text-xs text-ink-700">+{cell.breaks.length - 1} more</span>
                ) : null}
              </span>
            )
          },
        }),
        col.accessor((r) => r.cell.marginPct ?? -1000, {
          id: 'margin',
          header: 'Margin',
          meta: { align: 'end' },
          cell: (c) => pct(c.row.original.cell.marginPct),
        }),
        col.accessor((r) => r.cell.suggestedUnitPriceCents ?? -1, {
          id: 'suggested',
          header: 'Suggested',
          meta: { align: 'end' },
          cell: (c) => {
            const { cell } = c.row.original
            return (
              <span className="inline-flex flex-col items-end">
                {cell.suggestedUnitPriceCents == null ? (
                  <span className="text-ink-600">—</span>
                ) : (
                  <Money cents={cell.suggestedUnitPriceCents} currency={currency} className="font-medium" />
                )}
                {cell.suggestionBlocked && cell.suggestionBlocked !== 'no_cost' ? (
                  <span className="text-xs text-ink-700">{BLOCKED[cell.suggestionBlocked]}</span>
                ) : null}
              </span>
            )
          },
        }),
        col.accessor((r) => (r.cell.level ? LEVEL[r.cell.level].label : 'Not priced'), {
          id: 'check',
          header: 'Check',
          cell: (c) => {
            const { cell } = c.row.original
            if (cell.level) return <Badge tone={LEVEL[cell.level].tone}>{LEVEL[cell.level].label}</Badge>
            return (
              <Badge tone="neutral">{cell.singleCasePriceCents == null ? 'Not priced' : 'No cost'}</Badge>
            )
          },
        }),
        col.display({
          id: 'actions',
          header: () => <span className="sr-only">Actions</span>,
          cell: (c) => {
            const r = c.row.original
            return (
              <Button
                size="sm"
                variant="ghost"
                onClick={() => setEditing(r)}
                aria-label={`Edit breaks for ${r.item.sku} in ${r.tier.name}`}
              >
                Edit breaks
              </Button>
            )
          },
        }),
      ]),
    [selected, currency],
  )

  const acceptSelected = async () => {
    setError(null)
    const items = chosen.map((r) => ({
      productId: r.item.productId,
      tierId: r.tier.id,
      unitPriceCents: r.cell.suggestedUnitPriceCents!,
    }))
    try {
      const res = await accept.mutateAsync({ items })
      toast.success(`${res.accepted} ${res.accepted === 1 ? 'price' : 'prices'} set to the suggestion.`)
      setSelected(new Set())
    } catch (err) {
      if (err instanceof ApiError) {
        const lines = err.fieldErrors.map((d) => {
          const r = chosen[Number(/^items\.(\d+)\./.exec(d.field)?.[1] ?? -1)]
          return r ? `${r.item.sku} · ${r.tier.name}: ${d.message}` : d.message
        })
        setError({ message: `Nothing was changed. ${err.message}`, lines })
      } else setError({ message: 'Nothing was changed: the request failed.', lines: [] })
    }
  }

  const selectAll = () => setSelected(new Set(rows.filter(selectable).map((r) => r.key)))

  return (
    <div className="flex flex-col gap-4">
      {error ? (
        <FormError
          title={error.message}
          message={
            error.lines.length > 0 ? (
              <ul className="list-disc pl-5">
                {error.lines.map((l) => (
                  <li key={l}>{l}</li>
                ))}
              </ul>
            ) : null
          }
        />
      ) : null}
      <DataTable
        label="Prices per product and tier"
        columns={columns}
        data={rows}
        getRowId={(r) => r.key}
        searchable
        searchPlaceholder="SKU or name"
        emptyMessage="No products on sale yet."
        toolbar={
          <>
            <div className="flex flex-col gap-1">
              <label htmlFor="pricing-tier-filter" className="text-sm font-medium text-ink-800">
                Tier
              </label>
              <Select
                id="pricing-tier-filter"
                value={tierFilter}
                onChange={(e) => setTierFilter(e.target.value)}
              >
                <option value="all">All tiers</option>
                {data.tiers.map((t) => (
                  <option key={t.id} value={String(t.id)}>
                    {t.name}
                  </option>
                ))}
              </Select>
            </div>
            <Button variant="secondary" onClick={selectAll}>
              Select every suggestion
            </Button>
            {chosen.length > 0 ? (
              <Button variant="ghost" onClick={() => setSelected(new Set())}>
                Clear
              </Button>
            ) : null}
            <Button onClick={acceptSelected} disabled={chosen.length === 0} loading={accept.isPending}>
              Accept selected suggestions{chosen.length > 0 ? ` (${chosen.length})` : ''}
            </Button>
          </>
        }
      />
      <p className="text-sm text-ink-700">
        Suggested = cost ÷ (1 − the tier’s target margin), rounded up to the studio’s price step of{' '}
        <Money cents={data.priceStepCents} currency={currency} />. Keystone MSRP = 2 ×{' '}
        {keystoneTier ? `the ${keystoneTier.name}` : 'the first tier’s'} 1-case price. Accepting sets the
        1-case break; larger breaks stay as they are.
      </p>
      {editing ? (
        <PriceBreakEditor
          key={editing.key}
          open
          onClose={() => setEditing(null)}
          item={editing.item}
          tier={editing.tier}
          cell={editing.cell}
          currency={currency}
        />
      ) : null}
    </div>
  )
}
