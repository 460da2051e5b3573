import { useState } from 'react'
import type { ReactNode } from 'react'
import { formatDate } from '@shared/domain/dates/dates'
import { PAYMENT_TERMS_LABELS, formatAddress } from '@shared/schemas/shops'
import type { Address, ShopAccount } from '@shared/schemas/shops'
import { Badge } from '@/components/ui/badge'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { certificateUrl } from '@/features/shops/api/accounts'
import { InviteBuyerDialog } from '@/features/shops/components/invite-buyer-dialog'
import { ReplaceCertificateDialog } from '@/features/shops/components/replace-certificate-dialog'
import { CertificateBadge, ShopStatusBadge } from '@/features/shops/components/shop-badges'

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="grid gap-1 py-2.5 text-sm sm:grid-cols-3 sm:gap-2">
      <dt className="text-ink-700">{label}</dt>
      <dd className="text-ink-900 sm:col-span-2">{children}</dd>
    </div>
  )
}

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

const dateOf = (iso: string) => formatDate(iso.slice(0, 10))

export function AccountCard({ shop, onEdit }: { shop: ShopAccount; onEdit: () => void }) {
  const open = shop.status !== 'applied' && shop.status !== 'declined'
  return (
    <Card>
      <CardHeader
        title="Account"
        description={open ? 'Tier and terms apply to every order the shop places.' : 'Set at approval.'}
        actions={
          <Button size="sm" variant="secondary" onClick={onEdit}>
            Edit account
          </Button>
        }
      />
      <CardBody>
        <dl className="divide-y divide-cream-200">
          <Row label="Status">
            <ShopStatusBadge status={shop.status} />
          </Row>
          <Row label="Price tier">{shop.tierName ?? '—'}</Row>
          <Row label="Payment terms">{open ? PAYMENT_TERMS_LABELS[shop.paymentTerms] : '—'}</Row>
          <Row label="Opening order">{shop.openingOrderDone ? 'Placed' : 'Not yet'}</Row>
          <Row label="Kind of store">{shop.storeType ?? '—'}</Row>
          <Row label="Website">
            {shop.website && /^https?:\/\//i.test(shop.website) ? (
              <a
                href={shop.website}
                target="_blank"
                rel="noreferrer noopener"
                className="text-olive-800 underline"
              >
                {shop.website.replace(/^https?:\/\//, '')}
              </a>
            ) : (
              (shop.website ?? '—')
            )}
          </Row>
          <Row label="Tax / resale ID">{shop.taxId ?? '—'}</Row>
          <Row label="Notes">
            {shop.notes ? <span className="whitespace-pre-line">{shop.notes}</span> : '—'}
          </Row>
          {shop.declineReason ? <Row label="Reason declined">{shop.declineReason}</Row> : null}
        </dl>
      </CardBody>
    </Card>
  )
}

export function ContactCard({ shop }: { shop: ShopAccount }) {
  return (
    <Card>
      <CardHeader title="Contact and addresses" />
      <CardBody>
        <dl className="divide-y divide-cream-200">
          <Row label="Contact">
            {shop.contactName}
            <a href={`mailto:${shop.contactEmail}`} className="block text-olive-800 underline">
              {shop.contactEmail}
            </a>
            {shop.contactPhone ? <span className="block text-ink-700">{shop.contactPhone}</span> : null}
          </Row>
          <Row label="Bill to">
            <span className="block">{shop.legalName}</span>
            <AddressLines a={shop.billingAddress} />
          </Row>
          <Row label="Ship to">
            <AddressLines a={shop.shippingAddress} />
          </Row>
        </dl>
      </CardBody>
    </Card>
  )
}

function sizeOf(bytes: number) {
  if (bytes >= 1024 * 1024) return `${(bytes / 1024 / 1024).toFixed(1)} MB`
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} KB`
  return `${bytes} bytes`
}

const TYPE_NAMES: Record<string, string> = {
  'application/pdf': 'PDF',
  'image/jpeg': 'JPEG',
  'image/png': 'PNG',
}

export function CertificateCard({ shop }: { shop: ShopAccount }) {
  const [replacing, setReplacing] = useState(false)
  const c = shop.certificate
  return (
    <Card>
      <CardHeader
        title="Resale certificate"
        actions={<CertificateBadge status={shop.certificateStatus} expiresOn={shop.certificateExpiresOn} />}
      />
      <CardBody className="flex flex-col gap-4">
        {c ? (
          <dl className="text-sm">
            <dt className="sr-only">File</dt>
            <dd className="font-medium break-all text-ink-900">{c.filename}</dd>
            <dt className="sr-only">Details</dt>
            <dd className="text-ink-700">
              {TYPE_NAMES[c.contentType] ?? 'File'} · {sizeOf(c.sizeBytes)} · received {dateOf(c.uploadedAt)}
            </dd>
          </dl>
        ) : (
          <p className="text-sm text-ink-700">No certificate on file: orders are charged sales tax.</p>
        )}
        <div className="flex flex-wrap gap-2">
          {c ? (
            <a href={certificateUrl(shop.id)} download className={buttonClasses('secondary', 'sm')}>
              Download certificate
            </a>
          ) : null}
          <Button size="sm" variant="secondary" onClick={() => setReplacing(true)}>
            {c ? 'Replace certificate' : 'Upload certificate'}
          </Button>
        </div>
      </CardBody>
      <ReplaceCertificateDialog shop={shop} open={replacing} onClose={() => setReplacing(false)} />
    </Card>
  )
}

export function BuyersCard({ shop }: { shop: ShopAccount }) {
  const [inviting, setInviting] = useState(false)
  const open = shop.status !== 'applied' && shop.status !== 'declined'
  return (
    <Card>
      <CardHeader
        title="Buyers"
        description={open ? 'People who order for the shop.' : 'The first buyer is invited when you approve.'}
        actions={
          open ? (
            <Button size="sm" variant="secondary" onClick={() => setInviting(true)}>
              Invite another buyer
            </Button>
          ) : null
        }
      />
      <CardBody>
        {shop.buyers.length === 0 ? (
          <p className="text-sm text-ink-700">No buyers yet.</p>
        ) : (
          <ul className="divide-y divide-cream-200">
            {shop.buyers.map((b) => (
              <li key={b.id} className="flex flex-wrap items-start justify-between gap-2 py-2.5 text-sm">
                <span className="min-w-0">
                  <span className="block font-medium text-ink-900">{b.name}</span>
                  <span className="block break-all text-ink-700">{b.email}</span>
                  <span className="block text-xs text-ink-700">
                    {b.lastLoginAt ? `Last signed in ${dateOf(b.lastLoginAt)}` : 'Not signed in yet'}
                  </span>
                </span>
                <Badge tone={!b.active ? 'neutral' : b.invitationPending ? 'honey' : 'green'}>
                  {!b.active ? 'Deactivated' : b.invitationPending ? 'Invited' : 'Active'}
                </Badge>
              </li>
            ))}
          </ul>
        )}
      </CardBody>
      {open ? <InviteBuyerDialog shop={shop} open={inviting} onClose={() => setInviting(false)} /> : null}
    </Card>
  )
}

const EVENT_LABELS: Record<string, string> = {
  'shop.applied': 'Applied',
  'shop.approved': 'Approved',
  'shop.declined': 'Declined',
  'shop.held': 'Put on hold',
  'shop.closed': 'Closed',
  'shop.reactivated': 'Reactivated',
  'shop.updated': 'Details edited',
  'shop.buyer_invited': 'Buyer invited',
  'shop.certificate_replaced': 'Certificate replaced',
}

export function HistoryCard({ shop }: { shop: ShopAccount }) {
  return (
    <Card>
      <CardHeader title="History" />
      <CardBody>
        {shop.events.length === 0 ? (
          <p className="text-sm text-ink-700">Nothing recorded yet.</p>
        ) : (
          <ol className="flex flex-col gap-3">
            {shop.events.map((e, i) => (
              <li key={`${e.at}-${i}`} className="text-sm">
                <span className="block font-medium text-ink-900">{EVENT_LABELS[e.action] ?? e.action}</span>
                <span className="block text-ink-700">
                  {dateOf(e.at)}
                  {e.byName
                    ? ` · ${e.byName}`
                    : e.action === 'shop.applied'
                      ? ' · through the application form'
                      : ''}
                </span>
                {e.note ? <span className="block break-words text-ink-700">{e.note}</span> : null}
              </li>
            ))}
          </ol>
        )}
      </CardBody>
    </Card>
  )
}
