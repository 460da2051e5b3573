import { useCallback, useState } from 'react'
import { COST_RULE, INGREDIENT_KINDS } from '@shared/schemas/ingredients'
import type { IngredientKind, IngredientRow } from '@shared/schemas/ingredients'
import { Button, LinkButton } from '@/components/ui/button'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useIngredients } from '@/features/ingredients/api/ingredients'
import { IngredientDialog } from '@/features/ingredients/components/ingredient-dialog'
import { IngredientsTable } from '@/features/ingredients/components/ingredients-table'
import { useSettings } from '@/features/studio/api/studio'
import { useSearchFilters } from '@/lib/search-params'

const isKind = (v: string | null): v is IngredientKind =>
  !!v && (INGREDIENT_KINDS as readonly string[]).includes(v)

export function Component() {
  const [search, setParam] = useSearchFilters()
  const kindParam = search.get('kind')
  const kind = isKind(kindParam) ? kindParam : ''
  const includeArchived = search.get('archived') === '1'
  const list = useIngredients({ kind: kind || undefined, includeArchived })
  const currency = useSettings().data?.currency ?? 'USD'
  const [dialog, setDialog] = useState<{ ingredient: IngredientRow | null } | null>(null)
  const edit = useCallback((ingredient: IngredientRow) => setDialog({ ingredient }), [])

  return (
    <>
      <PageHeader
        title="Ingredients"
        description="Everything the studio buys: oils and butters with their saponification values, lye, liquids, fragrances, colourants, additives and packaging."
        actions={
          <>
            <LinkButton variant="secondary" to={paths.owner.purchases}>
              Purchases
            </LinkButton>
            <Button onClick={() => setDialog({ ingredient: null })}>Add an ingredient</Button>
          </>
        }
      />
      {list.isPending || !list.data ? (
        <LoadingBlock />
      ) : (
        <IngredientsTable
          items={list.data.items}
          currency={currency}
          kind={kind}
          onKindChange={(k) => setParam('kind', k || null)}
          includeArchived={includeArchived}
          onIncludeArchivedChange={(v) => setParam('archived', v ? '1' : null)}
          onEdit={edit}
        />
      )}
      <p className="mt-4 max-w-prose text-sm text-ink-700">
        <span className="font-medium text-ink-800">Current cost: </span>
        {list.data?.costRule ?? COST_RULE} Costs show per kg, or per item for packaging.
      </p>
      <IngredientDialog
        open={dialog !== null}
        ingredient={dialog?.ingredient}
        onClose={() => setDialog(null)}
      />
    </>
  )
}
