import { QueryTypes } from 'sequelize'
import type { SendUnsentMailResult, UnsentMailDto } from '@shared/schemas/mail'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { isSending, sendKeptNow } from '@server/modules/mail/outbox'
import type { MailJob } from '@server/modules/mail/outbox'

// The owner's view of the outbox: the e-mails the relay refused at least once, with what each is
// about, so that a buyer who never got an invoice is noticed in the app, not weeks later. The
// owner may send one now (after fixing the relay, or the buyer's address) or dismiss it (sent by
// other means); either way the row leaves the outbox only when it is really done.

type Row = {
  id: string
  job: MailJob
  attempts: number
  last_error: string | null
  next_attempt_at: Date
  gave_up_at: Date | null
  created_at: Date
  order_id: number | null
  order_number: string | null
  invoice_id: number | null
  invoice_number: string | null
  invoice_kind: 'invoice' | 'credit_note' | null
  shop_name: string | null
}

const ORDER_MAIL_WORDS: Record<Extract<MailJob, { kind: 'order' }>['mail']['kind'], string> = {
  placed: 'placed',
  confirmed: 'confirmed',
  cancelled: 'cancelled',
  preorder_allocated: 'pre-ordered cases ready',
}

function aboutOf(r: Row): string {
  const order = r.order_number ? `Order ${r.order_number}` : 'An order no longer on file'
  const invoice = r.invoice_number
    ? `${r.invoice_kind === 'credit_note' ? 'Credit note' : 'Invoice'} ${r.invoice_number}`
    : 'an invoice no longer on file'
  const j = r.job
  switch (j.kind) {
    case 'order':
      return `${order} ${ORDER_MAIL_WORDS[j.mail.kind] ?? j.mail.kind}`
    case 'invoice':
      return invoice.charAt(0).toUpperCase() + invoice.slice(1)
    case 'shipment':
      return `${order} shipped`
    case 'card_receipt':
      return `Card receipt for ${invoice.charAt(0).toLowerCase() + invoice.slice(1)}`
    case 'card_refund':
      return `Card refund on ${invoice.charAt(0).toLowerCase() + invoice.slice(1)}`
  }
}

function toDto(r: Row): UnsentMailDto {
  return {
    id: Number(r.id),
    kind: r.job.kind,
    about: aboutOf(r),
    orderId: r.order_id,
    invoiceId: r.invoice_id,
    shopName: r.shop_name,
    attempts: r.attempts,
    lastError: r.last_error,
    gaveUp: r.gave_up_at !== null,
    nextAttemptAt: r.gave_up_at ? null : r.next_attempt_at.toISOString(),
    createdAt: r.created_at.toISOString(),
  }
}

// The order and invoice a job names: `mail.orderId` (order e-mails), `orderId` (shipments),
// `invoiceId` (invoices and card e-mails, whose order is the invoice's).
const SELECT = `
  SELECT m.id, m.job, m.attempts, m.last_error, m.next_attempt_at, m.gave_up_at, m.created_at,
         o.id AS order_id, o.number AS order_number, i.id AS invoice_id, i.number AS invoice_number,
         i.kind AS invoice_kind, s.trading_name AS shop_name
    FROM mail_outbox m
    LEFT JOIN invoices i ON i.id = (m.job->>'invoiceId')::int
    LEFT JOIN orders o ON o.id = COALESCE((m.job->'mail'->>'orderId')::int, (m.job->>'orderId')::int, i.order_id)
    LEFT JOIN shops s ON s.id = COALESCE(o.shop_id, i.shop_id)
   WHERE m.attempts > 0`

/** `GET /api/unsent-mail` (owner): given up first, then the newest. */
export async function listUnsentMail(): Promise<UnsentMailDto[]> {
  const rows = await sequelize.query<Row>(`${SELECT} ORDER BY m.gave_up_at IS NULL, m.id DESC LIMIT 200`, {
    type: QueryTypes.SELECT,
  })
  return rows.map(toDto)
}

async function unsent(id: number): Promise<Row> {
  const [row] = await sequelize.query<Row>(`${SELECT} AND m.id = $1`, { bind: [id], type: QueryTypes.SELECT })
  if (!row) throw AppError.notFound('That unsent e-mail')
  if (isSending(id))
    throw AppError.conflict('mail_sending', 'This e-mail is being sent right now. Look again in a minute.')
  return row
}

/** `POST /api/unsent-mail/:id/send` (owner): one try now, counted like the others. */
export async function sendUnsentMail(id: number, userId: number): Promise<SendUnsentMailResult> {
  const row = await unsent(id)
  const about = aboutOf(row)
  const sent = await sendKeptNow({ id, job: row.job, label: about })
  await audit({
    userId,
    action: sent ? 'mail.sent_again' : 'mail.refused_again',
    entity: 'mail_outbox',
    entityId: id,
    data: { about },
  })
  if (sent) {
    await sequelize.query('DELETE FROM mail_outbox WHERE id = $1', { bind: [id] })
    return { sent: true }
  }
  const [after] = await sequelize.query<Row>(`${SELECT} AND m.id = $1`, {
    bind: [id],
    type: QueryTypes.SELECT,
  })
  if (!after) return { sent: true }
  return { sent: false, item: toDto(after) }
}

/** `POST /api/unsent-mail/:id/dismiss` (owner): the owner has seen to it (sent it some other way). */
export async function dismissUnsentMail(id: number, userId: number): Promise<void> {
  const row = await unsent(id)
  const [gone] = await sequelize.query<{ id: string }>(
    'DELETE FROM mail_outbox WHERE id = $1 AND attempts > 0 RETURNING id',
    { bind: [id], type: QueryTypes.SELECT },
  )
  if (!gone) throw AppError.notFound('That unsent e-mail')
  await audit({
    userId,
    action: 'mail.dismissed',
    entity: 'mail_outbox',
    entityId: id,
    data: { about: aboutOf(row) },
  })
}
