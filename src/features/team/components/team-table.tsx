import { useMemo, useState } from 'react'
import { ROLE_LABELS } from '@shared/permissions'
import type { UserRow } from '@shared/schemas/users'
import { formatDate } from '@shared/domain/dates/dates'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { ConfirmDialog } from '@/components/ui/dialog'
import { toast } from '@/components/ui/toast'
import { useResendInvitation, useUpdateUser } from '@/features/team/api/users'

const col = dataTableColumnHelper<UserRow>()

export function TeamTable({ users, selfId }: { users: UserRow[]; selfId: number }) {
  const update = useUpdateUser()
  const resend = useResendInvitation()
  const [confirming, setConfirming] = useState<UserRow | null>(null)

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('name', {
          header: 'Name',
          cell: (c) => (
            <span>
              <span className="block font-medium text-ink-900">{c.getValue()}</span>
              <span className="block text-xs text-ink-700">{c.row.original.email}</span>
            </span>
          ),
        }),
        col.accessor((u) => ROLE_LABELS[u.role], { id: 'role', header: 'Role' }),
        col.accessor((u) => u.shopName ?? '—', { id: 'shop', header: 'Shop' }),
        col.accessor((u) => (!u.active ? 'Deactivated' : u.invitationPending ? 'Invited' : 'Active'), {
          id: 'status',
          header: 'Status',
          cell: (c) => {
            const v = c.getValue()
            return <Badge tone={v === 'Active' ? 'green' : v === 'Invited' ? 'honey' : 'neutral'}>{v}</Badge>
          },
        }),
        col.accessor((u) => (u.lastLoginAt ? formatDate(u.lastLoginAt.slice(0, 10)) : 'Never'), {
          id: 'lastLogin',
          header: 'Last sign-in',
        }),
        col.display({
          id: 'actions',
          header: () => <span className="sr-only">Actions</span>,
          cell: (c) => {
            const u = c.row.original
            if (u.id === selfId) return <span className="text-xs text-ink-600">You</span>
            return (
              <div className="flex justify-end gap-2">
                {u.invitationPending && u.active ? (
                  <Button
                    size="sm"
                    variant="ghost"
                    onClick={() =>
                      resend.mutate(u.id, {
                        onSuccess: () => toast.success(`Invitation sent again to ${u.email}.`),
                      })
                    }
                  >
                    Resend invite
                  </Button>
                ) : null}
                <Button size="sm" variant={u.active ? 'secondary' : 'ghost'} onClick={() => setConfirming(u)}>
                  {u.active ? 'Deactivate' : 'Reactivate'}
                </Button>
              </div>
            )
          },
        }),
      ]),
    [selfId, resend],
  )

  return (
    <>
      <DataTable
        label="Team and buyers"
        columns={columns}
        data={users}
        getRowId={(u) => String(u.id)}
        searchable
      />
      <ConfirmDialog
        open={confirming !== null}
        onClose={() => setConfirming(null)}
        title={
          confirming?.active ? `Deactivate ${confirming.name}?` : `Reactivate ${confirming?.name ?? ''}?`
        }
        message={
          confirming?.active
            ? 'They are signed out at once and can no longer sign in. Their history stays.'
            : 'They can sign in again with their password.'
        }
        confirmLabel={confirming?.active ? 'Deactivate' : 'Reactivate'}
        danger={!!confirming?.active}
        onConfirm={async () => {
          if (!confirming) return
          await update.mutateAsync({ id: confirming.id, active: !confirming.active })
          toast.success(
            confirming.active
              ? `${confirming.name} is deactivated.`
              : `${confirming.name} can sign in again.`,
          )
        }}
      />
    </>
  )
}
