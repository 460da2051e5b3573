import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { formatDate } from '@shared/domain/dates/dates'
import { CreatePlannedPourSchema } from '@shared/schemas/planning'
import type { CreatePlannedPourInput, PlannedPour, PlanProduct } from '@shared/schemas/planning'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { useCreatePlannedPour } from '@/features/planning/api/plan'
import { applyApiErrors } from '@/lib/form-errors'

type Values = z.input<typeof CreatePlannedPourSchema>

/** Turns a suggested pour into a planned batch: the day and moulds start from the suggestion. */
export function PlanPourDialog({
  product,
  today,
  onClose,
  onPlanned,
}: {
  product: PlanProduct | null
  today: string
  onClose: () => void
  onPlanned: (p: PlannedPour) => void
}) {
  return product ? (
    <PlanForm
      key={product.productId}
      product={product}
      today={today}
      onClose={onClose}
      onPlanned={onPlanned}
    />
  ) : null
}

function PlanForm({
  product,
  today,
  onClose,
  onPlanned,
}: {
  product: PlanProduct
  today: string
  onClose: () => void
  onPlanned: (p: PlannedPour) => void
}) {
  const create = useCreatePlannedPour()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<Values, unknown, CreatePlannedPourInput>({
    resolver: zodResolver(CreatePlannedPourSchema),
    defaultValues: {
      productId: product.productId,
      pourDate: product.suggestion?.pourBy ?? today,
      moulds: product.suggestion?.moulds ?? 1,
      note: '',
    },
  })
  const { errors } = form.formState
  const moulds = Number(form.watch('moulds')) || 0
  const formId = `plan-pour-${product.productId}`
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { plannedPour } = await create.mutateAsync(values)
      onPlanned(plannedPour)
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['pourDate', 'moulds', 'note']))
    }
  })
  return (
    <Dialog
      open
      onClose={onClose}
      title={`Plan a pour of ${product.name}`}
      description={
        product.runOutDate
          ? `Ready stock runs out on ${formatDate(product.runOutDate)} at the current demand; pour by ${formatDate(product.latestPourDate!)} to keep it in stock.`
          : 'No demand in the window: plan it only if you expect orders.'
      }
      dismissible={!create.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={create.isPending}>
            Cancel
          </Button>
          <Button type="submit" form={formId} loading={create.isPending}>
            Plan the batch
          </Button>
        </>
      }
    >
      <form id={formId} onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormError message={formError} />
        <Field label="Pour on" error={errors.pourDate?.message}>
          <Input type="date" min={today} {...form.register('pourDate')} />
        </Field>
        <Field
          label="Moulds"
          hint={`About ${moulds * product.sellableBarsPerMould} bars to sell (${product.sellableBarsPerMould} a mould).`}
          error={errors.moulds?.message}
        >
          <Input type="number" inputMode="numeric" min={1} step={1} {...form.register('moulds')} />
        </Field>
        <Field label="Note" optional error={errors.note?.message}>
          <Textarea rows={2} {...form.register('note')} />
        </Field>
      </form>
    </Dialog>
  )
}
