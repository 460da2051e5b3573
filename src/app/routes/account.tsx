import { ROLE_LABELS } from '@shared/permissions'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { PageHeader } from '@/components/ui/page-header'
import { useMe } from '@/features/auth/api/me'
import { ChangePasswordForm } from '@/features/account/components/change-password-form'

export function Component() {
  const me = useMe()
  if (!me.data) return null
  return (
    <>
      <PageHeader
        title="Your account"
        description={`${me.data.name} · ${me.data.email} · ${ROLE_LABELS[me.data.role]}`}
      />
      <Card>
        <CardHeader title="Password" description="Changing it signs you out everywhere else." />
        <CardBody>
          <ChangePasswordForm />
        </CardBody>
      </Card>
    </>
  )
}
