import { useState } from 'react'
import { Link } from 'react-router-dom'
import type { UnsentMailDto } from '@shared/schemas/mail'
import { Badge } from '@/components/ui/badge'
import { Button } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { ConfirmDialog } from '@/components/ui/dialog'
import { toast } from '@/components/ui/toast'
import { useDismissUnsentMail, useSendUnsentMail, useUnsentMail } from '@/features/mail/api/unsent-mail'

const time = (iso: string) =>
  new Date(iso).toLocaleString('en-US', {
    month: 'short',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
  })

const tries = (n: number) => (n === 1 ? 'Refused once' : `Refused ${n} times`)

/**
 * E-mails a change owed (an order's, an invoice, a parcel's, a card receipt) that the mail relay
 * refused. They are tried again by themselves for about a day; the owner may send one now, once
 * the relay or the address is put right, or dismiss it after sending it some other way.
 */
export function UnsentMailList({
  orderHref,
  invoiceHref,
}: {
  orderHref: (id: number) => string
  invoiceHref: (id: number) => string
}) {
  const list = useUnsentMail()
  const send = useSendUnsentMail()
  const dismiss = useDismissUnsentMail()
  const [dismissing, setDismissing] = useState<UnsentMailDto | null>(null)
  const items = list.data ?? []
  if (items.length === 0) return null

  const sendNow = (m: UnsentMailDto) =>
    send.mutate(m.id, {
      onSuccess: (r) =>
        r.sent
          ? toast.success(`Sent: ${m.about}.`)
          : toast.error(`Still not sent: ${r.item.lastError ?? 'the mail relay refused it'}`),
      onError: (err) => toast.error(err.message),
    })

  return (
    <Card className="mb-6 border-l-4 border-clay-600">
      <CardHeader
        title="E-mails not sent"
        description="The mail relay refused these. Each is tried again by itself for about a day; send one now once the relay or the address is put right, or dismiss it if you sent it another way."
      />
      <CardBody>
        <ul className="divide-y divide-cream-200 text-sm" aria-label="E-mails not sent">
          {items.map((m) => (
            <li key={m.id} className="flex flex-wrap items-start justify-between gap-3 py-3">
              <div className="min-w-0">
                <p className="flex flex-wrap items-center gap-2 font-medium text-ink-900">
                  {m.invoiceId && (m.kind === 'invoice' || m.kind.startsWith('card_')) ? (
                    <Link to={invoiceHref(m.invoiceId)} className="text-olive-800 underline">
                      {m.about}
                    </Link>
                  ) : m.orderId ? (
                    <Link to={orderHref(m.orderId)} className="text-olive-800 underline">
                      {m.about}
                    </Link>
                  ) : (
                    m.about
                  )}
                  {m.shopName ? <span className="font-normal text-ink-700">· {m.shopName}</span> : null}
                  {m.gaveUp ? (
                    <Badge tone="clay">Given up</Badge>
                  ) : (
                    <Badge tone="honey">Will try again</Badge>
                  )}
                </p>
                <p className="break-words text-ink-800">{m.lastError ?? 'The relay gave no reason.'}</p>
                <p className="text-xs text-ink-600">
                  {tries(m.attempts)} · first owed {time(m.createdAt)}
                  {m.nextAttemptAt ? ` · next try ${time(m.nextAttemptAt)}` : ''}
                </p>
              </div>
              <div className="flex gap-2">
                <Button
                  size="sm"
                  loading={send.isPending && send.variables === m.id}
                  disabled={send.isPending && send.variables !== m.id}
                  onClick={() => sendNow(m)}
                >
                  Send now
                </Button>
                <Button size="sm" variant="secondary" onClick={() => setDismissing(m)}>
                  Dismiss
                </Button>
              </div>
            </li>
          ))}
        </ul>
      </CardBody>
      <ConfirmDialog
        open={dismissing !== null}
        onClose={() => setDismissing(null)}
        title="Dismiss this e-mail?"
        message={
          dismissing
            ? `“${dismissing.about}” will not be sent${dismissing.shopName ? ` to ${dismissing.shopName}` : ''}. Dismiss it only if they have what it said some other way.`
            : ''
        }
        confirmLabel="Dismiss it"
        danger
        onConfirm={async () => {
          if (!dismissing) return
          await dismiss.mutateAsync(dismissing.id)
          toast.success(`Dismissed: ${dismissing.about}.`)
        }}
      />
    </Card>
  )
}
