import { useMemo, useState } from 'react'
import { VANILLIN_WARN_PCT } from '@shared/domain/batch-sheet/batch-sheet'
import {
  INGREDIENT_KINDS,
  INGREDIENT_KIND_LABELS,
  formatBaseQuantity,
  formatUnitCost,
} from '@shared/schemas/ingredients'
import type { IngredientKind, IngredientRow } from '@shared/schemas/ingredients'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { ConfirmDialog } from '@/components/ui/dialog'
import { Checkbox, Select } from '@/components/ui/field'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { useSetIngredientArchived } from '@/features/ingredients/api/ingredients'

const col = dataTableColumnHelper<IngredientRow>()

type Props = {
  items: IngredientRow[]
  currency: string
  kind: IngredientKind | ''
  onKindChange: (kind: IngredientKind | '') => void
  includeArchived: boolean
  onIncludeArchivedChange: (value: boolean) => void
  onEdit: (ingredient: IngredientRow) => void
}

export function IngredientsTable({
  items,
  currency,
  kind,
  onKindChange,
  includeArchived,
  onIncludeArchivedChange,
  onEdit,
}: Props) {
  const setArchived = useSetIngredientArchived()
  const [confirming, setConfirming] = useState<IngredientRow | null>(null)

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('name', {
          header: 'Name',
          cell: (c) => {
            const i = c.row.original
            return (
              <span className="inline-flex flex-wrap items-center gap-2">
                {c.getValue()}
                {i.archived ? <Badge>Archived</Badge> : null}
                {i.kind === 'fragrance' && i.vanillinPct !== null && i.vanillinPct > VANILLIN_WARN_PCT ? (
                  <Badge tone="honey">Browns</Badge>
                ) : null}
              </span>
            )
          },
        }),
        col.accessor((i) => INGREDIENT_KIND_LABELS[i.kind], { id: 'kind', header: 'Kind' }),
        col.accessor((i) => i.inci ?? '—', { id: 'inci', header: 'INCI', meta: { wrap: true } }),
        col.accessor((i) => i.sapNaoh ?? -1, {
          id: 'sap',
          header: 'SAP',
          meta: { align: 'end' },
          cell: (c) => {
            const i = c.row.original
            if (i.sapNaoh === null || i.sapKoh === null) return '—'
            return (
              <span className="flex flex-col leading-tight">
                <span>{i.sapNaoh.toFixed(5)} NaOH</span>
                <span className="text-xs text-ink-700">{i.sapKoh.toFixed(1)} KOH</span>
              </span>
            )
          },
        }),
        col.accessor('onHand', {
          header: 'On hand',
          meta: { align: 'end' },
          cell: (c) => {
            const i = c.row.original
            return (
              <span className="inline-flex items-center gap-2">
                {i.belowReorder ? <Badge tone="clay">Low</Badge> : null}
                {formatBaseQuantity(i.onHand, i.unit)}
              </span>
            )
          },
        }),
        col.accessor((i) => i.currentUnitCost ?? -1, {
          id: 'cost',
          header: 'Current cost',
          meta: { align: 'end' },
          cell: (c) => {
            const i = c.row.original
            return i.currentUnitCost === null ? (
              <span className="text-ink-600">none on hand</span>
            ) : (
              formatUnitCost(i.currentUnitCost, i.unit, currency)
            )
          },
        }),
        col.display({
          id: 'actions',
          header: () => <span className="sr-only">Actions</span>,
          cell: (c) => {
            const i = c.row.original
            return (
              <div className="flex justify-end gap-2">
                <Button size="sm" variant="ghost" onClick={() => onEdit(i)} aria-label={`Edit ${i.name}`}>
                  Edit
                </Button>
                <Button
                  size="sm"
                  variant="secondary"
                  onClick={() => setConfirming(i)}
                  aria-label={`${i.archived ? 'Restore' : 'Archive'} ${i.name}`}
                >
                  {i.archived ? 'Restore' : 'Archive'}
                </Button>
              </div>
            )
          },
        }),
      ]),
    [currency, onEdit],
  )

  return (
    <>
      <DataTable
        label="Ingredients"
        columns={columns}
        data={items}
        getRowId={(i) => String(i.id)}
        rowHref={(i) => paths.owner.ingredient(i.id)}
        searchable
        searchPlaceholder="Name or INCI"
        emptyMessage={
          kind
            ? `No ${INGREDIENT_KIND_LABELS[kind].toLowerCase()} ingredients yet.`
            : 'No ingredients yet. Add the first one.'
        }
        initialSorting={[{ id: 'name', desc: false }]}
        toolbar={
          <>
            <label className="flex flex-col gap-1 w-48">
              <span className="text-sm font-medium text-ink-800">Kind</span>
              <Select value={kind} onChange={(e) => onKindChange(e.target.value as IngredientKind | '')}>
                <option value="">All kinds</option>
                {INGREDIENT_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {INGREDIENT_KIND_LABELS[k]}
                  </option>
                ))}
              </Select>
            </label>
            <Checkbox
              label="Show archived"
              checked={includeArchived}
              onChange={(e) => onIncludeArchivedChange(e.target.checked)}
              className="pb-2"
            />
          </>
        }
      />
      <ConfirmDialog
        open={confirming !== null}
        onClose={() => setConfirming(null)}
        title={confirming?.archived ? `Restore ${confirming.name}?` : `Archive ${confirming?.name ?? ''}?`}
        message={
          confirming?.archived
            ? 'It comes back to the lists and can be bought and used in recipes again.'
            : 'It leaves the lists and pickers. Its purchases, stock and history stay, and you can restore it later.'
        }
        confirmLabel={confirming?.archived ? 'Restore' : 'Archive'}
        onConfirm={async () => {
          if (!confirming) return
          const { ingredient } = await setArchived.mutateAsync({
            id: confirming.id,
            archived: !confirming.archived,
          })
          toast.success(
            ingredient.archived ? `${ingredient.name} is archived.` : `${ingredient.name} is restored.`,
          )
        }}
      />
    </>
  )
}
