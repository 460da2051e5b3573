/**
 * Shipping a packed order: one transaction writes the shipment, turns every reserved bar into a
 * shipped ledger move, marks the order shipped and raises its invoice with the next gapless number
 * of the year; after the commit the buyer gets the tracking number with the packing slip, and the
 * invoice PDF. Refused shipments leave every table as it was.
 */
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { raiseInvoiceForOrder } from '@server/modules/invoices/invoices.service'
import { addDays, yearOf } from '@shared/domain/dates/dates'
import { checkInvoiceSeries, dueDate, parseInvoiceNumber } from '@shared/domain/invoices/terms'
import { clientAs } from '@tests/factories/api-client'
import { expectStatus } from '@tests/factories/responses'
import type { ApiClient } from '@tests/factories/api-client'
import { allMail, waitForMail } from '@tests/factories/mail'
import { makeOrder, makeSellable, orderStatus, snapshot, staff } from '@tests/factories/fulfilment'
import { confirmOrder } from '@server/modules/orders/order-changes.service'
import type { Sellable } from '@tests/factories/fulfilment'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let buyer: ApiClient
let anon: ApiClient
let soap: Sellable
let today: string

const ship = (who: ApiClient, orderId: number, body: Record<string, unknown> = {}) =>
  who.post(`/api/orders/${orderId}/ship`, {
    carrier: 'UPS',
    trackingNumber: '1Z999AA10123456784',
    shipDate: today,
    ...body,
  })

async function invoiceOf(orderId: number) {
  return sequelize.query<{
    id: number
    number: string
    seq: number
    year: number
    issue_date: string
    due_date: string
    terms: string
    total_cents: number
  }>(
    `SELECT id, number, seq, year, issue_date, due_date, terms, total_cents FROM invoices WHERE order_id = $1 AND kind = 'invoice'`,
    { bind: [orderId], type: QueryTypes.SELECT },
  )
}

beforeAll(async () => {
  ;[owner, packer, buyer, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'anon'),
  ])
  soap = await makeSellable(owner, { bars: 600 })
  today = await studioToday()
})

describe('POST /api/orders/:id/ship', () => {
  it('ships a packed order: shipment, shipped moves, status, and an invoice due 30 days later on net 30', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'packed',
      poNumber: 'JV-SHIP-7781',
    })
    const before = await snapshot([soap.batchId])
    const r = expectStatus(
      await ship(packer, o.orderId, { carrier: 'UPS', trackingNumber: '1Z 9A7 F22 0345 6789' }),
      200,
    )
    expect(r.body).toMatchObject({
      order: { id: o.orderId, number: o.number, status: 'shipped' },
      shipment: {
        carrier: 'UPS',
        trackingNumber: '1Z 9A7 F22 0345 6789',
        shipDate: today,
        cartons: 1,
        weightG: 2500,
      },
      invoice: { raisedNow: true },
    })
    expect(await orderStatus(o.orderId)).toBe('shipped')

    // The 12 bars leave the reserved balance; free stock does not move.
    const after = await snapshot([soap.batchId])
    expect(after.stock[0]).toEqual({ ...before.stock[0], reserved: before.stock[0]!.reserved - 12 })
    expect(after.counts.shipments).toBe(before.counts.shipments + 1)
    const moves = await sequelize.query<{
      kind: string
      bars: number
      free_delta: number
      reserved_delta: number
    }>(
      `SELECT kind, bars, free_delta, reserved_delta FROM stock_moves WHERE order_id = $1 AND kind = 'shipped'`,
      { bind: [o.orderId], type: QueryTypes.SELECT },
    )
    expect(moves).toEqual([{ kind: 'shipped', bars: 12, free_delta: 0, reserved_delta: -12 }])

    // Net 30: due 30 days after the invoice date (REFERENCES.md, common practice).
    const [inv] = await invoiceOf(o.orderId)
    expect(inv).toMatchObject({
      number: r.body.invoice.number,
      issue_date: today,
      terms: 'net_30',
      due_date: addDays(today, 30),
    })
    expect(inv!.due_date).toBe(dueDate(today, 'net_30'))
    expect(parseInvoiceNumber(inv!.number, 'LC')).toEqual({ year: yearOf(today), seq: inv!.seq })
  })

  it('e-mails the buyer the tracking number with the packing slip PDF, and the invoice PDF', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'packed',
    })
    const r = expectStatus(
      await ship(owner, o.orderId, { carrier: 'FedEx', trackingNumber: 'FX-7730-1155' }),
      200,
    )
    const shipped = await waitForMail(
      o.buyerEmail,
      new RegExp(`Order ${o.number} has shipped: FedEx FX-7730-1155`),
    )
    expect(shipped.text).toContain('Tracking number: FX-7730-1155')
    expect(shipped.attachments).toEqual([
      expect.objectContaining({ contentType: 'application/pdf', filename: `packing-slip-${o.number}.pdf` }),
    ])
    const invoice = await waitForMail(
      o.buyerEmail,
      new RegExp(`Invoice ${r.body.invoice.number} from Brindlewick Soapery`),
    )
    expect(invoice.text).toContain(o.number)
    expect(invoice.attachments).toEqual([
      expect.objectContaining({
        contentType: 'application/pdf',
        filename: `invoice-${r.body.invoice.number}.pdf`,
      }),
    ])
  })

  it('refuses an order that is not packed (409 invalid_transition) and writes nothing', async () => {
    const o = await makeOrder({
      shop: 'C',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'packing',
    })
    const before = await snapshot([soap.batchId])
    const r = expectStatus(await ship(packer, o.orderId), 409)
    expect(r.body.error.code).toBe('invalid_transition')
    expect(r.body.error.message).toMatch(/only a packed order can be shipped/)
    expect(await orderStatus(o.orderId)).toBe('packing')
    expect(await snapshot([soap.batchId])).toEqual(before)
    await new Promise((r) => setTimeout(r, 400))
    expect((await allMail()).filter((m) => m.subject.includes(`Order ${o.number} has shipped`))).toEqual([])
  })

  it('refuses a shipped order a second time (409) with nothing written', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'shipped',
      notify: false,
    })
    const before = await snapshot([soap.batchId])
    expect(expectStatus(await ship(packer, o.orderId), 409).body.error.code).toBe('invalid_transition')
    expect(await snapshot([soap.batchId])).toEqual(before)
  })

  it('checks the carrier, tracking number and date (400 with the field), and its callers', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'packed',
    })
    const before = await snapshot([soap.batchId])
    const cases: [Record<string, unknown>, string][] = [
      [{ carrier: '' }, 'carrier'],
      [{ trackingNumber: '' }, 'trackingNumber'],
      [{ trackingNumber: '<script>' }, 'trackingNumber'],
      [{ shipDate: '2026-02-30' }, 'shipDate'],
      [{ shipDate: addDays(today, 3) }, 'shipDate'],
      // Before the order was placed
      [{ shipDate: addDays(today, -1) }, 'shipDate'],
    ]
    for (const [body, field] of cases) {
      const r = expectStatus(await ship(packer, o.orderId, body), 400)
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
    }
    expectStatus(await ship(buyer, o.orderId), 403)
    expectStatus(await ship(anon, o.orderId), 401)
    expectStatus(await ship(packer, 99999999), 404)
    expect(await orderStatus(o.orderId)).toBe('packed')
    expect(await snapshot([soap.batchId])).toEqual(before)
  })

  it('does not raise a second invoice for a prepay order invoiced at confirmation', async () => {
    const o = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'confirmed',
    })
    // Confirming the order of a prepay account raised its invoice in the same transaction.
    const [prepay] = await invoiceOf(o.orderId)
    expect(await invoiceOf(o.orderId)).toHaveLength(1)
    expect(prepay).toMatchObject({ terms: 'prepay', due_date: today })

    expectStatus(await packer.post(`/api/orders/${o.orderId}/claim`, {}), 200)
    const lines = (await packer.get(`/api/packing/orders/${o.orderId}`)).body.order.lines as {
      orderLineId: number
      bars: number
    }[]
    expectStatus(
      await packer.post(`/api/orders/${o.orderId}/packed`, {
        cartons: 1,
        weightG: 800,
        lines: lines.map((l) => ({ orderLineId: l.orderLineId, bars: l.bars })),
      }),
      200,
    )
    // Prepay: the invoice is paid before the order ships.
    expectStatus(
      await owner.post(`/api/invoices/${prepay!.id}/payments`, {
        method: 'card',
        amountCents: prepay!.total_cents,
        receivedOn: today,
        reference: 'Card ending 0042',
      }),
      201,
    )
    const r = expectStatus(await ship(packer, o.orderId), 200)
    expect(r.body.invoice).toEqual({ id: prepay!.id, number: prepay!.number, raisedNow: false })
    expect(await invoiceOf(o.orderId)).toHaveLength(1)
  })

  it('refuses to ship a prepay order whose invoice is unpaid (409 awaiting_payment) and writes nothing', async () => {
    const o = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'packed',
    })
    const [inv] = await invoiceOf(o.orderId)
    expect(inv).toMatchObject({ terms: 'prepay' })

    // The bench shows it: on the queue among the packed orders, and on the packer's order page.
    const queue = expectStatus(await packer.get('/api/packing/queue'), 200).body
    const row = queue.awaitingShipment.find((i: { orderId: number }) => i.orderId === o.orderId)
    expect(row).toMatchObject({ status: 'packed', awaitingPayment: true })
    expect(expectStatus(await packer.get(`/api/packing/orders/${o.orderId}`), 200).body.order).toMatchObject({
      awaitingPayment: true,
    })
    // The owner's order page says so too, and names the invoice.
    expect(expectStatus(await owner.get(`/api/orders/${o.orderId}`), 200).body.order).toMatchObject({
      awaitingPayment: true,
      invoice: { id: inv!.id, number: inv!.number, void: false },
    })

    const before = await snapshot([soap.batchId])
    for (const who of [packer, owner]) {
      const r = expectStatus(await ship(who, o.orderId), 409)
      expect(r.body.error.code).toBe('awaiting_payment')
      expect(r.body.error.message).toContain(inv!.number)
      expect(r.body.error.details).toEqual([
        expect.objectContaining({ field: 'invoice', invoiceId: inv!.id, invoiceNumber: inv!.number }),
      ])
      // A packer never sees an amount, not even in a refusal.
      expect(JSON.stringify(r.body)).not.toMatch(/\$|cents/i)
    }
    expect(await orderStatus(o.orderId)).toBe('packed')
    expect(await snapshot([soap.batchId])).toEqual(before)

    // Part paid is still awaiting payment.
    const pay = (amountCents: number) =>
      owner.post(`/api/invoices/${inv!.id}/payments`, {
        method: 'bank_transfer',
        amountCents,
        receivedOn: today,
        reference: 'Wire HL',
      })
    expectStatus(await pay(100), 201)
    expect(expectStatus(await ship(packer, o.orderId), 409).body.error.code).toBe('awaiting_payment')
    expect(await orderStatus(o.orderId)).toBe('packed')

    // Paid in full: the bench no longer waits, and the order ships.
    expectStatus(await pay(inv!.total_cents - 100), 201)
    expect(
      expectStatus(await packer.get(`/api/packing/orders/${o.orderId}`), 200).body.order.awaitingPayment,
    ).toBe(false)
    expect(expectStatus(await owner.get(`/api/orders/${o.orderId}`), 200).body.order.awaitingPayment).toBe(
      false,
    )
    const r = expectStatus(await ship(packer, o.orderId), 200)
    expect(r.body.invoice).toEqual({ id: inv!.id, number: inv!.number, raisedNow: false })
  })

  it('never marks an order on net terms as awaiting payment', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'packed',
    })
    const queue = expectStatus(await packer.get('/api/packing/queue'), 200).body
    expect(
      queue.awaitingShipment.find((i: { orderId: number }) => i.orderId === o.orderId).awaitingPayment,
    ).toBe(false)
    expect(expectStatus(await owner.get(`/api/orders/${o.orderId}`), 200).body.order).toMatchObject({
      awaitingPayment: false,
      invoice: null,
    })
  })

  it('answers null from the confirmation hook for an account on net terms (invoiced when it ships)', async () => {
    const o = await makeOrder({
      shop: 'C',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'confirmed',
    })
    const before = await snapshot()
    expect(
      await sequelize.transaction((t) => raiseInvoiceForOrder(o.orderId, t, { notify: false })),
    ).toBeNull()
    expect(await snapshot()).toEqual(before)
  })

  it('gives the number back when the issuing transaction rolls back: the series stays gapless', async () => {
    const other = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'placed',
    })
    const before = await snapshot()
    await expect(
      sequelize.transaction(async (t) => {
        await sequelize.query(`UPDATE orders SET status = 'confirmed' WHERE id = $1`, {
          bind: [other.orderId],
          transaction: t,
        })
        await raiseInvoiceForOrder(other.orderId, t, { notify: false })
        throw new Error('the caller failed after the invoice was numbered')
      }),
    ).rejects.toThrow(/caller failed/)
    expect(await snapshot()).toEqual(before)
    expect(await invoiceOf(other.orderId)).toEqual([])
    // The next invoice takes the number the rolled-back one had held.
    const studio = await staff('owner')
    await confirmOrder(other.orderId, { role: 'owner', shopId: null, userId: studio.id }, { notify: false })
    const [next] = await invoiceOf(other.orderId)
    expect(parseInvoiceNumber(next!.number, 'LC')!.seq).toBe(before.counts.last_seq + 1)
  })

  it(
    '20 shipments at once get consecutive invoice numbers: no gap, no duplicate',
    { timeout: 180_000 },
    async () => {
      const made = performance.now()
      const orders = []
      for (let i = 0; i < 20; i++) {
        orders.push(
          await makeOrder({
            // Accounts on net terms: each shipment raises its invoice (a prepay one has it already).
            shop: (['A', 'C'] as const)[i % 2]!,
            lines: [{ productId: soap.productId, cases: 1 }],
            status: 'packed',
          }),
        )
      }
      console.info(`20 packed orders made in ${Math.round(performance.now() - made)} ms`)
      const before = await snapshot([soap.batchId])
      const started = performance.now()
      const results = await Promise.all(
        orders.map((o, i) => ship(i % 2 ? owner : packer, o.orderId, { trackingNumber: `RACE-${i}` })),
      )
      const ms = performance.now() - started
      expect(results.map((r) => r.status)).toEqual(orders.map(() => 200))
      const seqs = results
        .map((r) => parseInvoiceNumber(r.body.invoice.number, 'LC')!.seq)
        .sort((a, b) => a - b)
      expect(new Set(seqs).size).toBe(20)
      expect(seqs.at(-1)! - seqs[0]!).toBe(19)
      expect(seqs[0]).toBe(before.counts.last_seq + 1)

      const year = yearOf(today)
      const all = await sequelize.query<{ seq: number }>('SELECT seq FROM invoices WHERE year = $1', {
        bind: [year],
        type: QueryTypes.SELECT,
      })
      expect(checkInvoiceSeries(all.map((r) => r.seq))).toEqual({ missing: [], duplicated: [] })
      const after = await snapshot([soap.batchId])
      expect(after.stock[0]!.reserved).toBe(before.stock[0]!.reserved - 20 * 6)
      expect(after.counts.shipments).toBe(before.counts.shipments + 20)
      console.info(`20 concurrent shipments took ${Math.round(ms)} ms`)
    },
  )
})
