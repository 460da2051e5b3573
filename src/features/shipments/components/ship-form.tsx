import { zodResolver } from '@hookform/resolvers/zod'
import { useId, useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { COMMON_CARRIERS, ShipOrderSchema } from '@shared/schemas/shipments'
import type { ShipResultDto } from '@shared/schemas/shipments'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { useShipOrder } from '@/features/shipments/api/shipments'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof ShipOrderSchema>

/**
 * Hands a packed order to the carrier: carrier, tracking number and date. Shipping raises the
 * invoice and e-mails the buyer the tracking number with the packing slip.
 */
export function ShipForm({
  orderId,
  today,
  onShipped,
}: {
  orderId: number
  /** The default ship date (the browser's today). */
  today: string
  onShipped: (result: ShipResultDto) => void
}) {
  const ship = useShipOrder(orderId)
  const carriersId = useId()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, z.output<typeof ShipOrderSchema>>({
    resolver: zodResolver(ShipOrderSchema),
    defaultValues: { carrier: '', trackingNumber: '', shipDate: today },
  })
  const { errors } = form.formState

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      onShipped(await ship.mutateAsync(values))
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['carrier', 'trackingNumber', 'shipDate']))
    }
  })

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label="Ship the order">
      {formError ? <FormError message={formError} /> : null}
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Carrier" error={errors.carrier?.message}>
          <Input list={carriersId} autoComplete="off" {...form.register('carrier')} />
        </Field>
        <datalist id={carriersId}>
          {COMMON_CARRIERS.map((c) => (
            <option key={c} value={c} />
          ))}
        </datalist>
        <Field label="Tracking number" error={errors.trackingNumber?.message}>
          <Input autoComplete="off" spellCheck={false} {...form.register('trackingNumber')} />
        </Field>
        <Field label="Ship date" error={errors.shipDate?.message}>
          <Input type="date" max={today} {...form.register('shipDate')} />
        </Field>
      </div>
      <div>
        <Button type="submit" loading={ship.isPending}>
          Ship order
        </Button>
      </div>
    </form>
  )
}
