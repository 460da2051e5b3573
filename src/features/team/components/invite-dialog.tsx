import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { ROLE_LABELS, ROLES } from '@shared/permissions'
import { InviteUserSchema } from '@shared/schemas/users'
import type { InviteUserInput } from '@shared/schemas/users'
import type { ShopSummary } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Select } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useInviteUser } from '@/features/team/api/users'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof InviteUserSchema>

export function InviteDialog({
  open,
  onClose,
  shops,
}: {
  open: boolean
  onClose: () => void
  shops: ShopSummary[]
}) {
  const invite = useInviteUser()
  const [formError, setFormError] = useState<string | null>(null)
  const form = useForm<FormIn, unknown, InviteUserInput>({
    resolver: zodResolver(InviteUserSchema),
    defaultValues: { email: '', name: '', role: 'packer', shopId: null },
  })
  const role = form.watch('role')
  const { errors } = form.formState
  const openShops = shops.filter((s) => s.status === 'active' || s.status === 'on_hold')

  const close = () => {
    form.reset()
    setFormError(null)
    onClose()
  }
  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { user } = await invite.mutateAsync(values)
      toast.success(`Invitation sent to ${user.email}.`)
      close()
    } catch (err) {
      setFormError(applyApiErrors(err, form.setError, ['email', 'name', 'role', 'shopId']))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title="Invite someone"
      description="They get an e-mail with a link to set their password."
      dismissible={!invite.isPending}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={invite.isPending}>
            Cancel
          </Button>
          <Button type="submit" form="invite-form" loading={invite.isPending}>
            Send invitation
          </Button>
        </>
      }
    >
      <form id="invite-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        {formError ? <FormError message={formError} /> : null}
        <Field label="Name" error={errors.name?.message}>
          <Input autoComplete="off" {...form.register('name')} />
        </Field>
        <Field label="E-mail" error={errors.email?.message}>
          <Input type="email" autoComplete="off" {...form.register('email')} />
        </Field>
        <Field label="Role" error={errors.role?.message}>
          <Select {...form.register('role')}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </Select>
        </Field>
        {role === 'buyer' ? (
          <Field label="Shop" error={errors.shopId?.message}>
            <Select {...form.register('shopId')}>
              <option value="">Choose a shop…</option>
              {openShops.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.tradingName}
                </option>
              ))}
            </Select>
          </Field>
        ) : null}
      </form>
    </Dialog>
  )
}
