import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useFieldArray, useForm } from 'react-hook-form'
import type { z } from 'zod'
import { MarkPackedSchema } from '@shared/schemas/packing'
import type { PackingOrderDto } from '@shared/schemas/packing'
import { Button } from '@/components/ui/button'
import { Field, Input } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useMarkPacked } from '@/features/packing/api/packing'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof MarkPackedSchema>
type FormOut = z.output<typeof MarkPackedSchema>

/**
 * Records the order packed: cartons, the weight on the scale, and the bars put in per line,
 * prefilled from the allocations. The server refuses anything that differs from them.
 */
export function PackedForm({ order }: { order: PackingOrderDto }) {
  const packed = useMarkPacked(order.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(MarkPackedSchema),
    defaultValues: {
      cartons: '1',
      weightG: String(order.estimatedWeightG || ''),
      lines: order.lines.map((l) => ({ orderLineId: l.orderLineId, bars: String(l.allocatedBars) })),
    },
  })
  const lines = useFieldArray({ control: form.control, name: 'lines' })
  const { errors } = form.formState

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await packed.mutateAsync(values)
      toast.success(`${order.number} is packed. Ship it when the carrier comes.`)
    } catch (err) {
      const fields = ['cartons', 'weightG', 'lines', ...order.lines.map((_, i) => `lines.${i}.bars`)]
      setFormError(applyApiErrors(err, form.setError, fields))
    }
  })

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label="Record packed">
      {formError ? <FormError message={formError} /> : null}
      {errors.lines?.message ? <FormError message={errors.lines.message} /> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Cartons" error={errors.cartons?.message}>
          <Input type="number" inputMode="numeric" min={1} step={1} {...form.register('cartons')} />
        </Field>
        <Field
          label="Packed weight (g)"
          hint={
            order.estimatedWeightG
              ? `The bars weigh about ${(order.estimatedWeightG / 1000).toFixed(1)} kg; weigh the cartons.`
              : undefined
          }
          error={errors.weightG?.message}
        >
          <Input type="number" inputMode="numeric" min={1} step={1} {...form.register('weightG')} />
        </Field>
      </div>
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-1 text-sm font-medium text-ink-800">Bars packed per line</legend>
        {lines.fields.map((f, i) => {
          const line = order.lines[i]!
          return (
            <Field
              key={f.id}
              label={`${line.sku} · ${line.name}`}
              hint={`${line.allocatedBars} bars allocated (${line.lots.map((l) => `${l.lotCode} × ${l.bars}`).join(', ')})`}
              error={errors.lines?.[i]?.bars?.message}
            >
              <Input
                type="number"
                inputMode="numeric"
                min={0}
                step={1}
                className="sm:max-w-40"
                {...form.register(`lines.${i}.bars`)}
              />
            </Field>
          )
        })}
      </fieldset>
      <div>
        <Button type="submit" loading={packed.isPending}>
          Record packed
        </Button>
      </div>
    </form>
  )
}
