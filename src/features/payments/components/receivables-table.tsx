import { useMemo } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { AGEING_BUCKET_LABELS } from '@shared/schemas/payments'
import type { ReceivablesShopDto } from '@shared/schemas/payments'
import { PAYMENT_TERMS_LABELS } from '@shared/schemas/shops'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Money } from '@/components/ui/money'

const col = dataTableColumnHelper<ReceivablesShopDto>()
const money = (currency: string) => (c: { getValue: () => unknown }) => {
  const cents = Number(c.getValue())
  return cents ? <Money cents={cents} currency={currency} /> : <span className="text-ink-600">—</span>
}

/** Each shop's open invoices by age, most owed first. */
export function ReceivablesTable({
  shops,
  currency,
  shopHref,
}: {
  shops: ReceivablesShopDto[]
  currency: string
  shopHref: (shopId: number) => string
}) {
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('shopName', {
          header: 'Shop',
          cell: (c) => (
            <span>
              <span className="block">{c.getValue()}</span>
              <span className="block text-xs font-normal text-ink-600">
                {PAYMENT_TERMS_LABELS[c.row.original.terms]}
              </span>
            </span>
          ),
        }),
        col.accessor((s) => s.byBucket.current, {
          id: 'current',
          header: AGEING_BUCKET_LABELS.current,
          meta: { align: 'end' },
          cell: money(currency),
        }),
        col.accessor((s) => s.byBucket['1_30'], {
          id: '1_30',
          header: AGEING_BUCKET_LABELS['1_30'],
          meta: { align: 'end' },
          cell: money(currency),
        }),
        col.accessor((s) => s.byBucket['31_60'], {
          id: '31_60',
          header: AGEING_BUCKET_LABELS['31_60'],
          meta: { align: 'end' },
          cell: money(currency),
        }),
        col.accessor((s) => s.byBucket['61_90'], {
          id: '61_90',
          header: AGEING_BUCKET_LABELS['61_90'],
          meta: { align: 'end' },
          cell: money(currency),
        }),
        col.accessor((s) => s.byBucket.over_90, {
          id: 'over_90',
          header: AGEING_BUCKET_LABELS.over_90,
          meta: { align: 'end' },
          cell: money(currency),
        }),
        col.accessor('outstandingCents', {
          header: 'Owed',
          meta: { align: 'end' },
          cell: (c) => (
            <Money cents={c.getValue()} currency={currency} className="font-medium text-ink-900" />
          ),
        }),
        col.accessor((s) => s.oldestDueDate ?? '', {
          id: 'oldest',
          header: 'Oldest due',
          cell: (c) => (c.getValue() ? formatDate(c.getValue()) : '—'),
        }),
      ]),
    [currency],
  )
  return (
    <DataTable
      label="What each shop owes, by age"
      columns={columns}
      data={shops}
      getRowId={(s) => String(s.shopId)}
      rowHref={(s) => shopHref(s.shopId)}
      emptyMessage="No shop owes anything."
      initialSorting={[{ id: 'outstandingCents', desc: true }]}
    />
  )
}
