import { useId, useState } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import type { CatalogueItem } from '@shared/schemas/catalogue'
import type { CartLineDto } from '@shared/schemas/orders'
import { Button } from '@/components/ui/button'
import { Checkbox } from '@/components/ui/field'
import { Stepper } from '@/components/ui/stepper'
import { toast } from '@/components/ui/toast'
import { useSetCartLine } from '@/features/cart/api/cart'

const cases = (n: number) => `${n} ${n === 1 ? 'case' : 'cases'}`

/**
 * Whole cases of one product into the server-side cart. More cases than are ready now can be
 * asked for as a pre-order of curing stock, when a batch is on its way.
 */
export function AddToCart({ item, line }: { item: CatalogueItem; line?: CartLineDto }) {
  const [count, setCount] = useState(line?.cases ?? 1)
  const [preorder, setPreorder] = useState(line?.preorder ?? false)
  const setLine = useSetCartLine()
  const hintId = useId()
  const short = count > item.readyCases
  const canPreorder = item.nextReady !== null
  const wantsPreorder = short && canPreorder && preorder
  const unchanged = line !== undefined && line.cases === count && line.preorder === wantsPreorder

  const add = () =>
    setLine.mutate(
      { productId: item.productId, cases: count, preorder: wantsPreorder },
      {
        onSuccess: () =>
          toast.success(
            line
              ? `${item.name}: ${cases(count)} in the cart now.`
              : `${cases(count)} of ${item.name} added to the cart${wantsPreorder ? ' as a pre-order' : ''}.`,
          ),
      },
    )

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <Stepper
          value={count}
          onChange={setCount}
          label={`Cases of ${item.name}`}
          unit="case"
          aria-describedby={hintId}
        />
        <Button
          size="sm"
          onClick={add}
          loading={setLine.isPending}
          disabled={unchanged}
          className="h-10 sm:h-9"
        >
          {line ? (unchanged ? 'In cart' : 'Update cart') : 'Add to cart'}
        </Button>
      </div>
      <p id={hintId} className="text-xs text-ink-600">
        {count * item.casePack} bars
        {line ? ` · in your cart: ${cases(line.cases)}${line.preorder ? ' (pre-order)' : ''}` : ''}
      </p>
      {short ? (
        canPreorder ? (
          <Checkbox
            label={`Pre-order from curing stock (next ready ${formatDate(item.nextReady!.date)})`}
            hint={item.readyCases > 0 ? `Only ${cases(item.readyCases)} ready now.` : 'None ready now.'}
            checked={preorder}
            onChange={(e) => setPreorder(e.target.checked)}
          />
        ) : (
          <p className="text-xs text-clay-700">
            Only {cases(item.readyCases)} ready now and none curing: lower the cases to order.
          </p>
        )
      ) : null}
    </div>
  )
}
