import { zodResolver } from '@hookform/resolvers/zod'
import { useRef, useState } from 'react'
import type { ReactNode } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { PO_NUMBER_MAX, PlaceOrderSchema } from '@shared/schemas/orders'
import type { CartDto, CartLineDto, OrderDto, StockShortfallDto } from '@shared/schemas/orders'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { ConfirmDialog } from '@/components/ui/dialog'
import { Field, Input, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { Money, formatMoney } from '@/components/ui/money'
import { ProgressBar } from '@/components/ui/progress'
import { useClearCart } from '@/features/cart/api/cart'
import { usePlaceOrder } from '@/features/cart/api/place-order'
import { CartLines } from '@/features/cart/components/cart-lines'
import { ApiError } from '@/lib/api-client'
import { applyApiErrors } from '@/lib/form-errors'
import { newIdempotencyKey } from '@/lib/idempotency'

const CheckoutSchema = PlaceOrderSchema.pick({ poNumber: true, note: true })
type CheckoutIn = z.input<typeof CheckoutSchema>
type CheckoutOut = z.output<typeof CheckoutSchema>

const kg = (g: number) => `${(g / 1000).toLocaleString('en-US', { maximumFractionDigits: 1 })} kg`

function shortfallMessage(s: StockShortfallDto, line: CartLineDto | undefined): string {
  const pack = line?.casePack ?? 1
  if (s.preorder) {
    return `Curing stock can promise only ${s.curingBars ?? 0} more bars (${Math.floor((s.curingBars ?? 0) / pack)} cases); you asked for ${s.requestedBars}.`
  }
  return `Only ${s.readyBars} bars (${Math.floor(s.readyBars / pack)} cases) are ready now; you asked for ${s.requestedBars}. Lower the cases or pre-order.`
}

type Props = {
  cart: CartDto
  renderTile?: (line: CartLineDto) => ReactNode
  /** After the order is placed (the route moves on to it). */
  onPlaced: (order: OrderDto) => void
}

/** The cart with its totals, the minimum that applies and the form that places it as an order. */
export function CartView({ cart, renderTile, onPlaced }: Props) {
  const place = usePlaceOrder()
  const clear = useClearCart()
  const [confirmClear, setConfirmClear] = useState(false)
  const [formError, setFormError] = useState<string | null>(null)
  const [lineErrors, setLineErrors] = useState<Map<number, string>>(new Map())
  // One key per attempt: a second click or a retry of the same attempt reuses it.
  const attempt = useRef<string | null>(null)
  // Set at once (state would wait for a render), so a second click while sending does nothing.
  const sending = useRef(false)
  const form = useForm<CheckoutIn, unknown, CheckoutOut>({
    resolver: zodResolver(CheckoutSchema),
    defaultValues: { poNumber: '', note: '' },
  })
  const { errors } = form.formState
  const met = cart.belowMinimumByCents === 0
  const minimumLabel = cart.minimumKind === 'opening' ? 'Opening order minimum' : 'Reorder minimum'

  const submit = form.handleSubmit(async (values) => {
    if (sending.current) return
    sending.current = true
    try {
      await send(values)
    } finally {
      sending.current = false
    }
  })

  const send = async (values: CheckoutOut) => {
    setFormError(null)
    setLineErrors(new Map())
    attempt.current ??= newIdempotencyKey()
    try {
      const { order } = await place.mutateAsync({
        idempotencyKey: attempt.current,
        lines: cart.lines.map((l) => ({ productId: l.productId, cases: l.cases, preorder: l.preorder })),
        poNumber: values.poNumber,
        note: values.note,
      })
      attempt.current = null
      form.reset()
      onPlaced(order)
    } catch (err) {
      // The server answered: this attempt is over (a new one needs a new key). A lost connection
      // keeps the key, so trying again cannot make a second order.
      if (!(err instanceof ApiError)) {
        setFormError('The order could not be sent. Check your connection and press “Place order” again.')
        return
      }
      attempt.current = null
      if (err.code === 'insufficient_stock' && Array.isArray(err.details)) {
        const byProduct = new Map(cart.lines.map((l) => [l.productId, l]))
        setLineErrors(
          new Map(
            (err.details as StockShortfallDto[]).map((s) => [
              s.productId,
              shortfallMessage(s, byProduct.get(s.productId)),
            ]),
          ),
        )
        setFormError('Stock has changed since you filled the cart. See the lines marked below.')
        return
      }
      const lineFieldErrors = new Map<number, string>()
      for (const d of err.fieldErrors) {
        const m = /^lines\.(\d+)\./.exec(d.field)
        const line = m ? cart.lines[Number(m[1])] : undefined
        if (line) lineFieldErrors.set(line.productId, d.message)
      }
      setLineErrors(lineFieldErrors)
      setFormError(
        lineFieldErrors.size > 0 ? err.message : applyApiErrors(err, form.setError, ['poNumber', 'note']),
      )
    }
  }

  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <Card className="self-start lg:col-span-2">
        <CardHeader
          title="Lines"
          description={`${cart.cases} ${cart.cases === 1 ? 'case' : 'cases'} · ${kg(cart.weightG)}`}
          actions={
            <Button size="sm" variant="ghost" onClick={() => setConfirmClear(true)}>
              Empty the cart
            </Button>
          }
        />
        <CardBody>
          <CartLines cart={cart} lineErrors={lineErrors} renderTile={renderTile} />
        </CardBody>
      </Card>

      <Card className="self-start">
        <CardHeader title="Your order" />
        <CardBody className="flex flex-col gap-4">
          <dl className="flex flex-col gap-1.5 text-sm">
            <div className="flex justify-between gap-3">
              <dt className="text-ink-700">Merchandise</dt>
              <dd className="font-medium text-ink-900">
                <Money cents={cart.subtotalCents} currency={cart.currency} />
              </dd>
            </div>
            <div className="flex justify-between gap-3">
              <dt className="text-ink-700">Shipping estimate ({kg(cart.weightG)})</dt>
              <dd>
                <Money cents={cart.shippingCents} currency={cart.currency} />
              </dd>
            </div>
            <div className="flex justify-between gap-3">
              <dt className="text-ink-700">
                {cart.taxExempt ? 'Tax exempt (certificate on file)' : `Tax (${cart.taxRatePct} %)`}
              </dt>
              <dd>
                <Money cents={cart.taxCents} currency={cart.currency} />
              </dd>
            </div>
            <div className="mt-1 flex justify-between gap-3 border-t border-cream-200 pt-2 text-base">
              <dt className="font-medium text-ink-900">Total</dt>
              <dd className="font-medium text-ink-900">
                <Money cents={cart.totalCents} currency={cart.currency} />
              </dd>
            </div>
          </dl>

          <div className="rounded-md bg-cream-100 p-3">
            <ProgressBar
              label={minimumLabel}
              value={cart.minimumCents === 0 ? 1 : cart.subtotalCents / cart.minimumCents}
              valueText={cart.minimumCents === 0 ? 'None' : formatMoney(cart.minimumCents, cart.currency)}
              tone={met ? 'olive' : 'honey'}
            />
            <p className="mt-2 text-sm text-ink-800">
              {met ? (
                'Your order meets the minimum.'
              ) : (
                <>
                  Add{' '}
                  <Money cents={cart.belowMinimumByCents} currency={cart.currency} className="font-medium" />{' '}
                  more merchandise to place it.
                </>
              )}
            </p>
          </div>

          {!cart.accountOrderable ? (
            <FormError message="Your account cannot place orders at the moment. Please contact the studio." />
          ) : null}

          <form onSubmit={submit} noValidate className="flex flex-col gap-4">
            {formError ? <FormError message={formError} /> : null}
            <Field
              label="PO number"
              optional
              hint={`Your own reference, up to ${PO_NUMBER_MAX} characters.`}
              error={errors.poNumber?.message}
            >
              <Input autoComplete="off" maxLength={PO_NUMBER_MAX + 10} {...form.register('poNumber')} />
            </Field>
            <Field label="Note to the studio" optional error={errors.note?.message}>
              <Textarea rows={3} {...form.register('note')} />
            </Field>
            <Button type="submit" loading={place.isPending} disabled={!cart.canPlace} className="w-full">
              Place order
            </Button>
            {!cart.canPlace && cart.lines.length > 0 && cart.accountOrderable ? (
              <p className="text-sm text-ink-700">
                {!met
                  ? 'The order is below its minimum.'
                  : 'Some lines need attention before the order can go.'}
              </p>
            ) : null}
          </form>
        </CardBody>
      </Card>

      <ConfirmDialog
        open={confirmClear}
        onClose={() => setConfirmClear(false)}
        title="Empty the cart?"
        message="Every line comes out of the cart. Nothing has been ordered yet."
        confirmLabel="Empty the cart"
        danger
        onConfirm={async () => {
          await clear.mutateAsync()
          setLineErrors(new Map())
        }}
      />
    </div>
  )
}
