import { formatDate } from '@shared/domain/dates/dates'
import { CERTIFICATE_STATUS_LABELS, PAYMENT_TERMS_LABELS, SHOP_STATUS_LABELS } from '@shared/schemas/shops'
import type { ShopSummary } from '@shared/schemas/shops'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { paths } from '@/config/paths'
import { CertificateBadge, ShopStatusBadge } from '@/features/shops/components/shop-badges'

const col = dataTableColumnHelper<ShopSummary>()
const columns = col.columns([
  col.accessor('tradingName', {
    header: 'Shop',
    cell: (c) => (
      <span>
        <span className="block">{c.getValue()}</span>
        <span className="block text-xs font-normal text-ink-700">
          {c.row.original.contactName}
          {c.row.original.billingAddress.city
            ? ` · ${c.row.original.billingAddress.city}, ${c.row.original.billingAddress.region}`
            : ''}
        </span>
      </span>
    ),
  }),
  col.accessor((s) => SHOP_STATUS_LABELS[s.status], {
    id: 'status',
    header: 'Status',
    cell: (c) => <ShopStatusBadge status={c.row.original.status} />,
  }),
  col.accessor((s) => s.tierName ?? '—', { id: 'tier', header: 'Tier' }),
  col.accessor((s) => (s.status === 'applied' ? '—' : PAYMENT_TERMS_LABELS[s.paymentTerms]), {
    id: 'terms',
    header: 'Terms',
  }),
  col.accessor((s) => CERTIFICATE_STATUS_LABELS[s.certificateStatus], {
    id: 'certificate',
    header: 'Certificate',
    cell: (c) => (
      <CertificateBadge
        status={c.row.original.certificateStatus}
        expiresOn={c.row.original.certificateExpiresOn}
      />
    ),
  }),
  col.accessor('buyerCount', { header: 'Buyers', meta: { align: 'end' } }),
  col.accessor((s) => s.appliedAt.slice(0, 10), {
    id: 'applied',
    header: 'Since',
    cell: (c) => formatDate(c.getValue()),
  }),
])

/** The shop accounts, each row leading to its page. */
export function AccountsTable({ shops, emptyMessage }: { shops: ShopSummary[]; emptyMessage: string }) {
  return (
    <DataTable
      label="Shop accounts"
      columns={columns}
      data={shops}
      getRowId={(s) => String(s.id)}
      rowHref={(s) => paths.owner.account(s.id)}
      searchable
      searchPlaceholder="Shop, contact or city"
      paginate
      emptyMessage={emptyMessage}
    />
  )
}
