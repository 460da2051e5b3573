import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { UpdateBatchSchema } from '@shared/schemas/batches'
import type { BatchDetail, UpdateBatchInput } from '@shared/schemas/batches'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useUpdateBatch } from '@/features/batches/api/batch'
import { applyApiErrors } from '@/lib/form-errors'

/** Where the batch sits and the owner's notes: the only things that change after pouring. */
export function BatchNotesDialog({
  batch,
  open,
  onClose,
}: {
  batch: BatchDetail
  open: boolean
  onClose: () => void
}) {
  const update = useUpdateBatch(batch.id)
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<z.input<typeof UpdateBatchSchema>, unknown, UpdateBatchInput>({
    resolver: zodResolver(UpdateBatchSchema),
    values: { location: batch.location ?? '', notes: batch.notes ?? '' },
  })
  const { errors } = form.formState
  const close = () => {
    setFormError(null)
    onClose()
  }
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      await update.mutateAsync(values)
      toast.success(`${batch.lotCode} saved.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['location', 'notes']))
    }
  })
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Location and notes of ${batch.lotCode}`}
      dismissible={!update.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={update.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="batch-notes-form" loading={update.isPending}>
            Save
          </Button>
        </>
      }
    >
      <form id="batch-notes-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormError message={formError} />
        <Field
          label="Location"
          optional
          hint="Which rack or shelf the bars cure on."
          error={errors.location?.message}
        >
          <Input maxLength={60} {...form.register('location')} />
        </Field>
        <Field label="Notes" optional error={errors.notes?.message}>
          <Textarea rows={4} {...form.register('notes')} />
        </Field>
      </form>
    </Dialog>
  )
}
