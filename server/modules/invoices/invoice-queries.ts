import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { invoiceStatus, outstandingCents } from '@shared/domain/invoices/terms'
import type { PaymentTerms } from '@shared/domain/invoices/terms'
import type {
  BillTo,
  DocumentStatus,
  InvoiceDto,
  InvoiceKind,
  InvoiceListItem,
  InvoiceListQuery,
} from '@shared/schemas/invoices'
import type { PaymentMethod } from '@shared/schemas/payments'
import { sequelize } from '@server/db/sequelize'

/** Who is reading: a buyer is held to their own shop (another shop's invoice does not exist for them). */
export type InvoiceViewer = { role: 'owner' | 'buyer'; shopId: number | null }

type InvoiceRow = {
  id: number
  number: string
  year: number
  seq: number
  kind: InvoiceKind
  order_id: number
  order_number: string
  shop_id: number
  shop_name: string
  credits_invoice_id: number | null
  issue_date: string
  due_date: string
  terms: PaymentTerms
  po_number: string | null
  bill_to: BillTo
  subtotal_cents: number
  shipping_cents: number
  tax_cents: number
  total_cents: number
  tax_rate_pct: string
  tax_exempt: boolean
  paid_cents: number
  voided_at: Date | null
  void_reason: string | null
}

const SELECT = `
  SELECT i.id, i.number, i.year, i.seq, i.kind, i.order_id, o.number AS order_number, i.shop_id,
         s.trading_name AS shop_name, i.credits_invoice_id, i.issue_date, i.due_date, i.terms, i.po_number,
         i.bill_to, i.subtotal_cents, i.shipping_cents, i.tax_cents, i.total_cents, i.tax_rate_pct,
         i.tax_exempt, i.paid_cents, i.voided_at, i.void_reason
    FROM invoices i
    JOIN orders o ON o.id = i.order_id
    JOIN shops s ON s.id = i.shop_id`

/** An invoice's amounts as the domain reads them; a credit note owes nothing. */
export function amountsOf(r: {
  kind: InvoiceKind
  total_cents: number
  paid_cents: number
  due_date: string
  voided_at: Date | null
}) {
  return {
    totalCents: r.total_cents,
    paidCents: r.paid_cents,
    dueDate: r.due_date,
    voided: r.voided_at !== null || r.kind === 'credit_note',
  }
}

export function statusOf(r: Parameters<typeof amountsOf>[0], today: string): DocumentStatus {
  return r.kind === 'credit_note' ? 'credit' : invoiceStatus(amountsOf(r), today)
}

function toListItem(r: InvoiceRow, today: string): InvoiceListItem {
  return {
    id: r.id,
    number: r.number,
    orderId: r.order_id,
    shopId: r.shop_id,
    status: statusOf(r, today),
    issueDate: r.issue_date,
    dueDate: r.due_date,
    totalCents: r.total_cents,
    paidCents: r.paid_cents,
    orderNumber: r.order_number,
    shopName: r.shop_name,
    kind: r.kind,
    outstandingCents: outstandingCents(amountsOf(r)),
  }
}

/** Invoices and credit notes, newest first, with their status as of `today`. */
export async function listInvoices(
  viewer: InvoiceViewer,
  filter: Partial<InvoiceListQuery>,
  today: string,
  transaction?: Transaction,
): Promise<InvoiceListItem[]> {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(`$${bind.length}`))
  }
  if (viewer.role === 'buyer') add((n) => `i.shop_id = ${n}`, viewer.shopId)
  else if (filter.shopId) add((n) => `i.shop_id = ${n}`, filter.shopId)
  if (filter.kind) add((n) => `i.kind = ${n}`, filter.kind)
  if (filter.from) add((n) => `i.issue_date >= ${n}::date`, filter.from)
  if (filter.to) add((n) => `i.issue_date <= ${n}::date`, filter.to)
  const rows = await sequelize.query<InvoiceRow>(
    `${SELECT} ${where.length ? `WHERE ${where.join(' AND ')}` : ''} ORDER BY i.year DESC, i.seq DESC`,
    { bind, type: QueryTypes.SELECT, transaction },
  )
  const items = rows.map((r) => toListItem(r, today))
  return filter.status?.length ? items.filter((i) => filter.status!.includes(i.status)) : items
}

/** One invoice with its lines, payments, shipment and reminders; null when the viewer may not see it. */
export async function findInvoice(
  id: number,
  viewer: InvoiceViewer,
  today: string,
  currency: string,
  transaction?: Transaction,
): Promise<InvoiceDto | null> {
  const bind: unknown[] = [id]
  let where = 'i.id = $1'
  if (viewer.role === 'buyer') {
    bind.push(viewer.shopId)
    where += ' AND i.shop_id = $2'
  }
  const [r] = await sequelize.query<InvoiceRow>(`${SELECT} WHERE ${where}`, {
    bind,
    type: QueryTypes.SELECT,
    transaction,
  })
  if (!r) return null
  // Outside a transaction the five reads run side by side on pool connections; inside one they
  // share its connection, where pg wants one query at a time, so they are chained.
  let inTurn: Promise<unknown> = Promise.resolve()
  const q = <T extends object>(sql: string, b: unknown[]): Promise<T[]> => {
    const run = () => sequelize.query<T>(sql, { bind: b, type: QueryTypes.SELECT, transaction })
    if (!transaction) return run()
    const next = inTurn.then(run)
    inTurn = next.catch(() => undefined)
    return next
  }
  const [lines, payments, related, shipment, reminders] = await Promise.all([
    q<{
      id: number
      sku: string
      description: string
      cases: number
      case_pack: number
      bars: number
      unit_price_cents: number
      line_total_cents: number
    }>(
      `SELECT id, sku, description, cases, case_pack, bars, unit_price_cents, line_total_cents
         FROM invoice_lines WHERE invoice_id = $1 ORDER BY sort_order, id`,
      [id],
    ),
    q<{
      id: number
      method: PaymentMethod
      amount_cents: number
      received_on: string
      reference: string | null
      recorded_by: string | null
      refunded_cents: number
      refundable: boolean
    }>(
      `SELECT p.id, p.method, p.amount_cents, p.received_on, p.reference, u.name AS recorded_by,
              (SELECT coalesce(sum(r.amount_cents), 0)::int FROM payment_refunds r WHERE r.payment_id = p.id)
                AS refunded_cents,
              EXISTS (SELECT 1 FROM card_payments cp WHERE cp.payment_id = p.id) AS refundable
         FROM payments p LEFT JOIN users u ON u.id = p.recorded_by
        WHERE p.invoice_id = $1 ORDER BY p.received_on, p.id`,
      [id],
    ),
    q<{ id: number; number: string; kind: InvoiceKind }>(
      `SELECT id, number, kind FROM invoices
        WHERE (kind = 'invoice' AND id = $2) OR (kind = 'credit_note' AND credits_invoice_id = $1)`,
      [id, r.credits_invoice_id ?? 0],
    ),
    q<{ carrier: string; tracking_number: string; ship_date: string }>(
      'SELECT carrier, tracking_number, ship_date FROM shipments WHERE order_id = $1',
      [r.order_id],
    ),
    viewer.role === 'owner'
      ? q<{ sent_on: string; sent_to: string; source: 'owner' | 'daily'; sent_by: string | null }>(
          `SELECT r.sent_on, r.sent_to, r.source, u.name AS sent_by
             FROM invoice_reminders r LEFT JOIN users u ON u.id = r.sent_by
            WHERE r.invoice_id = $1 ORDER BY r.sent_on DESC, r.id DESC`,
          [id],
        )
      : Promise.resolve([]),
  ])
  const credited = related.find((x) => x.kind === 'invoice')
  const creditNote = related.find((x) => x.kind === 'credit_note')
  const s = shipment[0]
  return {
    ...toListItem(r, today),
    year: r.year,
    seq: r.seq,
    terms: r.terms,
    poNumber: r.po_number,
    billTo: r.bill_to,
    subtotalCents: r.subtotal_cents,
    shippingCents: r.shipping_cents,
    taxCents: r.tax_cents,
    taxRatePct: Number(r.tax_rate_pct),
    taxExempt: r.tax_exempt,
    lines: lines.map((l) => ({
      id: l.id,
      sku: l.sku,
      description: l.description,
      cases: l.cases,
      casePack: l.case_pack,
      bars: l.bars,
      unitPriceCents: l.unit_price_cents,
      lineTotalCents: l.line_total_cents,
    })),
    payments: payments.map((p) => ({
      id: p.id,
      method: p.method,
      amountCents: p.amount_cents,
      receivedOn: p.received_on,
      reference: p.reference,
      recordedBy: viewer.role === 'owner' ? p.recorded_by : null,
      refundedCents: p.refunded_cents,
      refundable: p.refundable,
    })),
    voidedAt: r.voided_at ? r.voided_at.toISOString() : null,
    voidReason: r.void_reason,
    creditsInvoice: credited ? { id: credited.id, number: credited.number } : null,
    creditNote: creditNote ? { id: creditNote.id, number: creditNote.number } : null,
    shipment: s ? { carrier: s.carrier, trackingNumber: s.tracking_number, shipDate: s.ship_date } : null,
    reminders: reminders.map((x) => ({
      sentOn: x.sent_on,
      sentTo: x.sent_to,
      source: x.source,
      sentBy: x.sent_by,
    })),
    currency,
  }
}
