import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { dueDate } from '@shared/domain/invoices/terms'
import type { PaymentTerms } from '@shared/domain/invoices/terms'
import type { OrderStatus } from '@shared/domain/orders/order-status'
import type {
  BillTo,
  InvoiceDto,
  InvoiceListItem,
  InvoiceListQuery,
  VoidInvoiceInput,
} from '@shared/schemas/invoices'
import { DOCUMENT_STATUS_LABELS, INVOICE_KIND_LABELS } from '@shared/schemas/invoices'
import { PAYMENT_TERMS_LABELS, formatAddress } from '@shared/schemas/shops'
import type { Address } from '@shared/schemas/shops'
import { toCsv } from '@shared/domain/csv/csv'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { isUniqueViolation } from '@server/modules/orders/transactions'
import { getSettings } from '@server/modules/settings/settings.service'
import { takeInvoiceNumber } from '@server/modules/invoices/invoice-number'
import { findInvoice, listInvoices } from '@server/modules/invoices/invoice-queries'
import type { InvoiceViewer } from '@server/modules/invoices/invoice-queries'
import { sendInvoiceMail } from '@server/modules/invoices/invoice-mail'
import { keepMail } from '@server/modules/mail/outbox'
import { spreadsheetSafe } from '@server/modules/invoices/spreadsheet'

export type InvoiceRef = { id: number; number: string; orderId: number; totalCents: number }

/** Statuses in which a prepay account's order is invoiced (from confirmation on); others on shipping. */
const PREPAY_INVOICEABLE: readonly OrderStatus[] = ['confirmed', 'packing', 'packed', 'shipped']

export type RaiseOptions = {
  /** The invoice date; the studio's today when left out. A shipment passes its ship date. */
  issueDate?: string
  userId?: number | null
  /** E-mail the invoice to the buyer once the transaction commits (default true). */
  notify?: boolean
  /** Refuse (409 order_not_invoiceable) rather than answer null when the order is not yet due an invoice. */
  required?: boolean
}

type OrderForInvoice = {
  id: number
  number: string
  status: OrderStatus
  shop_id: number
  po_number: string | null
  subtotal_cents: number
  shipping_cents: number
  tax_cents: number
  total_cents: number
  tax_rate_pct: string
  tax_exempt: boolean
  created_at: Date
  payment_terms: PaymentTerms
  legal_name: string
  trading_name: string
  contact_name: string
  contact_email: string
  tax_id: string | null
  billing_address: Address
}

async function existingInvoice(orderId: number, t: Transaction) {
  const [row] = await sequelize.query<{ id: number; number: string }>(
    `SELECT id, number FROM invoices WHERE order_id = $1 AND kind = 'invoice' AND voided_at IS NULL`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction: t },
  )
  return row ?? null
}

/**
 * Raises the invoice of an order inside the caller's transaction, with the next gapless number of
 * its year. Invoices are raised when an order ships, or at confirmation for a prepay account: the
 * orders module calls this from its confirmation transaction for every order, and it answers null
 * (writing nothing) for an order that is not yet due one. A second live invoice for one order is
 * refused with 409 `invoice_exists`. The order row is locked until the transaction ends.
 */
export async function raiseInvoiceForOrder(
  orderId: number,
  transaction: Transaction,
  opts: RaiseOptions = {},
): Promise<InvoiceRef | null> {
  const t = transaction
  const [order] = await sequelize.query<OrderForInvoice>(
    `SELECT o.id, o.number, o.status, o.shop_id, o.po_number, o.subtotal_cents, o.shipping_cents, o.tax_cents,
            o.total_cents, o.tax_rate_pct, o.tax_exempt, o.created_at, s.payment_terms, s.legal_name,
            s.trading_name, s.contact_name, s.contact_email, s.tax_id, s.billing_address
       FROM orders o JOIN shops s ON s.id = o.shop_id
      WHERE o.id = $1
        FOR UPDATE OF o`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction: t },
  )
  if (!order) throw AppError.notFound('That order')
  const prepay = order.payment_terms === 'prepay'
  const due = order.status === 'shipped' || (prepay && PREPAY_INVOICEABLE.includes(order.status))
  if (!due) {
    if (!opts.required) return null
    throw AppError.conflict(
      'order_not_invoiceable',
      prepay
        ? `Order ${order.number} is ${order.status}: a prepay account is invoiced once its order is confirmed.`
        : `Order ${order.number} is ${order.status}: it is invoiced when it ships.`,
      [{ field: 'status', message: `The order is ${order.status}.` }],
    )
  }
  const existing = await existingInvoice(orderId, t)
  if (existing) throw invoiceExists(order.number, existing)

  const issueDate = opts.issueDate ?? (await studioToday(t))
  const terms = order.payment_terms
  const billTo: BillTo = {
    legalName: order.legal_name,
    tradingName: order.trading_name,
    contactName: order.contact_name,
    contactEmail: order.contact_email,
    taxId: order.tax_id,
    lines: formatAddress(order.billing_address),
  }
  const { year, seq, number } = await takeInvoiceNumber(issueDate, t)
  let id: number
  try {
    const [row] = await sequelize.query<{ id: number }>(
      `INSERT INTO invoices (number, year, seq, kind, order_id, shop_id, issue_date, due_date, terms, po_number, bill_to,
                             subtotal_cents, shipping_cents, tax_cents, total_cents, tax_rate_pct, tax_exempt, created_by)
       VALUES ($1, $2, $3, 'invoice', $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17)
       RETURNING id`,
      {
        bind: [
          number,
          year,
          seq,
          order.id,
          order.shop_id,
          issueDate,
          dueDate(issueDate, terms),
          terms,
          order.po_number,
          JSON.stringify(billTo),
          order.subtotal_cents,
          order.shipping_cents,
          order.tax_cents,
          order.total_cents,
          order.tax_rate_pct,
          order.tax_exempt,
          opts.userId ?? null,
        ],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    id = row!.id
  } catch (err) {
    // The lock on the order makes this unreachable for well-behaved writers; the index is the last guard.
    if (isUniqueViolation(err, 'invoices_one_per_order')) {
      throw invoiceExists(order.number, (await existingInvoice(orderId, t)) ?? { id: 0, number: '' })
    }
    throw err
  }
  await sequelize.query(
    `INSERT INTO invoice_lines (invoice_id, order_line_id, sku, description, cases, case_pack, bars, unit_price_cents,
                                line_total_cents, sort_order)
     SELECT $1, l.id, l.sku, l.name, l.cases, l.case_pack, l.bars, l.unit_price_cents, l.line_total_cents,
            row_number() OVER (ORDER BY l.sort_order, l.id)
       FROM order_lines l
      WHERE l.order_id = $2 AND l.removed_at IS NULL`,
    { bind: [id, order.id], transaction: t },
  )
  await audit(
    {
      userId: opts.userId ?? null,
      action: 'invoice.raised',
      entity: 'invoice',
      entityId: id,
      data: { number, orderId },
    },
    t,
  )
  if (opts.notify !== false) await keepMail([{ kind: 'invoice', invoiceId: id, reason: 'issued' }], t)
  return { id, number, orderId, totalCents: order.total_cents }
}

function invoiceExists(orderNumber: string, existing: { id: number; number: string }) {
  return AppError.conflict(
    'invoice_exists',
    `Order ${orderNumber} already has invoice ${existing.number}; void it first to issue another.`,
    [
      {
        field: 'orderId',
        message: `Invoice ${existing.number} exists.`,
        invoiceId: existing.id,
        number: existing.number,
      },
    ],
  )
}

/** `POST /api/orders/:id/invoice`: the owner raises an order's invoice by hand (after a void, say). */
export async function raiseInvoiceByOwner(orderId: number, userId: number): Promise<InvoiceRef> {
  const ref = await sequelize.transaction((t) => raiseInvoiceForOrder(orderId, t, { userId, required: true }))
  return ref!
}

type LockedInvoice = {
  id: number
  number: string
  kind: 'invoice' | 'credit_note'
  order_id: number
  shop_id: number
  paid_cents: number
  voided_at: Date | null
}

async function voidLocked(
  inv: LockedInvoice,
  reason: string,
  userId: number | null,
  t: Transaction,
  notify: boolean,
): Promise<{ invoiceId: number; creditNoteId: number; creditNoteNumber: string }> {
  if (inv.kind === 'credit_note') {
    throw AppError.conflict('not_voidable', `${inv.number} is a credit note; credit notes are not voided.`)
  }
  if (inv.voided_at) throw AppError.conflict('already_void', `Invoice ${inv.number} is already void.`)
  if (inv.paid_cents > 0) {
    throw AppError.conflict(
      'invoice_has_payments',
      `Invoice ${inv.number} has payments recorded against it; it cannot be voided.`,
      [{ field: 'paidCents', message: 'Payments are recorded against this invoice.' }],
    )
  }
  const today = await studioToday(t)
  await sequelize.query(
    'UPDATE invoices SET voided_at = now(), voided_by = $2, void_reason = $3, updated_at = now() WHERE id = $1',
    { bind: [inv.id, userId, reason], transaction: t },
  )
  const { year, seq, number } = await takeInvoiceNumber(today, t)
  const [note] = await sequelize.query<{ id: number }>(
    `INSERT INTO invoices (number, year, seq, kind, order_id, shop_id, credits_invoice_id, issue_date, due_date, terms,
                           po_number, bill_to, subtotal_cents, shipping_cents, tax_cents, total_cents, tax_rate_pct,
                           tax_exempt, created_by)
     SELECT $1, $2, $3, 'credit_note', order_id, shop_id, id, $4, $4, terms, po_number, bill_to, subtotal_cents,
            shipping_cents, tax_cents, total_cents, tax_rate_pct, tax_exempt, $5
       FROM invoices WHERE id = $6
     RETURNING id`,
    { bind: [number, year, seq, today, userId, inv.id], type: QueryTypes.SELECT, transaction: t },
  )
  await sequelize.query(
    `INSERT INTO invoice_lines (invoice_id, order_line_id, sku, description, cases, case_pack, bars, unit_price_cents,
                                line_total_cents, sort_order)
     SELECT $1, order_line_id, sku, description, cases, case_pack, bars, unit_price_cents, line_total_cents, sort_order
       FROM invoice_lines WHERE invoice_id = $2`,
    { bind: [note!.id, inv.id], transaction: t },
  )
  await audit(
    {
      userId,
      action: 'invoice.voided',
      entity: 'invoice',
      entityId: inv.id,
      data: { number: inv.number, reason, creditNote: number },
    },
    t,
  )
  if (notify) await keepMail([{ kind: 'invoice', invoiceId: note!.id, reason: 'credit_note' }], t)
  return { invoiceId: inv.id, creditNoteId: note!.id, creditNoteNumber: number }
}

const LOCK_INVOICE = `SELECT id, number, kind, order_id, shop_id, paid_cents, voided_at FROM invoices WHERE id = $1 FOR UPDATE`

/**
 * Voids an invoice and issues its credit note (same totals, the next number of this year's series)
 * in one transaction. Nothing is deleted or renumbered.
 */
export async function voidInvoice(
  id: number,
  input: VoidInvoiceInput,
  userId: number,
): Promise<{ invoice: InvoiceDto; creditNote: InvoiceDto }> {
  const done = await sequelize.transaction(async (t) => {
    const [inv] = await sequelize.query<LockedInvoice>(LOCK_INVOICE, {
      bind: [id],
      type: QueryTypes.SELECT,
      transaction: t,
    })
    if (!inv) throw AppError.notFound('That invoice')
    return voidLocked(inv, input.reason.trim(), userId, t, true)
  })
  const owner: InvoiceViewer = { role: 'owner', shopId: null }
  return {
    invoice: (await getInvoice(done.invoiceId, owner))!,
    creditNote: (await getInvoice(done.creditNoteId, owner))!,
  }
}

/**
 * For the orders module when it cancels an order: voids the order's live invoice (a prepay
 * account's, raised at confirmation) with a credit note, inside the caller's transaction. Answers
 * null when there is none; refuses with 409 `invoice_has_payments` when money was received.
 */
export async function voidInvoiceForOrder(
  orderId: number,
  reason: string,
  userId: number | null,
  transaction: Transaction,
  opts: { notify?: boolean } = {},
): Promise<{ invoiceId: number; creditNoteId: number; creditNoteNumber: string } | null> {
  const [inv] = await sequelize.query<LockedInvoice>(
    `SELECT id, number, kind, order_id, shop_id, paid_cents, voided_at FROM invoices
      WHERE order_id = $1 AND kind = 'invoice' AND voided_at IS NULL FOR UPDATE`,
    { bind: [orderId], type: QueryTypes.SELECT, transaction },
  )
  if (!inv) return null
  return voidLocked(inv, reason, userId, transaction, opts.notify !== false)
}

export async function getInvoice(id: number, viewer: InvoiceViewer): Promise<InvoiceDto | null> {
  const [today, settings] = await Promise.all([studioToday(), getSettings()])
  return findInvoice(id, viewer, today, settings.currency)
}

/** The invoice or a 404 (also for a buyer asking for another shop's invoice). */
export async function requireInvoice(id: number, viewer: InvoiceViewer): Promise<InvoiceDto> {
  const invoice = await getInvoice(id, viewer)
  if (!invoice) throw AppError.notFound('That invoice')
  return invoice
}

export async function invoiceList(
  viewer: InvoiceViewer,
  filter: InvoiceListQuery,
): Promise<InvoiceListItem[]> {
  return listInvoices(viewer, filter, await studioToday())
}

/** `POST /api/invoices/:id/send`: e-mails the invoice (or credit note) again. */
export async function resendInvoice(id: number, userId: number): Promise<{ sentTo: string[] }> {
  const invoice = await requireInvoice(id, { role: 'owner', shopId: null })
  const sentTo = await sendInvoiceMail(invoice.id, invoice.kind === 'credit_note' ? 'credit_note' : 'resent')
  if (sentTo.length === 0) {
    throw new AppError(
      502,
      'mail_failed',
      'The e-mail could not be sent. Check the mail settings and try again.',
    )
  }
  await audit({ userId, action: 'invoice.sent', entity: 'invoice', entityId: id, data: { to: sentTo } })
  return { sentTo }
}

const dollars = (cents: number) => (cents / 100).toFixed(2)

/** The bookkeeper's export: one row per invoice or credit note, amounts in plain decimals. */
export async function invoicesCsv(filter: InvoiceListQuery): Promise<string> {
  const items = await invoiceList({ role: 'owner', shopId: null }, filter)
  const ids = items.map((i) => i.id)
  const extra = new Map(
    (
      await sequelize.query<{
        id: number
        terms: PaymentTerms
        po_number: string | null
        subtotal_cents: number
        shipping_cents: number
        tax_cents: number
        credits: string | null
        voided_on: string | null
        void_reason: string | null
      }>(
        `SELECT i.id, i.terms, i.po_number, i.subtotal_cents, i.shipping_cents, i.tax_cents, c.number AS credits,
                to_char(i.voided_at, 'YYYY-MM-DD') AS voided_on, i.void_reason
           FROM invoices i LEFT JOIN invoices c ON c.id = i.credits_invoice_id
          WHERE i.id = ANY($1::int[])`,
        { bind: [ids], type: QueryTypes.SELECT },
      )
    ).map((r) => [r.id, r]),
  )
  const header = [
    'Number',
    'Kind',
    'Issue date',
    'Due date',
    'Shop',
    'Order',
    'PO number',
    'Terms',
    'Subtotal',
    'Shipping',
    'Tax',
    'Total',
    'Paid',
    'Outstanding',
    'Status',
    'Credits invoice',
    'Voided on',
    'Void reason',
  ]
  const rows = items.map((i) => {
    const x = extra.get(i.id)!
    return [
      i.number,
      INVOICE_KIND_LABELS[i.kind],
      i.issueDate,
      i.dueDate,
      spreadsheetSafe(i.shopName),
      i.orderNumber,
      spreadsheetSafe(x.po_number ?? ''),
      PAYMENT_TERMS_LABELS[x.terms],
      dollars(x.subtotal_cents),
      dollars(x.shipping_cents),
      dollars(x.tax_cents),
      dollars(i.totalCents),
      dollars(i.paidCents),
      dollars(i.outstandingCents),
      DOCUMENT_STATUS_LABELS[i.status],
      x.credits ?? '',
      x.voided_on ?? '',
      spreadsheetSafe(x.void_reason ?? ''),
    ]
  })
  return toCsv([header, ...rows])
}
