import { useState } from 'react'
import { useParams } from 'react-router-dom'
import { formatDate } from '@shared/domain/dates/dates'
import { Button } from '@/components/ui/button'
import { Card, CardBody } from '@/components/ui/card'
import { EmptyState } from '@/components/ui/empty-state'
import { LinkButton } from '@/components/ui/button'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { paths } from '@/config/paths'
import { useShopAccount } from '@/features/shops/api/accounts'
import {
  AccountCard,
  BuyersCard,
  CertificateCard,
  ContactCard,
  HistoryCard,
} from '@/features/shops/components/account-cards'
import { ApproveDialog } from '@/features/shops/components/approve-dialog'
import { DeclineDialog } from '@/features/shops/components/decline-dialog'
import { EditAccountDialog } from '@/features/shops/components/edit-account-dialog'
import { StatusActions } from '@/features/shops/components/status-actions'
import { ApiError } from '@/lib/api-client'

const back = { to: paths.owner.accounts, label: 'All shop accounts' }

export function Component() {
  const id = Number(useParams().shopId)
  const account = useShopAccount(id)
  const [dialog, setDialog] = useState<'approve' | 'decline' | 'edit' | null>(null)

  if (account.isPending) return <LoadingBlock />
  if (!account.data) {
    const missing =
      account.error instanceof ApiError && (account.error.status === 404 || account.error.status === 400)
    return (
      <>
        <PageHeader title="Shop account" back={back} />
        <EmptyState
          title={missing ? 'There is no such shop account' : 'The account could not be loaded'}
          message={missing ? 'It may have been typed wrong.' : 'Try again in a moment.'}
          action={<LinkButton to={paths.owner.accounts}>Back to shop accounts</LinkButton>}
        />
      </>
    )
  }
  const shop = account.data
  const close = () => setDialog(null)

  return (
    <>
      <PageHeader
        back={back}
        title={shop.tradingName}
        description={`${shop.legalName}${shop.storeType ? ` · ${shop.storeType}` : ''} · ${shop.billingAddress.city}, ${shop.billingAddress.region}`}
        actions={
          shop.status === 'applied' ? (
            <>
              <Button variant="secondary" onClick={() => setDialog('decline')}>
                Decline
              </Button>
              <Button onClick={() => setDialog('approve')}>Approve</Button>
            </>
          ) : (
            <StatusActions shop={shop} />
          )
        }
      />

      {shop.status === 'applied' ? (
        <Card className="mb-6 border-l-4 border-honey-500">
          <CardBody>
            <p className="font-medium text-ink-900">
              Application received {formatDate(shop.appliedAt.slice(0, 10))}
            </p>
            <p className="mt-1 text-sm text-ink-700">
              Download the resale certificate and check it against the legal name and tax number. Then approve
              the account with a price tier and payment terms, which invites {shop.contactName} as its first
              buyer, or decline it with a reason they will read.
            </p>
          </CardBody>
        </Card>
      ) : null}
      {shop.status === 'on_hold' || shop.status === 'closed' ? (
        <Card className="mb-6 border-l-4 border-clay-500">
          <CardBody>
            <p className="text-sm text-ink-800">
              {shop.status === 'on_hold' ? 'This account is on hold' : 'This account is closed'}: its buyers
              can sign in and look, but new orders are refused.
            </p>
          </CardBody>
        </Card>
      ) : null}

      <div className="grid gap-6 lg:grid-cols-3">
        <div className="flex min-w-0 flex-col gap-6 lg:col-span-2">
          <AccountCard shop={shop} onEdit={() => setDialog('edit')} />
          <ContactCard shop={shop} />
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          <CertificateCard shop={shop} />
          <BuyersCard shop={shop} />
          <HistoryCard shop={shop} />
        </div>
      </div>

      {shop.status === 'applied' ? (
        <>
          <ApproveDialog shop={shop} open={dialog === 'approve'} onClose={close} />
          <DeclineDialog shop={shop} open={dialog === 'decline'} onClose={close} />
        </>
      ) : null}
      <EditAccountDialog shop={shop} open={dialog === 'edit'} onClose={close} />
    </>
  )
}
