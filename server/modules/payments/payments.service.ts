import { QueryTypes } from 'sequelize'
import { compareIso } from '@shared/domain/dates/dates'
import { outstandingCents } from '@shared/domain/invoices/terms'
import { formatCents } from '@shared/domain/money/money'
import { toCsv } from '@shared/domain/csv/csv'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { PAYMENT_METHOD_LABELS } from '@shared/schemas/payments'
import type { PaymentDto, PaymentListQuery, PaymentMethod, RecordPayment } from '@shared/schemas/payments'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { listRefunds } from '@server/modules/card-payments/card-payments.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { amountsOf } from '@server/modules/invoices/invoice-queries'
import { requireInvoice } from '@server/modules/invoices/invoices.service'
import { spreadsheetSafe } from '@server/modules/invoices/spreadsheet'
import { getSettings } from '@server/modules/settings/settings.service'

type PaymentRow = {
  id: number
  invoice_id: number
  invoice_number: string
  order_id: number
  order_number: string
  shop_id: number
  shop_name: string
  method: PaymentMethod
  amount_cents: number
  received_on: string
  reference: string | null
  recorded_by: string | null
  created_at: Date
  refunded_cents: number
}

const SELECT = `
  SELECT p.id, p.invoice_id, i.number AS invoice_number, i.order_id, o.number AS order_number, i.shop_id,
         s.trading_name AS shop_name, p.method, p.amount_cents, p.received_on, p.reference, u.name AS recorded_by,
         p.created_at,
         (SELECT coalesce(sum(r.amount_cents), 0)::int FROM payment_refunds r WHERE r.payment_id = p.id) AS refunded_cents
    FROM payments p
    JOIN invoices i ON i.id = p.invoice_id
    JOIN orders o ON o.id = i.order_id
    JOIN shops s ON s.id = i.shop_id
    LEFT JOIN users u ON u.id = p.recorded_by`

function toDto(r: PaymentRow): PaymentDto {
  return {
    id: r.id,
    invoiceId: r.invoice_id,
    invoiceNumber: r.invoice_number,
    orderId: r.order_id,
    orderNumber: r.order_number,
    shopId: r.shop_id,
    shopName: r.shop_name,
    method: r.method,
    amountCents: r.amount_cents,
    receivedOn: r.received_on,
    reference: r.reference,
    recordedBy: r.recorded_by,
    createdAt: r.created_at.toISOString(),
    refundedCents: r.refunded_cents,
  }
}

/**
 * Records money received against an invoice, whole or part, in one transaction with the invoice
 * row locked: two payments at once queue up, and the second sees what the first left owing. More
 * than is owed is refused (422 `overpayment` on amountCents); the payments trigger adds the amount
 * to paid_cents, and the invoice's CHECK (paid ≤ total) stays as the last guard.
 */
export async function recordPayment(
  invoiceId: number,
  input: RecordPayment,
  userId: number,
): Promise<{ payment: PaymentDto; invoice: InvoiceDto }> {
  const [today, settings] = await Promise.all([studioToday(), getSettings()])
  if (compareIso(input.receivedOn, today) > 0) {
    throw AppError.field('receivedOn', `The date cannot be after today (${today}).`)
  }
  const paymentId = await sequelize.transaction(async (t) => {
    const [inv] = await sequelize.query<{
      id: number
      number: string
      kind: 'invoice' | 'credit_note'
      total_cents: number
      paid_cents: number
      due_date: string
      voided_at: Date | null
    }>(
      'SELECT id, number, kind, total_cents, paid_cents, due_date, voided_at FROM invoices WHERE id = $1 FOR UPDATE',
      {
        bind: [invoiceId],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    if (!inv) throw AppError.notFound('That invoice')
    if (inv.kind === 'credit_note' || inv.voided_at) {
      throw AppError.conflict(
        'not_payable',
        inv.kind === 'credit_note'
          ? `${inv.number} is a credit note: payments go on invoices.`
          : `Invoice ${inv.number} is void: nothing is owed on it.`,
      )
    }
    const owed = outstandingCents(amountsOf(inv))
    if (input.amountCents > owed) {
      const message =
        owed === 0
          ? `Invoice ${inv.number} is paid in full; nothing more is owed.`
          : `Only ${formatCents(owed, settings.currency)} is owed on invoice ${inv.number}; ${formatCents(input.amountCents, settings.currency)} is more than that.`
      throw AppError.unprocessable('overpayment', message, [
        { field: 'amountCents', message, outstandingCents: owed },
      ])
    }
    const [row] = await sequelize.query<{ id: number }>(
      `INSERT INTO payments (invoice_id, method, amount_cents, received_on, reference, recorded_by)
       VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
      {
        bind: [invoiceId, input.method, input.amountCents, input.receivedOn, input.reference, userId],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    await audit(
      {
        userId,
        action: 'payment.recorded',
        entity: 'invoice',
        entityId: invoiceId,
        data: { paymentId: row!.id, amountCents: input.amountCents, method: input.method },
      },
      t,
    )
    return row!.id
  })
  const [payment] = await listPayments({ paymentId })
  return { payment: payment!, invoice: await requireInvoice(invoiceId, { role: 'owner', shopId: null }) }
}

/** Payments, newest received first, with the filters of `GET /api/payments`. */
export async function listPayments(
  filter: Partial<PaymentListQuery> & { paymentId?: number },
): Promise<PaymentDto[]> {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(`$${bind.length}`))
  }
  if (filter.paymentId) add((n) => `p.id = ${n}`, filter.paymentId)
  if (filter.shopId) add((n) => `i.shop_id = ${n}`, filter.shopId)
  if (filter.invoiceId) add((n) => `p.invoice_id = ${n}`, filter.invoiceId)
  if (filter.method) add((n) => `p.method = ${n}`, filter.method)
  if (filter.from) add((n) => `p.received_on >= ${n}::date`, filter.from)
  if (filter.to) add((n) => `p.received_on <= ${n}::date`, filter.to)
  const rows = await sequelize.query<PaymentRow>(
    `${SELECT} ${where.length ? `WHERE ${where.join(' AND ')}` : ''} ORDER BY p.received_on DESC, p.id DESC`,
    { bind, type: QueryTypes.SELECT },
  )
  return rows.map(toDto)
}

/**
 * The bookkeeper's export of payments received, and card refunds as rows of their own with a
 * negative amount (dated the day of the refund), so the Amount column adds up to the money kept.
 */
export async function paymentsCsv(filter: PaymentListQuery): Promise<string> {
  const [items, refunds] = await Promise.all([
    listPayments(filter),
    !filter.method || filter.method === 'card'
      ? listRefunds({ shopId: filter.shopId, invoiceId: filter.invoiceId, from: filter.from, to: filter.to })
      : Promise.resolve([]),
  ])
  const rows = [
    ...items.map((p) => ({
      date: p.receivedOn,
      at: p.createdAt,
      cells: [
        p.receivedOn,
        p.invoiceNumber,
        spreadsheetSafe(p.shopName),
        p.orderNumber,
        PAYMENT_METHOD_LABELS[p.method],
        (p.amountCents / 100).toFixed(2),
        spreadsheetSafe(p.reference ?? ''),
        spreadsheetSafe(p.recordedBy ?? ''),
        p.createdAt,
      ],
    })),
    ...refunds.map((r) => ({
      date: r.refundedOn,
      at: r.createdAt,
      cells: [
        r.refundedOn,
        r.invoiceNumber,
        spreadsheetSafe(r.shopName),
        r.orderNumber,
        'Card refund',
        (-r.amountCents / 100).toFixed(2),
        spreadsheetSafe([r.providerRefundId, r.reason].filter(Boolean).join(' · ')),
        spreadsheetSafe(r.createdBy ?? ''),
        r.createdAt,
      ],
    })),
  ].sort((a, b) => b.date.localeCompare(a.date) || b.at.localeCompare(a.at))
  return toCsv([
    [
      'Received on',
      'Invoice',
      'Shop',
      'Order',
      'Method',
      'Amount',
      'Reference',
      'Recorded by',
      'Recorded at',
    ],
    ...rows.map((r) => r.cells),
  ])
}
