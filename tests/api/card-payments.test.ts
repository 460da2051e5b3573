/**
 * Paying an invoice by card through the hosted card-payment service, against the local fake of it
 * (tests/setup/services.ts starts it; the SDK reaches it through CARD_API_HOST/PORT/PROTOCOL): the
 * checkout, the hosted page paying or declining, the signed webhook (forged and unsigned refused,
 * the same event twice recorded once, a mismatched amount or currency kept as a problem), the
 * receipt e-mail, and refunds whole and partial with the payments CSV.
 */
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { QueryTypes } from 'sequelize'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inject } from 'vitest'
import { createApp } from '@server/app'
import { env } from '@server/config/env'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { mailQueueIdle } from '@server/modules/invoices/mail-queue'
import { parseCsv } from '@shared/domain/csv/csv'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { waitForMail } from '@tests/factories/mail'
import { expectStatus } from '@tests/factories/responses'
import { makeOrder, makeSellable } from '@tests/factories/fulfilment'
import type { Sellable, ShopKey } from '@tests/factories/fulfilment'
import { TEST_CARDS } from '../../scripts/lib/card-service-fake'

const services = inject('services')
const app = createApp({ pruneSessions: false })
let server: Server
let stripe: Stripe
let owner: ApiClient
let buyerA: ApiClient
let buyerB: ApiClient
let packer: ApiClient
let anon: ApiClient
let soap: Sellable

async function shippedInvoice(shop: ShopKey, cases = 2) {
  const o = await makeOrder({
    shop,
    lines: [{ productId: soap.productId, cases }],
    status: 'shipped',
    notify: false,
  })
  const [inv] = await sequelize.query<{ id: number; number: string; total_cents: number }>(
    `SELECT id, number, total_cents FROM invoices WHERE order_id = $1 AND kind = 'invoice'`,
    { bind: [o.orderId], type: QueryTypes.SELECT },
  )
  return { invoiceId: inv!.id, invoiceNumber: inv!.number, totalCents: inv!.total_cents }
}

const count = async (sql: string, bind: unknown[] = []) =>
  (
    await sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${sql}`, {
      bind,
      type: QueryTypes.SELECT,
    })
  )[0]!.n

/** Submits the hosted checkout page's form as a browser would; answers the status and the redirect. */
async function submitCard(pageUrl: string, number: string) {
  const r = await fetch(pageUrl, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ name: 'Priya Natarajan', number, expiry: '12/39', cvc: '123' }),
  })
  return { status: r.status, location: r.headers.get('location'), text: await r.text() }
}

async function openCheckout(who: ApiClient, invoiceId: number) {
  return expectStatus(await who.post(`/api/invoices/${invoiceId}/card-checkout`, {}), 201).body.checkout as {
    sessionId: string
    url: string
    amountCents: number
    currency: string
  }
}

/** A checkout paid on the hosted page with the test card that pays. */
async function payByCard(invoiceId: number) {
  const checkout = await openCheckout(buyerA, invoiceId)
  const paid = await submitCard(checkout.url, TEST_CARDS.pays)
  expect(paid.status).toBe(303)
  return { checkout, location: paid.location! }
}

const invoiceOf = async (who: ApiClient, id: number) =>
  expectStatus(await who.get(`/api/invoices/${id}`), 200).body.invoice as {
    status: string
    paidCents: number
    totalCents: number
    outstandingCents: number
    payments: {
      id: number
      method: string
      amountCents: number
      refundedCents: number
      refundable: boolean
      reference: string
    }[]
  }

/** A checkout.session.completed event of our own making, signed with the webhook secret. */
function signedEvent(session: Record<string, unknown>, secret = services.cardWebhookSecret) {
  const payload = JSON.stringify({
    id: `evt_test_${Math.random().toString(36).slice(2)}`,
    object: 'event',
    type: 'checkout.session.completed',
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    data: { object: { object: 'checkout.session', payment_status: 'paid', status: 'complete', ...session } },
  })
  return { payload, header: stripe.webhooks.generateTestHeaderString({ payload, secret }) }
}

beforeAll(async () => {
  server = app.listen(0, '127.0.0.1')
  await new Promise((r) => server.once('listening', r))
  const port = (server.address() as AddressInfo).port
  stripe = new Stripe(env.CARD_SECRET_KEY!, { host: '127.0.0.1', port: services.cardPort, protocol: 'http' })
  // This file's key gets this file's app as its webhook endpoint, as the service's dashboard would.
  await stripe.webhookEndpoints.create({
    url: `http://127.0.0.1:${port}/api/webhooks/card`,
    enabled_events: ['checkout.session.completed'],
  })
  ;[owner, buyerA, buyerB, packer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'buyerB'),
    clientAs(app, 'packer'),
    clientAs(app, 'anon'),
  ])
  soap = await makeSellable(owner, { bars: 900, unitPriceCents: 1500 })
})

afterAll(async () => {
  await mailQueueIdle()
  await new Promise((r) => server.close(r))
})

describe('paying an invoice by card', () => {
  it('from the checkout through the hosted page to the invoice marked paid, with a receipt', async () => {
    const inv = await shippedInvoice('A')
    expect(expectStatus(await buyerA.get('/api/card-payments/status'), 200).body).toEqual({ enabled: true })
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    expect(checkout.url.startsWith(`${services.cardUrl}/checkout/`)).toBe(true)
    expect(checkout).toMatchObject({ amountCents: inv.totalCents, currency: 'usd' })

    // The session the service holds: the amount owed, the invoice number as reference, both return URLs.
    const session = await stripe.checkout.sessions.retrieve(checkout.sessionId)
    expect(session).toMatchObject({
      amount_total: inv.totalCents,
      currency: 'usd',
      client_reference_id: inv.invoiceNumber,
      status: 'open',
    })
    expect(session.success_url).toBe(
      `${env.APP_URL}/shop/invoices/${inv.invoiceId}/card-return?outcome=paid&session={CHECKOUT_SESSION_ID}`,
    )
    expect(session.cancel_url).toContain(`/shop/invoices/${inv.invoiceId}/card-return?outcome=cancelled`)

    const page = await fetch(checkout.url)
    expect(page.status).toBe(200)
    const html = await page.text()
    expect(html).toContain(inv.invoiceNumber)
    expect(html).toContain(`$${(inv.totalCents / 100).toFixed(2)}`)
    expect(html).toMatch(/<input id="number" name="number"/)

    const paid = await submitCard(checkout.url, '4242 4242 4242 4242')
    expect(paid.status).toBe(303)
    expect(paid.location).toBe(
      `${env.APP_URL}/shop/invoices/${inv.invoiceId}/card-return?outcome=paid&session=${checkout.sessionId}`,
    )

    const after = await invoiceOf(buyerA, inv.invoiceId)
    expect(after).toMatchObject({ status: 'paid', paidCents: inv.totalCents, outstandingCents: 0 })
    expect(after.payments).toHaveLength(1)
    expect(after.payments[0]).toMatchObject({ method: 'card', amountCents: inv.totalCents, refundedCents: 0 })
    expect(after.payments[0]!.reference).toMatch(/^pi_test_/)
    const state = expectStatus(
      await buyerA.get(`/api/invoices/${inv.invoiceId}/card-checkouts/${checkout.sessionId}`),
      200,
    )
    expect(state.body.checkout).toMatchObject({ status: 'paid', invoiceNumber: inv.invoiceNumber })

    const mail = await waitForMail(
      'priya@junipervine.test',
      new RegExp(`Receipt: .* invoice ${inv.invoiceNumber}`),
    )
    expect(mail.text).toContain('Still owed: nothing, the invoice is paid')
    expect(mail.text).toContain(after.payments[0]!.reference)

    // Paid in full: nothing more to pay, by card or otherwise.
    const again = expectStatus(await buyerA.post(`/api/invoices/${inv.invoiceId}/card-checkout`, {}), 409)
    expect(again.body.error.code).toBe('not_payable')
  })

  it('a declined card leaves the invoice open and the page offers another try', async () => {
    const inv = await shippedInvoice('A')
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    const events = await count('card_events')
    const declined = await submitCard(checkout.url, TEST_CARDS.declined)
    expect(declined.status).toBe(402)
    expect(declined.text).toContain('Your card was declined')
    expect(declined.text).toMatch(/<form method="post"/)
    const bad = await submitCard(checkout.url, '4242 4242 4242 4241')
    expect(bad.status).toBe(400)
    expect(bad.text).toContain('not valid')

    expect(await count('card_events')).toBe(events)
    const after = await invoiceOf(buyerA, inv.invoiceId)
    expect(after).toMatchObject({ status: 'open', paidCents: 0, payments: [] })
    const state = expectStatus(
      await buyerA.get(`/api/invoices/${inv.invoiceId}/card-checkouts/${checkout.sessionId}`),
      200,
    )
    expect(state.body.checkout.status).toBe('open')
    expect((await stripe.checkout.sessions.retrieve(checkout.sessionId)).status).toBe('open')
  })

  it('refuses another shop, staff, signed-out callers, credit notes and unknown checkouts', async () => {
    const inv = await shippedInvoice('A')
    expect(
      expectStatus(await buyerB.post(`/api/invoices/${inv.invoiceId}/card-checkout`, {}), 404).body.error
        .code,
    ).toBe('not_found')
    expectStatus(await owner.post(`/api/invoices/${inv.invoiceId}/card-checkout`, {}), 403)
    expectStatus(await packer.post(`/api/invoices/${inv.invoiceId}/card-checkout`, {}), 403)
    expectStatus(await anon.post(`/api/invoices/${inv.invoiceId}/card-checkout`, {}), 401)
    expectStatus(await anon.get('/api/card-payments/status'), 401)
    const bad = expectStatus(await buyerA.post('/api/invoices/abc/card-checkout', {}), 400)
    expect(bad.body.error.details[0].field).toBe('params.id')
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    expectStatus(await buyerB.get(`/api/invoices/${inv.invoiceId}/card-checkouts/${checkout.sessionId}`), 404)
    expectStatus(await buyerA.get(`/api/invoices/${inv.invoiceId}/card-checkouts/cs_test_nothing`), 404)
    expect(
      expectStatus(await buyerA.get(`/api/invoices/${inv.invoiceId}/card-checkouts/not-a-session!`), 400).body
        .error.details[0].field,
    ).toBe('params.sessionId')
  })

  it('answers 503 and hides the action while no card key is configured', async () => {
    const inv = await shippedInvoice('A')
    const saved = env.CARD_SECRET_KEY
    env.CARD_SECRET_KEY = undefined
    try {
      expect(expectStatus(await buyerA.get('/api/card-payments/status'), 200).body).toEqual({
        enabled: false,
      })
      const off = expectStatus(await buyerA.post(`/api/invoices/${inv.invoiceId}/card-checkout`, {}), 503)
      expect(off.body.error.code).toBe('card_payments_off')
      expect(await count('card_checkouts WHERE invoice_id = $1', [inv.invoiceId])).toBe(0)
    } finally {
      env.CARD_SECRET_KEY = saved
    }
  })
})

describe('POST /api/webhooks/card', () => {
  it('refuses an unsigned, a forged and a tampered event with 400 and writes nothing', async () => {
    const inv = await shippedInvoice('A')
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    const session = {
      id: checkout.sessionId,
      amount_total: checkout.amountCents,
      currency: 'usd',
      payment_intent: 'pi_test_forged',
    }
    const before = { events: await count('card_events'), payments: await count('payments') }
    const post = (body: string, signature?: string) => {
      const r = anon.agent.post('/api/webhooks/card').set('content-type', 'application/json')
      return (signature ? r.set('stripe-signature', signature) : r).send(body)
    }

    const good = signedEvent(session)
    const unsigned = expectStatus(await post(good.payload), 400)
    expect(unsigned.body.error).toMatchObject({
      code: 'signature_missing',
      details: [{ field: 'stripe-signature' }],
    })
    const forged = signedEvent(session, 'whsec_someone_else_entirely')
    expect(expectStatus(await post(forged.payload, forged.header), 400).body.error.code).toBe(
      'signature_invalid',
    )
    const tampered = good.payload.replace(`"amount_total":${checkout.amountCents}`, '"amount_total":1')
    expect(expectStatus(await post(tampered, good.header), 400).body.error.code).toBe('signature_invalid')
    expect(expectStatus(await post(good.payload, 't=1,v1=deadbeef'), 400).body.error.code).toBe(
      'signature_invalid',
    )

    expect(await count('card_events')).toBe(before.events)
    expect(await count('payments')).toBe(before.payments)
    expect((await invoiceOf(owner, inv.invoiceId)).paidCents).toBe(0)
  })

  it('records one payment when the service delivers the same event twice', async () => {
    const inv = await shippedInvoice('A')
    const { checkout } = await payByCard(inv.invoiceId)
    const events = await stripe.events.list({ type: 'checkout.session.completed' })
    const event = events.data.find((e) => (e.data.object as { id: string }).id === checkout.sessionId)!
    expect(event).toBeDefined()

    const r = await fetch(`${services.cardUrl}/fake/events/${event.id}/redeliver`, { method: 'POST' })
    const redelivered = (await r.json()) as { deliveries: { status: number }[] }
    expect(redelivered.deliveries.map((d) => d.status)).toEqual([200])
    // And the same event posted straight at the endpoint, signed afresh.
    const payload = JSON.stringify(event)
    const direct = await anon.agent
      .post('/api/webhooks/card')
      .set('content-type', 'application/json')
      .set(
        'stripe-signature',
        stripe.webhooks.generateTestHeaderString({ payload, secret: services.cardWebhookSecret }),
      )
      .send(payload)
    expect(expectStatus(direct, 200).body).toEqual({ received: true, duplicate: true, outcome: 'ignored' })

    const after = await invoiceOf(owner, inv.invoiceId)
    expect(after.payments).toHaveLength(1)
    expect(after.paidCents).toBe(inv.totalCents)
    expect(await count('card_events WHERE event_id = $1', [event.id])).toBe(1)
  })

  it('records one payment when the same event arrives twice at once', async () => {
    const inv = await shippedInvoice('A')
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    const e = signedEvent({
      id: checkout.sessionId,
      amount_total: checkout.amountCents,
      currency: 'usd',
      payment_intent: `pi_test_race_${inv.invoiceId}`,
    })
    const post = () =>
      anon.agent
        .post('/api/webhooks/card')
        .set('content-type', 'application/json')
        .set('stripe-signature', e.header)
        .send(e.payload)
    const answers = await Promise.all([post(), post(), post()])
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200])
    expect(answers.filter((a) => a.body.duplicate === false)).toHaveLength(1)
    const after = await invoiceOf(owner, inv.invoiceId)
    expect(after.payments).toHaveLength(1)
    expect(after.status).toBe('paid')
  })

  it('does not overpay an invoice settled by transfer while the buyer was on the card page', async () => {
    const inv = await shippedInvoice('A')
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    expectStatus(
      await owner.post(`/api/invoices/${inv.invoiceId}/payments`, {
        method: 'bank_transfer',
        amountCents: inv.totalCents,
        receivedOn: await studioToday(),
      }),
      201,
    )
    const paid = await submitCard(checkout.url, TEST_CARDS.pays)
    expect(paid.status).toBe(303)
    const after = await invoiceOf(owner, inv.invoiceId)
    expect(after.payments.map((p) => p.method)).toEqual(['bank_transfer'])
    expect(after.paidCents).toBe(inv.totalCents)
    const problems = expectStatus(await owner.get('/api/card-payments/problems'), 200).body.items as {
      invoiceNumber: string | null
      message: string
    }[]
    expect(problems.find((p) => p.invoiceNumber === inv.invoiceNumber)?.message).toMatch(
      /paid in the meantime/,
    )
  })

  it('keeps a mismatched amount or currency as a problem for the owner, not a payment', async () => {
    const inv = await shippedInvoice('A')
    const checkout = await openCheckout(buyerA, inv.invoiceId)
    const send = async (session: Record<string, unknown>) => {
      const e = signedEvent(session)
      return anon.agent
        .post('/api/webhooks/card')
        .set('content-type', 'application/json')
        .set('stripe-signature', e.header)
        .send(e.payload)
    }
    const short = await send({
      id: checkout.sessionId,
      amount_total: 100,
      currency: 'usd',
      payment_intent: 'pi_test_short',
    })
    expect(expectStatus(short, 200).body).toMatchObject({ duplicate: false, outcome: 'problem' })
    const inv2 = await shippedInvoice('A')
    const checkout2 = await openCheckout(buyerA, inv2.invoiceId)
    const euros = await send({
      id: checkout2.sessionId,
      amount_total: checkout2.amountCents,
      currency: 'eur',
      payment_intent: 'pi_test_euros',
    })
    expect(expectStatus(euros, 200).body.outcome).toBe('problem')
    const stranger = await send({
      id: 'cs_test_not_ours',
      amount_total: 500,
      currency: 'usd',
      payment_intent: 'pi_test_x',
    })
    expect(expectStatus(stranger, 200).body.outcome).toBe('problem')

    expect((await invoiceOf(owner, inv.invoiceId)).payments).toEqual([])
    expect((await invoiceOf(owner, inv2.invoiceId)).payments).toEqual([])
    const list = expectStatus(await owner.get('/api/card-payments/problems'), 200).body.items as {
      id: number
      invoiceNumber: string | null
      receivedCents: number
      receivedCurrency: string
      expectedCents: number | null
      message: string
    }[]
    const mine = list.find((p) => p.invoiceNumber === inv.invoiceNumber)!
    expect(mine).toMatchObject({
      receivedCents: 100,
      receivedCurrency: 'usd',
      expectedCents: checkout.amountCents,
    })
    expect(mine.message).toContain('1.00 USD')
    expect(list.find((p) => p.invoiceNumber === inv2.invoiceNumber)).toMatchObject({
      receivedCurrency: 'eur',
    })
    expect(list.some((p) => p.invoiceNumber === null && p.message.includes('did not open'))).toBe(true)
    const state = expectStatus(
      await buyerA.get(`/api/invoices/${inv.invoiceId}/card-checkouts/${checkout.sessionId}`),
      200,
    )
    expect(state.body.checkout.status).toBe('problem')

    expectStatus(await buyerA.get('/api/card-payments/problems'), 403)
    expectStatus(await buyerA.post(`/api/card-payments/problems/${mine.id}/dismiss`, {}), 403)
    expectStatus(await owner.post(`/api/card-payments/problems/${mine.id}/dismiss`, {}), 204)
    expectStatus(await owner.post(`/api/card-payments/problems/${mine.id}/dismiss`, {}), 404)
    expect(
      expectStatus(await owner.post('/api/card-payments/problems/x/dismiss', {}), 400).body.error.details[0]
        .field,
    ).toBe('params.id')
    const left = expectStatus(await owner.get('/api/card-payments/problems'), 200).body.items as {
      id: number
    }[]
    expect(left.some((p) => p.id === mine.id)).toBe(false)
  })
})

describe('POST /api/payments/:id/refunds', () => {
  it('refunds part, refuses more than is left, then the rest; the invoice and the CSV follow', async () => {
    const inv = await shippedInvoice('A')
    await payByCard(inv.invoiceId)
    const paid = await invoiceOf(owner, inv.invoiceId)
    const payment = paid.payments[0]!
    expect(payment.refundable).toBe(true)

    const part = expectStatus(
      await owner.post(`/api/payments/${payment.id}/refunds`, {
        amountCents: 1000,
        reason: 'Two bars arrived cracked',
      }),
      201,
    )
    expect(part.body.refund).toMatchObject({
      amountCents: 1000,
      paymentId: payment.id,
      reason: 'Two bars arrived cracked',
    })
    expect(part.body.refund.providerRefundId).toMatch(/^re_test_/)
    expect(part.body.invoice).toMatchObject({
      status: 'part_paid',
      paidCents: inv.totalCents - 1000,
      outstandingCents: 1000,
    })
    expect(part.body.invoice.payments[0]).toMatchObject({ refundedCents: 1000, amountCents: inv.totalCents })
    await waitForMail(
      'priya@junipervine.test',
      new RegExp(`Refund: \\$10\\.00 .* invoice ${inv.invoiceNumber}`),
    )

    const tooMuch = expectStatus(
      await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: inv.totalCents - 999 }),
      422,
    )
    expect(tooMuch.body.error).toMatchObject({
      code: 'refund_too_large',
      details: [{ field: 'amountCents' }],
    })
    const invalid = expectStatus(
      await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: -5 }),
      400,
    )
    expect(invalid.body.error.details[0].field).toBe('amountCents')
    expectStatus(await buyerA.post(`/api/payments/${payment.id}/refunds`, { amountCents: 100 }), 403)
    expectStatus(await owner.post('/api/payments/999999/refunds', { amountCents: 100 }), 404)
    expect(await count('payment_refunds WHERE payment_id = $1', [payment.id])).toBe(1)

    const csv = expectStatus(await owner.get(`/api/payments.csv?invoiceId=${inv.invoiceId}`), 200)
    const rows = parseCsv(csv.text).map((x) => x.fields)
    const refundRow = rows.find((r) => r[4] === 'Card refund')!
    expect(refundRow.slice(1, 6)).toEqual([
      inv.invoiceNumber,
      'Juniper & Vine',
      expect.any(String),
      'Card refund',
      '-10.00',
    ])
    expect(refundRow[6]).toContain('Two bars arrived cracked')
    expect(rows.find((r) => r[4] === 'Card')![5]).toBe((inv.totalCents / 100).toFixed(2))

    const rest = expectStatus(
      await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: inv.totalCents - 1000 }),
      201,
    )
    expect(rest.body.invoice).toMatchObject({ paidCents: 0, outstandingCents: inv.totalCents })
    expect(['open', 'overdue']).toContain(rest.body.invoice.status)
    const none = expectStatus(
      await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: 1 }),
      422,
    )
    expect(none.body.error.details[0].message).toContain('refunded in full')
  })

  it('does not refund a payment recorded by hand', async () => {
    const inv = await shippedInvoice('A')
    const recorded = expectStatus(
      await owner.post(`/api/invoices/${inv.invoiceId}/payments`, {
        method: 'card',
        amountCents: 500,
        receivedOn: await studioToday(),
      }),
      201,
    )
    const refused = expectStatus(
      await owner.post(`/api/payments/${recorded.body.payment.id}/refunds`, { amountCents: 100 }),
      409,
    )
    expect(refused.body.error.code).toBe('not_refundable')
  })
})
