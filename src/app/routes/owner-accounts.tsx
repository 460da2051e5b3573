import { useMemo } from 'react'
import { useSearchParams } from 'react-router-dom'
import { SHOP_STATUSES } from '@shared/schemas/shops'
import type { ShopStatus, ShopSummary } from '@shared/schemas/shops'
import { Button } from '@/components/ui/button'
import { PageHeader } from '@/components/ui/page-header'
import { LoadingBlock } from '@/components/ui/spinner'
import { Tabs } from '@/components/ui/tabs'
import { useShopAccounts } from '@/features/shops/api/accounts'
import { AccountsTable } from '@/features/shops/components/accounts-table'

type Filter = 'all' | ShopStatus

const TABS: { id: Filter; label: string; empty: string }[] = [
  {
    id: 'all',
    label: 'All',
    empty: 'No shop accounts yet. Shops apply through the link on the sign-in page.',
  },
  { id: 'applied', label: 'Applications', empty: 'No applications waiting.' },
  { id: 'active', label: 'Active', empty: 'No active accounts.' },
  { id: 'on_hold', label: 'On hold', empty: 'No accounts on hold.' },
  { id: 'closed', label: 'Closed', empty: 'No closed accounts.' },
  { id: 'declined', label: 'Declined', empty: 'No declined applications.' },
]

const isFilter = (v: string | null): v is Filter =>
  v === 'all' || (SHOP_STATUSES as readonly string[]).includes(v ?? '')

export function Component() {
  const shops = useShopAccounts()
  const [params, setParams] = useSearchParams()
  const requested = params.get('status')
  const filter: Filter = isFilter(requested) ? requested : 'all'

  const byStatus = useMemo(() => {
    const all = shops.data ?? []
    const map = new Map<Filter, ShopSummary[]>([['all', all]])
    for (const s of SHOP_STATUSES)
      map.set(
        s,
        all.filter((x) => x.status === s),
      )
    return map
  }, [shops.data])
  const waiting = byStatus.get('applied')?.length ?? 0

  const select = (id: string) => setParams(id === 'all' ? {} : { status: id }, { replace: true })

  return (
    <>
      <PageHeader
        title="Shop accounts"
        description="Wholesale applications and the shops you sell to: tier, terms, resale certificate and buyers."
      />
      {shops.isPending ? (
        <LoadingBlock />
      ) : (
        <>
          {waiting > 0 && filter !== 'applied' ? (
            <div className="mb-5 flex flex-col gap-3 rounded-card border border-honey-500/40 bg-honey-50 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
              <p className="text-sm text-ink-800">
                <span className="font-medium">
                  {waiting === 1 ? '1 application is' : `${waiting} applications are`} waiting for review.
                </span>{' '}
                Check the certificate, then approve with a tier and terms, or decline with a reason.
              </p>
              <Button size="sm" onClick={() => select('applied')}>
                Review applications
              </Button>
            </div>
          ) : null}
          <Tabs
            label="Accounts by status"
            selectedId={filter}
            onSelect={select}
            items={TABS.map((t) => ({
              id: t.id,
              label: `${t.label} (${byStatus.get(t.id)?.length ?? 0})`,
              content:
                t.id === filter ? (
                  <AccountsTable shops={byStatus.get(t.id) ?? []} emptyMessage={t.empty} />
                ) : null,
            }))}
          />
        </>
      )}
    </>
  )
}
