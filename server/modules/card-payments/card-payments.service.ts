import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import type Stripe from 'stripe'
import { outstandingCents } from '@shared/domain/invoices/terms'
import { formatCents } from '@shared/domain/money/money'
import type {
  CardCheckoutDto,
  CardCheckoutStateDto,
  CardCheckoutStatus,
  CardPaymentProblemDto,
  Refund,
  RefundDto,
} from '@shared/schemas/card-payments'
import type { InvoiceDto } from '@shared/schemas/invoices'
import { env } from '@server/config/env'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { logger } from '@server/lib/logger'
import { audit } from '@server/modules/audit/audit.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { amountsOf } from '@server/modules/invoices/invoice-queries'
import { requireInvoice } from '@server/modules/invoices/invoices.service'
import { keepMail } from '@server/modules/mail/outbox'
import { getSettings } from '@server/modules/settings/settings.service'
import { cardProvider, providerError, webhookSecret } from '@server/modules/card-payments/card-provider'

type LockedInvoice = {
  id: number
  number: string
  kind: 'invoice' | 'credit_note'
  shop_id: number
  total_cents: number
  paid_cents: number
  due_date: string
  voided_at: Date | null
}

async function lockInvoice(id: number, t: Transaction): Promise<LockedInvoice | undefined> {
  const [inv] = await sequelize.query<LockedInvoice>(
    `SELECT id, number, kind, shop_id, total_cents, paid_cents, due_date, voided_at
       FROM invoices WHERE id = $1 FOR UPDATE`,
    { bind: [id], type: QueryTypes.SELECT, transaction: t },
  )
  return inv
}

/** The app's own address for the buyer's return from the hosted page. */
function returnUrl(invoiceId: number, outcome: 'paid' | 'cancelled') {
  // The service puts the session id in place of the literal {CHECKOUT_SESSION_ID}.
  return `${env.APP_URL}/shop/invoices/${invoiceId}/card-return?outcome=${outcome}&session={CHECKOUT_SESSION_ID}`
}

/**
 * `POST /api/invoices/:id/card-checkout` (buyer): a hosted checkout session for what the invoice
 * still owes, with the invoice number as the reference. Another shop's invoice is 404; a paid,
 * void or credit-note one is 409 `not_payable`; without a key configured, 503 `card_payments_off`.
 */
export async function createCheckout(
  invoiceId: number,
  viewer: { userId: number; shopId: number },
): Promise<CardCheckoutDto> {
  const stripe = await cardProvider()
  const settings = await getSettings()
  const currency = settings.currency.toLowerCase()
  return sequelize.transaction(async (t) => {
    const inv = await lockInvoice(invoiceId, t)
    if (!inv || inv.shop_id !== viewer.shopId) throw AppError.notFound('That invoice')
    if (inv.kind !== 'invoice' || inv.voided_at) {
      throw AppError.conflict('not_payable', `${inv.number} is not an invoice that can be paid.`)
    }
    const owed = outstandingCents(amountsOf(inv))
    if (owed === 0) throw AppError.conflict('not_payable', `Invoice ${inv.number} is paid in full.`)
    let session: Stripe.Checkout.Session
    try {
      session = await stripe.checkout.sessions.create({
        mode: 'payment',
        client_reference_id: inv.number,
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency,
              unit_amount: owed,
              product_data: {
                name: `Invoice ${inv.number}`,
                description: `${settings.studio.name} wholesale`,
              },
            },
          },
        ],
        metadata: { invoiceId: String(inv.id), invoiceNumber: inv.number },
        payment_intent_data: { metadata: { invoiceId: String(inv.id), invoiceNumber: inv.number } },
        success_url: returnUrl(inv.id, 'paid'),
        cancel_url: returnUrl(inv.id, 'cancelled'),
      })
    } catch (err) {
      throw providerError(err, 'open a checkout')
    }
    if (!session.url) throw providerError(new Error('no page address came back'), 'open a checkout')
    await sequelize.query(
      `INSERT INTO card_checkouts (invoice_id, session_id, amount_cents, currency, created_by)
       VALUES ($1, $2, $3, $4, $5)`,
      { bind: [inv.id, session.id, owed, currency, viewer.userId], transaction: t },
    )
    await audit(
      {
        userId: viewer.userId,
        action: 'card.checkout_opened',
        entity: 'invoice',
        entityId: inv.id,
        data: { sessionId: session.id, amountCents: owed },
      },
      t,
    )
    return { sessionId: session.id, url: session.url, amountCents: owed, currency }
  })
}

/** `GET /api/invoices/:id/card-checkouts/:sessionId` (buyer): the return page polls it. */
export async function checkoutState(
  invoiceId: number,
  sessionId: string,
  shopId: number,
): Promise<CardCheckoutStateDto> {
  const [r] = await sequelize.query<{
    invoice_id: number
    number: string
    status: CardCheckoutStatus
    amount_cents: number
    currency: string
  }>(
    `SELECT c.invoice_id, i.number, c.status, c.amount_cents, c.currency
       FROM card_checkouts c JOIN invoices i ON i.id = c.invoice_id
      WHERE c.session_id = $1 AND c.invoice_id = $2 AND i.shop_id = $3`,
    { bind: [sessionId, invoiceId, shopId], type: QueryTypes.SELECT },
  )
  if (!r) throw AppError.notFound('That card payment')
  return {
    sessionId,
    invoiceId: r.invoice_id,
    invoiceNumber: r.number,
    status: r.status,
    amountCents: r.amount_cents,
    currency: r.currency,
  }
}

export type WebhookResult = { received: true; duplicate: boolean; outcome: 'payment' | 'problem' | 'ignored' }

/**
 * `POST /api/webhooks/card`: the service's signed event. The signature is checked by the SDK on
 * the raw body (400 `signature_invalid` otherwise, nothing written). The event id is stored with a
 * unique constraint in the same transaction that records the payment, so a second delivery of the
 * same event answers 200 and records nothing. A completed checkout whose amount or currency is not
 * what was asked, or that is more than the invoice still owes, becomes a problem for the owner.
 */
export async function handleWebhook(raw: unknown, signature: string | undefined): Promise<WebhookResult> {
  const secret = await webhookSecret()
  if (!signature)
    throw AppError.field('stripe-signature', 'The signature header is missing.', 400, 'signature_missing')
  if (!Buffer.isBuffer(raw) || raw.length === 0) {
    throw AppError.field('body', 'The event body is missing or not JSON.', 400, 'signature_invalid')
  }
  let event: Stripe.Event
  try {
    event = (await cardProvider()).webhooks.constructEvent(raw, signature, secret)
  } catch (err) {
    throw AppError.field(
      'stripe-signature',
      `The signature does not match this event: ${(err as Error).message.split('.')[0]}.`,
      400,
      'signature_invalid',
    )
  }

  const result = await sequelize.transaction(async (t): Promise<WebhookResult> => {
    const [inserted] = await sequelize.query<{ id: number }>(
      `INSERT INTO card_events (event_id, type, outcome) VALUES ($1, $2, 'ignored')
       ON CONFLICT (event_id) DO NOTHING RETURNING id`,
      { bind: [event.id, event.type], type: QueryTypes.SELECT, transaction: t },
    )
    if (!inserted) return { received: true, duplicate: true, outcome: 'ignored' }
    if (event.type !== 'checkout.session.completed')
      return { received: true, duplicate: false, outcome: 'ignored' }
    const session = event.data.object
    if (session.payment_status !== 'paid') return { received: true, duplicate: false, outcome: 'ignored' }
    const outcome = await recordCompletedCheckout(event.id, session, t)
    await sequelize.query('UPDATE card_events SET outcome = $2 WHERE event_id = $1', {
      bind: [event.id, outcome.kind],
      transaction: t,
    })
    if (outcome.kind === 'payment') {
      const { invoiceId, amountCents, reference, paidOn } = outcome
      await keepMail([{ kind: 'card_receipt', invoiceId, amountCents, reference, paidOn }], t)
    }
    return { received: true, duplicate: false, outcome: outcome.kind }
  })
  return result
}

type Outcome =
  | { kind: 'payment'; invoiceId: number; amountCents: number; reference: string; paidOn: string }
  | { kind: 'problem' }

async function recordCompletedCheckout(
  eventId: string,
  session: Stripe.Checkout.Session,
  t: Transaction,
): Promise<Outcome> {
  const receivedCents = session.amount_total ?? 0
  const receivedCurrency = (session.currency ?? '').toLowerCase()
  const paymentIntentId =
    typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null)
  const [checkout] = await sequelize.query<{
    id: number
    invoice_id: number
    amount_cents: number
    currency: string
    status: CardCheckoutStatus
  }>(
    'SELECT id, invoice_id, amount_cents, currency, status FROM card_checkouts WHERE session_id = $1 FOR UPDATE',
    { bind: [session.id], type: QueryTypes.SELECT, transaction: t },
  )
  const problem = async (message: string, inv?: { id: number }) => {
    await sequelize.query(
      `INSERT INTO card_payment_problems (invoice_id, checkout_id, event_id, session_id, payment_intent_id,
         expected_cents, expected_currency, received_cents, received_currency, message)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10)`,
      {
        bind: [
          inv?.id ?? checkout?.invoice_id ?? null,
          checkout?.id ?? null,
          eventId,
          session.id,
          paymentIntentId,
          checkout?.amount_cents ?? null,
          checkout?.currency ?? null,
          receivedCents,
          receivedCurrency || '—',
          message,
        ],
        transaction: t,
      },
    )
    if (checkout) {
      await sequelize.query(
        `UPDATE card_checkouts SET status = 'problem', completed_at = now() WHERE id = $1`,
        {
          bind: [checkout.id],
          transaction: t,
        },
      )
    }
    logger.warn('card payment not recorded', { eventId, sessionId: session.id, message })
    return { kind: 'problem' as const }
  }

  if (!checkout)
    return problem('The card service reported a payment for a checkout this studio did not open.')
  if (checkout.status !== 'open')
    return problem('This checkout was already settled; a second payment came for it.')
  if (!paymentIntentId) return problem('The card service named no payment for this checkout.')
  const money = (c: number, cur: string) => `${(c / 100).toFixed(2)} ${cur.toUpperCase()}`
  if (receivedCurrency !== checkout.currency || receivedCents !== checkout.amount_cents) {
    return problem(
      `The card service reported ${money(receivedCents, receivedCurrency || '???')}, but ${money(checkout.amount_cents, checkout.currency)} was asked.`,
    )
  }
  const inv = await lockInvoice(checkout.invoice_id, t)
  if (!inv || inv.kind !== 'invoice' || inv.voided_at)
    return problem('The invoice is void: the money was not recorded.')
  const owed = outstandingCents(amountsOf(inv))
  if (receivedCents > owed) {
    return problem(
      `Invoice ${inv.number} now owes ${money(owed, checkout.currency)} (paid in the meantime); ${money(receivedCents, receivedCurrency)} came by card. Refund the difference with the card service.`,
    )
  }
  const paidOn = await studioToday()
  const reference = paymentIntentId.slice(0, 80)
  const [payment] = await sequelize.query<{ id: number }>(
    `INSERT INTO payments (invoice_id, method, amount_cents, received_on, reference, recorded_by)
     VALUES ($1, 'card', $2, $3, $4, NULL) RETURNING id`,
    { bind: [inv.id, receivedCents, paidOn, reference], type: QueryTypes.SELECT, transaction: t },
  )
  await sequelize.query(
    `INSERT INTO card_payments (payment_id, checkout_id, payment_intent_id, event_id, currency)
     VALUES ($1, $2, $3, $4, $5)`,
    { bind: [payment!.id, checkout.id, paymentIntentId, eventId, receivedCurrency], transaction: t },
  )
  await sequelize.query(`UPDATE card_checkouts SET status = 'paid', completed_at = now() WHERE id = $1`, {
    bind: [checkout.id],
    transaction: t,
  })
  await audit(
    {
      userId: null,
      action: 'payment.recorded',
      entity: 'invoice',
      entityId: inv.id,
      data: { paymentId: payment!.id, amountCents: receivedCents, method: 'card', eventId },
    },
    t,
  )
  return { kind: 'payment', invoiceId: inv.id, amountCents: receivedCents, reference, paidOn }
}

/**
 * `POST /api/payments/:id/refunds` (owner): gives back all or part of a card payment through the
 * service. The invoice row is locked while the service is asked, so two refunds of one payment
 * queue and the second sees what the first took; more than was paid less refunded is 422
 * `refund_too_large` on amountCents. The refund trigger takes the amount off paid_cents.
 */
export async function refundPayment(
  paymentId: number,
  input: Refund,
  userId: number,
): Promise<{ refund: RefundDto; invoice: InvoiceDto }> {
  const [payment] = await sequelize.query<{
    id: number
    invoice_id: number
    method: string
    amount_cents: number
    payment_intent_id: string | null
    currency: string | null
  }>(
    `SELECT p.id, p.invoice_id, p.method, p.amount_cents, cp.payment_intent_id, cp.currency
       FROM payments p LEFT JOIN card_payments cp ON cp.payment_id = p.id WHERE p.id = $1`,
    { bind: [paymentId], type: QueryTypes.SELECT },
  )
  if (!payment) throw AppError.notFound('That payment')
  if (!payment.payment_intent_id) {
    throw AppError.conflict(
      'not_refundable',
      'Only card payments taken through the card service can be refunded here; give other money back outside Lathercase.',
    )
  }
  const stripe = await cardProvider()
  const refunded = await sequelize.transaction(async (t) => {
    const inv = await lockInvoice(payment.invoice_id, t)
    if (!inv) throw AppError.notFound('That payment')
    const [{ sum }] = (await sequelize.query<{ sum: number }>(
      'SELECT coalesce(sum(amount_cents), 0)::int AS sum FROM payment_refunds WHERE payment_id = $1',
      { bind: [paymentId], type: QueryTypes.SELECT, transaction: t },
    )) as [{ sum: number }]
    const left = payment.amount_cents - sum
    if (input.amountCents > left) {
      const cur = payment.currency!.toUpperCase()
      const message =
        left === 0
          ? 'This payment is refunded in full already.'
          : `At most ${formatCents(left, cur)} of this payment can be refunded (${formatCents(payment.amount_cents, cur)} paid, ${formatCents(sum, cur)} refunded).`
      throw AppError.unprocessable('refund_too_large', message, [
        { field: 'amountCents', message, refundableCents: left },
      ])
    }
    let refund: Stripe.Refund
    try {
      refund = await stripe.refunds.create(
        {
          payment_intent: payment.payment_intent_id!,
          amount: input.amountCents,
          metadata: { paymentId: String(paymentId), invoiceNumber: inv.number },
        },
        // The same request again (a retry after a lost answer) is the same refund at the service.
        { idempotencyKey: `lathercase-refund-${paymentId}-${sum}-${input.amountCents}` },
      )
    } catch (err) {
      throw providerError(err, 'refund the payment')
    }
    const refundedOn = await studioToday()
    const [row] = await sequelize.query<{ id: number }>(
      `INSERT INTO payment_refunds (payment_id, amount_cents, provider_refund_id, reason, refunded_on, created_by)
       VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
      {
        bind: [paymentId, input.amountCents, refund.id, input.reason, refundedOn, userId],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    await audit(
      {
        userId,
        action: 'payment.refunded',
        entity: 'invoice',
        entityId: inv.id,
        data: { paymentId, refundId: row!.id, amountCents: input.amountCents, providerRefundId: refund.id },
      },
      t,
    )
    await keepMail(
      [{ kind: 'card_refund', invoiceId: inv.id, amountCents: input.amountCents, reference: refund.id }],
      t,
    )
    return { id: row!.id, providerRefundId: refund.id }
  })
  const [refund] = await listRefunds({ refundId: refunded.id })
  const invoice = await requireInvoice(payment.invoice_id, { role: 'owner', shopId: null })
  return { refund: refund!, invoice }
}

export type RefundRow = RefundDto & {
  invoiceNumber: string
  orderNumber: string
  shopName: string
  createdAt: string
}

/** Refunds, newest first; the payments CSV lists them as negative rows. */
export async function listRefunds(
  filter: {
    refundId?: number
    paymentId?: number
    invoiceId?: number
    shopId?: number
    from?: string
    to?: string
  } = {},
): Promise<RefundRow[]> {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(`$${bind.length}`))
  }
  if (filter.refundId) add((n) => `r.id = ${n}`, filter.refundId)
  if (filter.paymentId) add((n) => `r.payment_id = ${n}`, filter.paymentId)
  if (filter.invoiceId) add((n) => `p.invoice_id = ${n}`, filter.invoiceId)
  if (filter.shopId) add((n) => `i.shop_id = ${n}`, filter.shopId)
  if (filter.from) add((n) => `r.refunded_on >= ${n}::date`, filter.from)
  if (filter.to) add((n) => `r.refunded_on <= ${n}::date`, filter.to)
  const rows = await sequelize.query<{
    id: number
    payment_id: number
    invoice_id: number
    amount_cents: number
    provider_refund_id: string
    reason: string | null
    refunded_on: string
    created_by: string | null
    invoice_number: string
    order_number: string
    shop_name: string
    created_at: Date
  }>(
    `SELECT r.id, r.payment_id, p.invoice_id, r.amount_cents, r.provider_refund_id, r.reason, r.refunded_on,
            u.name AS created_by, i.number AS invoice_number, o.number AS order_number,
            s.trading_name AS shop_name, r.created_at
       FROM payment_refunds r
       JOIN payments p ON p.id = r.payment_id
       JOIN invoices i ON i.id = p.invoice_id
       JOIN orders o ON o.id = i.order_id
       JOIN shops s ON s.id = i.shop_id
       LEFT JOIN users u ON u.id = r.created_by
      ${where.length ? `WHERE ${where.join(' AND ')}` : ''}
      ORDER BY r.refunded_on DESC, r.id DESC`,
    { bind, type: QueryTypes.SELECT },
  )
  return rows.map((r) => ({
    id: r.id,
    paymentId: r.payment_id,
    invoiceId: r.invoice_id,
    amountCents: r.amount_cents,
    providerRefundId: r.provider_refund_id,
    reason: r.reason,
    refundedOn: r.refunded_on,
    createdBy: r.created_by,
    invoiceNumber: r.invoice_number,
    orderNumber: r.order_number,
    shopName: r.shop_name,
    createdAt: r.created_at.toISOString(),
  }))
}

/** `GET /api/card-payments/problems` (owner): completed card payments not recorded, not yet dismissed. */
export async function listProblems(): Promise<CardPaymentProblemDto[]> {
  const rows = await sequelize.query<{
    id: number
    invoice_id: number | null
    invoice_number: string | null
    shop_name: string | null
    session_id: string
    payment_intent_id: string | null
    expected_cents: number | null
    expected_currency: string | null
    received_cents: number
    received_currency: string
    message: string
    created_at: Date
  }>(
    `SELECT pr.id, pr.invoice_id, i.number AS invoice_number, s.trading_name AS shop_name, pr.session_id,
            pr.payment_intent_id, pr.expected_cents, pr.expected_currency, pr.received_cents,
            pr.received_currency, pr.message, pr.created_at
       FROM card_payment_problems pr
       LEFT JOIN invoices i ON i.id = pr.invoice_id
       LEFT JOIN shops s ON s.id = i.shop_id
      WHERE pr.dismissed_at IS NULL
      ORDER BY pr.created_at DESC, pr.id DESC`,
    { type: QueryTypes.SELECT },
  )
  return rows.map((r) => ({
    id: r.id,
    invoiceId: r.invoice_id,
    invoiceNumber: r.invoice_number,
    shopName: r.shop_name,
    sessionId: r.session_id,
    paymentIntentId: r.payment_intent_id,
    expectedCents: r.expected_cents,
    expectedCurrency: r.expected_currency,
    receivedCents: r.received_cents,
    receivedCurrency: r.received_currency,
    message: r.message,
    createdAt: r.created_at.toISOString(),
  }))
}

/** `POST /api/card-payments/problems/:id/dismiss` (owner): the owner has dealt with it. */
export async function dismissProblem(id: number, userId: number): Promise<void> {
  const [rows] = await sequelize.query(
    `UPDATE card_payment_problems SET dismissed_at = now(), dismissed_by = $2
      WHERE id = $1 AND dismissed_at IS NULL RETURNING id`,
    { bind: [id, userId] },
  )
  if ((rows as unknown[]).length === 0) throw AppError.notFound('That card payment problem')
  await audit({ userId, action: 'card.problem_dismissed', entity: 'card_payment_problem', entityId: id })
}
