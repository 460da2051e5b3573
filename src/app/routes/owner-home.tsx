import { useMemo } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { PAYMENT_TERMS_LABELS, SHOP_STATUS_LABELS } from '@shared/schemas/shops'
import type { ShopSummary } from '@shared/schemas/shops'
import { Badge } from '@/components/ui/badge'
import { LinkButton } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Stat } from '@/components/ui/stat'
import { paths } from '@/config/paths'
import { useMe } from '@/features/auth/api/me'
import { useToday } from '@/features/home/api/today'
import { TodayPanel } from '@/features/home/components/today-panel'
import { UnsentMailList } from '@/features/mail/components/unsent-mail-list'
import { useShopAccounts } from '@/features/shops/api/accounts'
import { useSettings, useStudioProfile } from '@/features/studio/api/studio'
import { useUsers } from '@/features/team/api/users'

const col = dataTableColumnHelper<ShopSummary>()
const columns = col.columns([
  col.accessor('tradingName', {
    header: 'Shop',
    cell: (c) => (
      <span>
        <span className="block font-medium text-ink-900">{c.getValue()}</span>
        <span className="block text-xs text-ink-700">{c.row.original.contactName}</span>
      </span>
    ),
  }),
  col.accessor((s) => s.tierName ?? '—', { id: 'tier', header: 'Tier' }),
  col.accessor((s) => PAYMENT_TERMS_LABELS[s.paymentTerms], { id: 'terms', header: 'Terms' }),
  col.accessor((s) => SHOP_STATUS_LABELS[s.status], {
    id: 'status',
    header: 'Status',
    cell: (c) => (
      <Badge
        tone={
          c.row.original.status === 'active' ? 'green' : c.row.original.status === 'applied' ? 'sky' : 'honey'
        }
      >
        {c.getValue()}
      </Badge>
    ),
  }),
  col.accessor(
    (s) =>
      s.certificateOnFile
        ? s.certificateExpiresOn
          ? `until ${formatDate(s.certificateExpiresOn)}`
          : 'on file'
        : 'none',
    {
      id: 'certificate',
      header: 'Resale certificate',
    },
  ),
])

export function Component() {
  const me = useMe()
  const studio = useStudioProfile()
  const shops = useShopAccounts()
  const users = useUsers()
  const today = useToday()
  const settings = useSettings()
  const counts = useMemo(() => {
    const list = shops.data ?? []
    return {
      active: list.filter((s) => s.status === 'active').length,
      held: list.filter((s) => s.status === 'on_hold').length,
    }
  }, [shops.data])
  const staff = (users.data ?? []).filter((u) => u.role !== 'buyer' && u.active).length

  return (
    <>
      <PageHeader
        title={`Good to see you, ${me.data?.name.split(' ')[0] ?? ''}`}
        description={studio.data ? `${studio.data.name} · what needs you today` : 'What needs you today'}
        actions={<LinkButton to={paths.owner.team}>Invite someone</LinkButton>}
      />
      <UnsentMailList orderHref={paths.owner.order} invoiceHref={paths.owner.invoice} />
      {today.data ? (
        <TodayPanel
          data={today.data}
          currency={settings.data?.currency ?? 'USD'}
          links={{
            applications: `${paths.owner.accounts}?status=applied`,
            ordersToConfirm: `${paths.owner.orders}?status=placed`,
            packing: paths.owner.packing,
            overdue: `${paths.owner.invoices}?status=overdue`,
            dueThisWeek: paths.owner.invoices,
            batch: paths.owner.batch,
            account: paths.owner.account,
            plan: paths.owner.plan,
            purchases: paths.owner.purchases,
          }}
        />
      ) : (
        <LoadingBlock label="Gathering today…" />
      )}
      <div className="mb-6 grid grid-cols-2 gap-4 lg:grid-cols-3">
        <Stat label="Active shop accounts" value={shops.isPending ? '…' : counts.active} />
        <Stat label="Accounts on hold" value={shops.isPending ? '…' : counts.held} />
        <Stat label="Studio staff" value={users.isPending ? '…' : staff} />
      </div>
      <Card>
        <CardHeader
          title="Shop accounts"
          description="Every wholesale account with its tier, terms and certificate."
        />
        <CardBody>
          {shops.isPending ? (
            <LoadingBlock />
          ) : (
            <DataTable
              label="Shop accounts"
              columns={columns}
              data={shops.data ?? []}
              getRowId={(s) => String(s.id)}
              rowHref={(s) => paths.owner.account(s.id)}
              searchable
              emptyMessage="No shop accounts yet. Accounts appear here when a shop applies or you invite a buyer."
            />
          )}
        </CardBody>
      </Card>
    </>
  )
}
