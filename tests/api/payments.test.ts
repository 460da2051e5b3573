/**
 * Money received: whole and part payments, refused overpayments, the payments list and CSV, what
 * the shops owe by age (receivables), and overdue reminders (on demand and the daily job, at most
 * one per invoice in 7 days).
 */
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { mailQueueIdle } from '@server/modules/invoices/mail-queue'
import { sendOverdueReminders } from '@server/modules/payments/reminders.service'
import { addDays } from '@shared/domain/dates/dates'
import { ageingBucket } from '@shared/domain/invoices/terms'
import { parseCsv } from '@shared/domain/csv/csv'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { allMail, waitForMail } from '@tests/factories/mail'
import { expectStatus } from '@tests/factories/responses'
import { makeOrder, makeSellable, snapshot } from '@tests/factories/fulfilment'
import type { Sellable, ShopKey } from '@tests/factories/fulfilment'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient
let soap: Sellable
let today: string

async function shippedInvoice(shop: ShopKey, opts: { daysAgo?: number; cases?: number } = {}) {
  const o = await makeOrder({
    shop,
    lines: [{ productId: soap.productId, cases: opts.cases ?? 2 }],
    status: 'shipped',
    daysAgo: opts.daysAgo,
    notify: false,
  })
  const [inv] = await sequelize.query<{ id: number; number: string; total_cents: number; due_date: string }>(
    `SELECT id, number, total_cents, due_date FROM invoices WHERE order_id = $1 AND kind = 'invoice'`,
    { bind: [o.orderId], type: QueryTypes.SELECT },
  )
  return {
    ...o,
    invoiceId: inv!.id,
    invoiceNumber: inv!.number,
    totalCents: inv!.total_cents,
    dueDate: inv!.due_date,
  }
}

const pay = (who: ApiClient, invoiceId: number, body: Record<string, unknown>) =>
  who.post(`/api/invoices/${invoiceId}/payments`, { method: 'bank_transfer', receivedOn: today, ...body })

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'anon'),
  ])
  soap = await makeSellable(owner, { bars: 900, unitPriceCents: 2000 })
  today = await studioToday()
})

describe('POST /api/invoices/:id/payments', () => {
  it('takes a part payment, then the rest: part paid, then paid', async () => {
    const inv = await shippedInvoice('A')
    const first = expectStatus(
      await pay(owner, inv.invoiceId, { amountCents: 10000, reference: 'ACH 55120' }),
      201,
    )
    expect(first.body.payment).toMatchObject({
      invoiceId: inv.invoiceId,
      method: 'bank_transfer',
      amountCents: 10000,
      reference: 'ACH 55120',
      recordedBy: 'Maren Oakes',
    })
    expect(first.body.invoice).toMatchObject({
      status: 'part_paid',
      paidCents: 10000,
      outstandingCents: inv.totalCents - 10000,
    })
    const rest = expectStatus(
      await pay(owner, inv.invoiceId, { method: 'cheque', amountCents: inv.totalCents - 10000 }),
      201,
    )
    expect(rest.body.invoice).toMatchObject({
      status: 'paid',
      paidCents: inv.totalCents,
      outstandingCents: 0,
    })
    expect(rest.body.invoice.payments.map((p: { amountCents: number }) => p.amountCents)).toEqual([
      10000,
      inv.totalCents - 10000,
    ])
  })

  it('refuses more than is owed (422 overpayment on amountCents) and writes nothing', async () => {
    const inv = await shippedInvoice('C')
    expectStatus(await pay(owner, inv.invoiceId, { amountCents: 5000 }), 201)
    const before = await snapshot()
    const r = expectStatus(await pay(owner, inv.invoiceId, { amountCents: inv.totalCents - 5000 + 1 }), 422)
    expect(r.body.error.code).toBe('overpayment')
    expect(r.body.error.details[0]).toMatchObject({
      field: 'amountCents',
      outstandingCents: inv.totalCents - 5000,
    })
    expect(await snapshot()).toEqual(before)
    // Paid in full, any further amount is too much.
    expectStatus(await pay(owner, inv.invoiceId, { amountCents: inv.totalCents - 5000 }), 201)
    expect(expectStatus(await pay(owner, inv.invoiceId, { amountCents: 1 }), 422).body.error.code).toBe(
      'overpayment',
    )
  })

  it('lets two payments for the whole amount race: one is taken, the other refused', async () => {
    const inv = await shippedInvoice('A')
    const results = await Promise.all(
      [1, 2].map(() => pay(owner, inv.invoiceId, { amountCents: inv.totalCents })),
    )
    expect(results.map((r) => r.status).sort()).toEqual([201, 422])
    const [row] = await sequelize.query<{ paid_cents: number; n: number }>(
      'SELECT paid_cents, (SELECT count(*)::int FROM payments WHERE invoice_id = $1) AS n FROM invoices WHERE id = $1',
      { bind: [inv.invoiceId], type: QueryTypes.SELECT },
    )
    expect(row).toEqual({ paid_cents: inv.totalCents, n: 1 })
  })

  it('answers 400 with the field for a zero, negative or fractional amount, a bad method or date', async () => {
    const inv = await shippedInvoice('C')
    const before = await snapshot()
    const cases: [Record<string, unknown>, string][] = [
      [{ amountCents: 0 }, 'amountCents'],
      [{ amountCents: -500 }, 'amountCents'],
      [{ amountCents: 10.5 }, 'amountCents'],
      [{ amountCents: '100' }, 'amountCents'],
      [{ amountCents: 100, method: 'barter' }, 'method'],
      [{ amountCents: 100, receivedOn: '2026-02-31' }, 'receivedOn'],
      [{ amountCents: 100, receivedOn: addDays(today, 2) }, 'receivedOn'],
      [{ amountCents: 100, reference: 'x'.repeat(81) }, 'reference'],
    ]
    for (const [body, field] of cases) {
      const r = expectStatus(await pay(owner, inv.invoiceId, body), 400)
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
    }
    expect(await snapshot()).toEqual(before)
  })

  it('refuses payments on a void invoice or a credit note (409)', async () => {
    const inv = await shippedInvoice('A')
    const v = expectStatus(
      await owner.post(`/api/invoices/${inv.invoiceId}/void`, { reason: 'Sent twice' }),
      200,
    )
    const before = await snapshot()
    expect(expectStatus(await pay(owner, inv.invoiceId, { amountCents: 100 }), 409).body.error.code).toBe(
      'not_payable',
    )
    expect(
      expectStatus(await pay(owner, v.body.creditNote.id, { amountCents: 100 }), 409).body.error.code,
    ).toBe('not_payable')
    expect(await snapshot()).toEqual(before)
  })

  it('is for the owner only', async () => {
    const inv = await shippedInvoice('A')
    expectStatus(await pay(buyer, inv.invoiceId, { amountCents: 100 }), 403)
    expectStatus(await pay(packer, inv.invoiceId, { amountCents: 100 }), 403)
    expectStatus(await pay(anon, inv.invoiceId, { amountCents: 100 }), 401)
    expectStatus(await pay(owner, 99999999, { amountCents: 100 }), 404)
  })
})

describe('GET /api/payments and /api/payments.csv', () => {
  it('lists payments with filters and exports them', async () => {
    const inv = await shippedInvoice('C')
    expectStatus(
      await pay(owner, inv.invoiceId, { method: 'card', amountCents: 4321, reference: '=SUM(A1)' }),
      201,
    )
    const r = expectStatus(await owner.get(`/api/payments?invoiceId=${inv.invoiceId}`), 200)
    expect(r.body.items).toEqual([
      expect.objectContaining({
        invoiceNumber: inv.invoiceNumber,
        orderNumber: inv.number,
        shopName: 'The Quiet Kettle',
        method: 'card',
        amountCents: 4321,
        receivedOn: today,
      }),
    ])
    const cards = expectStatus(
      await owner.get(`/api/payments?method=card&shopId=${inv.shopId}&from=${today}&to=${today}`),
      200,
    )
    expect(
      cards.body.items.every(
        (p: { method: string; shopId: number }) => p.method === 'card' && p.shopId === inv.shopId,
      ),
    ).toBe(true)

    const csv = expectStatus(await owner.get(`/api/payments.csv?invoiceId=${inv.invoiceId}`), 200)
    expect(csv.headers['content-type']).toMatch(/^text\/csv/)
    expect(csv.headers['content-disposition']).toMatch(/^attachment; filename="payments-/)
    const [header, row] = parseCsv(csv.text).map((x) => x.fields)
    expect(header).toEqual([
      'Received on',
      'Invoice',
      'Shop',
      'Order',
      'Method',
      'Amount',
      'Reference',
      'Recorded by',
      'Recorded at',
    ])
    expect(row!.slice(0, 8)).toEqual([
      today,
      inv.invoiceNumber,
      'The Quiet Kettle',
      inv.number,
      'Card',
      '43.21',
      `'=SUM(A1)`,
      'Maren Oakes',
    ])

    expect(expectStatus(await owner.get('/api/payments?method=gold'), 400).body.error.details[0].field).toBe(
      'query.method',
    )
    expectStatus(await buyer.get('/api/payments'), 403)
    expectStatus(await packer.get('/api/payments.csv'), 403)
    expectStatus(await anon.get('/api/payments'), 401)
  })
})

describe('GET /api/receivables', () => {
  it('sorts what is owed into current, 1–30, 31–60, 61–90 and over 90 days past due, in total and per shop', async () => {
    const before = expectStatus(await owner.get('/api/receivables'), 200).body
    // Net 30 (shop A) issued 45 days ago: due 15 days ago → 1–30.
    const a45 = await shippedInvoice('A', { daysAgo: 45 })
    // Net 30 issued 100 days ago, part paid: due 70 days ago → 61–90, only the rest counts.
    const a100 = await shippedInvoice('A', { daysAgo: 100 })
    expectStatus(
      await pay(owner, a100.invoiceId, { amountCents: 3000, receivedOn: addDays(today, -20) }),
      201,
    )
    // Net 15 (shop C) issued 60 days ago: due 45 days ago → 31–60; issued 130 days ago: due 115 ago → over 90.
    const c60 = await shippedInvoice('C', { daysAgo: 60 })
    const c130 = await shippedInvoice('C', { daysAgo: 130 })
    // Issued today on net 15: current.
    const cNow = await shippedInvoice('C')
    // Paid in full: adds nothing.
    const paid = await shippedInvoice('C', { daysAgo: 50 })
    expectStatus(await pay(owner, paid.invoiceId, { amountCents: paid.totalCents }), 201)

    expect(ageingBucket(a45.dueDate, today)).toBe('1_30')
    expect(ageingBucket(c130.dueDate, today)).toBe('over_90')
    const after = expectStatus(await owner.get('/api/receivables'), 200).body
    const delta = (bucket: string) =>
      after.buckets.find((b: { bucket: string }) => b.bucket === bucket).cents -
      before.buckets.find((b: { bucket: string }) => b.bucket === bucket).cents
    expect(after.buckets.map((b: { bucket: string }) => b.bucket)).toEqual([
      'current',
      '1_30',
      '31_60',
      '61_90',
      'over_90',
    ])
    expect(delta('current')).toBe(cNow.totalCents)
    expect(delta('1_30')).toBe(a45.totalCents)
    expect(delta('31_60')).toBe(c60.totalCents)
    expect(delta('61_90')).toBe(a100.totalCents - 3000)
    expect(delta('over_90')).toBe(c130.totalCents)
    expect(after.outstandingCents - before.outstandingCents).toBe(
      cNow.totalCents + a45.totalCents + c60.totalCents + a100.totalCents - 3000 + c130.totalCents,
    )
    expect(after.overdueCents).toBe(after.outstandingCents - after.buckets[0].cents)
    expect(after.asOf).toBe(today)

    // Per shop: the buckets add up to the shop's total, and the shops to the whole.
    for (const shop of after.shops) {
      expect(Object.values(shop.byBucket as Record<string, number>).reduce((n, c) => n + c, 0)).toBe(
        shop.outstandingCents,
      )
    }
    expect(
      after.shops.reduce((n: number, s: { outstandingCents: number }) => n + s.outstandingCents, 0),
    ).toBe(after.outstandingCents)
    const kettle = after.shops.find((s: { shopId: number }) => s.shopId === c130.shopId)
    expect(kettle).toMatchObject({
      shopName: 'The Quiet Kettle',
      terms: 'net_15',
      oldestDueDate: c130.dueDate,
    })
    expect(kettle.byBucket.over_90).toBeGreaterThanOrEqual(c130.totalCents)
  })

  it('is for the owner only', async () => {
    expectStatus(await buyer.get('/api/receivables'), 403)
    expectStatus(await packer.get('/api/receivables'), 403)
    expectStatus(await anon.get('/api/receivables'), 401)
  })
})

describe('overdue reminders', () => {
  it('the daily job reminds each overdue invoice once in 7 days, with the invoice PDF attached', async () => {
    const late = await shippedInvoice('A', { daysAgo: 40 })
    const notYet = await shippedInvoice('A')
    const first = await sendOverdueReminders(today)
    expect(first.sent.map((s) => s.invoiceId)).toContain(late.invoiceId)
    expect(first.sent.map((s) => s.invoiceId)).not.toContain(notYet.invoiceId)
    const mail = await waitForMail(
      late.buyerEmail,
      new RegExp(`Reminder: invoice ${late.invoiceNumber} is 10 days overdue`),
    )
    expect(mail.attachments?.[0]).toMatchObject({
      contentType: 'application/pdf',
      filename: `invoice-${late.invoiceNumber}.pdf`,
    })

    const count = async () =>
      (
        await sequelize.query<{ n: number }>(
          'SELECT count(*)::int AS n FROM invoice_reminders WHERE invoice_id = $1',
          {
            bind: [late.invoiceId],
            type: QueryTypes.SELECT,
          },
        )
      )[0]!.n
    expect(await count()).toBe(1)
    // The same day again, and six days later: nothing more. Seven days later: the next one.
    expect((await sendOverdueReminders(today)).sent.map((s) => s.invoiceId)).not.toContain(late.invoiceId)
    expect((await sendOverdueReminders(addDays(today, 6))).sent.map((s) => s.invoiceId)).not.toContain(
      late.invoiceId,
    )
    expect(await count()).toBe(1)
    expect((await sendOverdueReminders(addDays(today, 7))).sent.map((s) => s.invoiceId)).toContain(
      late.invoiceId,
    )
    expect(await count()).toBe(2)

    // Once paid, no more reminders.
    expectStatus(await pay(owner, late.invoiceId, { amountCents: late.totalCents }), 201)
    expect((await sendOverdueReminders(addDays(today, 14))).sent.map((s) => s.invoiceId)).not.toContain(
      late.invoiceId,
    )
  })

  it('POST /api/invoices/:id/remind sends one now, refuses within 7 days and when nothing is owed', async () => {
    const open = await shippedInvoice('C', { daysAgo: 20 })
    const r = expectStatus(await owner.post(`/api/invoices/${open.invoiceId}/remind`), 200)
    expect(r.body.reminder).toMatchObject({ invoiceId: open.invoiceId, sentOn: today })
    await waitForMail(
      open.buyerEmail,
      new RegExp(`Reminder: invoice ${open.invoiceNumber} is 5 days overdue`),
    )
    const detail = (await owner.get(`/api/invoices/${open.invoiceId}`)).body.invoice
    expect(detail.reminders).toEqual([
      expect.objectContaining({ sentOn: today, source: 'owner', sentBy: 'Maren Oakes' }),
    ])

    const before = await snapshot()
    const again = expectStatus(await owner.post(`/api/invoices/${open.invoiceId}/remind`), 409)
    expect(again.body.error).toMatchObject({ code: 'reminder_recent' })
    expect(again.body.error.details[0]).toMatchObject({ lastSentOn: today, nextOn: addDays(today, 7) })

    const settled = await shippedInvoice('C')
    expectStatus(await pay(owner, settled.invoiceId, { amountCents: settled.totalCents }), 201)
    const mid = await snapshot()
    expect(
      expectStatus(await owner.post(`/api/invoices/${settled.invoiceId}/remind`), 409).body.error.code,
    ).toBe('nothing_owed')
    expect((await snapshot()).counts.reminders).toBe(mid.counts.reminders)
    expect(before.counts.reminders).toBe(mid.counts.reminders)

    expectStatus(await buyer.post(`/api/invoices/${open.invoiceId}/remind`), 403)
    expectStatus(await packer.post(`/api/invoices/${open.invoiceId}/remind`), 403)
    expectStatus(await anon.post(`/api/invoices/${open.invoiceId}/remind`), 401)
    expectStatus(await owner.post('/api/invoices/99999999/remind'), 404)
    await mailQueueIdle()
    expect(
      (await allMail()).filter((m) => m.subject.includes(`invoice ${settled.invoiceNumber} is`)),
    ).toEqual([])
  })
})
