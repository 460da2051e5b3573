import { formatDate } from '@shared/domain/dates/dates'
import { PAYMENT_TERMS_LABELS, SHOP_STATUS_LABELS, formatAddress } from '@shared/schemas/shops'
import type { Address, ShopSummary } from '@shared/schemas/shops'
import { Badge } from '@/components/ui/badge'
import { Card, CardBody, CardHeader } from '@/components/ui/card'

function AddressLines({ a }: { a: Address }) {
  return (
    <address className="not-italic">
      {formatAddress(a).map((l) => (
        <span key={l} className="block">
          {l}
        </span>
      ))}
    </address>
  )
}

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="grid grid-cols-3 gap-2 py-2 text-sm">
      <dt className="text-ink-700">{label}</dt>
      <dd className="col-span-2 text-ink-900">{children}</dd>
    </div>
  )
}

/** A shop account as its buyer sees it: terms, tier name, addresses, certificate. */
export function ShopDetails({ shop }: { shop: ShopSummary }) {
  const tone = shop.status === 'active' ? 'green' : shop.status === 'on_hold' ? 'honey' : 'neutral'
  return (
    <Card>
      <CardHeader
        title={shop.tradingName}
        description={shop.legalName}
        actions={<Badge tone={tone}>{SHOP_STATUS_LABELS[shop.status]}</Badge>}
      />
      <CardBody>
        <dl className="divide-y divide-cream-200">
          <Row label="Price tier">{shop.tierName ?? '—'}</Row>
          <Row label="Payment terms">{PAYMENT_TERMS_LABELS[shop.paymentTerms]}</Row>
          <Row label="Contact">
            {shop.contactName}
            <span className="block text-ink-700">{shop.contactEmail}</span>
            {shop.contactPhone ? <span className="block text-ink-700">{shop.contactPhone}</span> : null}
          </Row>
          <Row label="Ship to">
            <AddressLines a={shop.shippingAddress} />
          </Row>
          <Row label="Bill to">
            <AddressLines a={shop.billingAddress} />
          </Row>
          <Row label="Tax / resale ID">{shop.taxId ?? '—'}</Row>
          <Row label="Resale certificate">
            {shop.certificateOnFile
              ? shop.certificateExpiresOn
                ? `On file, valid until ${formatDate(shop.certificateExpiresOn)}`
                : 'On file'
              : 'Not on file: sales tax applies to your orders.'}
          </Row>
        </dl>
      </CardBody>
    </Card>
  )
}
