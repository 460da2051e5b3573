import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { WRITE_OFF_REASONS } from '@shared/domain/stock/ledger'
import { StockMoveBodySchema, WRITE_OFF_REASON_LABELS } from '@shared/schemas/batches'
import type { StockMoveBody, StockMoveFormValues } from '@shared/schemas/batches'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useStockMove } from '@/features/batches/api/stock-move'
import { bars } from '@/features/batches/components/format'
import { applyApiErrors } from '@/lib/form-errors'

type Target = { id: number; lotCode: string; productName: string; free: number; reserved: number }

const LOSS_REASONS = WRITE_OFF_REASONS.filter((r) => r !== 'recount')

/** Writing bars off (with a reason) or correcting a count after a recount; never below zero. */
export function StockMoveDialog({
  batch,
  open,
  onClose,
}: {
  batch: Target | null
  open: boolean
  onClose: () => void
}) {
  return batch ? <MoveForm key={batch.id} batch={batch} open={open} onClose={onClose} /> : null
}

function MoveForm({ batch, open, onClose }: { batch: Target; open: boolean; onClose: () => void }) {
  const move = useStockMove(batch.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<StockMoveFormValues, unknown, StockMoveBody>({
    resolver: zodResolver(StockMoveBodySchema),
    defaultValues: { kind: 'written_off', reason: 'damaged', bars: '', note: '' },
  })
  const kind = form.watch('kind')
  const { errors } = form.formState
  const formId = `stock-move-${batch.id}`

  const close = () => {
    form.reset()
    setFormError(null)
    onClose()
  }
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const r = await move.mutateAsync(values)
      toast.success(
        values.kind === 'written_off'
          ? `${bars(values.bars)} of ${batch.lotCode} written off. ${bars(r.stock.free)} left free.`
          : `Count of ${batch.lotCode} corrected by ${values.bars > 0 ? '+' : ''}${values.bars}. ${bars(r.stock.free)} free now.`,
      )
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['kind', 'reason', 'bars', 'note']))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Write off or correct ${batch.lotCode}`}
      description={`${batch.productName}: ${bars(batch.free)} free, ${bars(batch.reserved)} reserved for orders. Only free bars can be written off.`}
      dismissible={!move.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={move.isPending}>
            Cancel
          </Button>
          <Button type="submit" form={formId} loading={move.isPending}>
            {kind === 'adjusted' ? 'Correct the count' : 'Write off'}
          </Button>
        </>
      }
    >
      <form id={formId} onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormError message={formError} />
        <Field label="What happened" error={errors.kind?.message}>
          <Select
            {...form.register('kind', {
              onChange: (e: { target: { value: string } }) =>
                form.setValue('reason', e.target.value === 'adjusted' ? 'recount' : 'damaged'),
            })}
          >
            <option value="written_off">Bars lost or given away (write off)</option>
            <option value="adjusted">A recount found a different number (correct)</option>
          </Select>
        </Field>
        <Field label="Reason" error={errors.reason?.message}>
          <Select {...form.register('reason')}>
            {(kind === 'adjusted' ? (['recount'] as const) : LOSS_REASONS).map((r) => (
              <option key={r} value={r}>
                {WRITE_OFF_REASON_LABELS[r]}
              </option>
            ))}
          </Select>
        </Field>
        <Field
          label={kind === 'adjusted' ? 'Bars to add (or remove, with a minus)' : 'Bars to write off'}
          hint={
            kind === 'adjusted'
              ? 'For example 2 when two more bars turned up, −3 when three are missing.'
              : undefined
          }
          error={errors.bars?.message}
        >
          <Input
            type="number"
            inputMode="numeric"
            step={1}
            min={kind === 'adjusted' ? undefined : 1}
            {...form.register('bars')}
          />
        </Field>
        <Field label="Note" optional error={errors.note?.message}>
          <Textarea rows={2} {...form.register('note')} />
        </Field>
      </form>
    </Dialog>
  )
}
