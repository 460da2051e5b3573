import { useState } from 'react'
import { Button } from '@/components/ui/button'
import { Card, CardBody } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { useMe } from '@/features/auth/api/me'
import { useShops } from '@/features/studio/api/studio'
import { InviteDialog } from '@/features/team/components/invite-dialog'
import { TeamTable } from '@/features/team/components/team-table'
import { useUsers } from '@/features/team/api/users'

export function Component() {
  const me = useMe()
  const users = useUsers()
  const shops = useShops()
  const [inviting, setInviting] = useState(false)
  return (
    <>
      <PageHeader
        title="Team and buyers"
        description="Everyone who can sign in: studio staff and the buyers of each shop. Invite people by e-mail."
        actions={<Button onClick={() => setInviting(true)}>Invite someone</Button>}
      />
      <Card>
        <CardBody>
          {users.isPending || !me.data ? (
            <LoadingBlock />
          ) : (
            <TeamTable users={users.data ?? []} selfId={me.data.id} />
          )}
        </CardBody>
      </Card>
      <InviteDialog open={inviting} onClose={() => setInviting(false)} shops={shops.data ?? []} />
    </>
  )
}
