import { useQueryClient } from '@tanstack/react-query'
import { LinkButton } from '@/components/ui/button'
import { PageHeader } from '@/components/ui/page-header'
import { paths } from '@/config/paths'
import { ingredientKeys } from '@/features/ingredients/api/ingredients'
import { PurchaseImport } from '@/features/purchases/components/purchase-import'

export function Component() {
  const qc = useQueryClient()
  return (
    <>
      <PageHeader
        title="Import purchases"
        description="Bring in many purchases at once from a spreadsheet. Every row is checked first; either all rows go in or none."
        back={{ to: paths.owner.purchases, label: 'All purchases' }}
        actions={
          <LinkButton variant="secondary" to={paths.owner.ingredients}>
            Ingredients
          </LinkButton>
        }
      />
      <PurchaseImport onImported={() => qc.invalidateQueries({ queryKey: ingredientKeys.all })} />
    </>
  )
}
