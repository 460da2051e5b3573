/**
 * A prepay account is invoiced when its order is confirmed (by the owner, or at once when the
 * studio auto-confirms shops in good standing), in the confirmation's own transaction. Cancelling
 * such an order voids its invoice with a credit note, unless money came in; changing its lines
 * voids the invoice and raises one for the new lines. Accounts on net terms are invoiced on shipment.
 */
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { updateSettings } from '@server/modules/settings/settings.service'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { expectStatus } from '@tests/factories/responses'
import { makeOrder, makeSellable, orderStatus, snapshot } from '@tests/factories/fulfilment'
import type { Sellable } from '@tests/factories/fulfilment'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let prepayBuyer: ApiClient
let soap: Sellable

type InvoiceRow = {
  id: number
  number: string
  kind: 'invoice' | 'credit_note'
  terms: string
  total_cents: number
  voided_at: Date | null
  credits_invoice_id: number | null
}

function invoicesOf(orderId: number) {
  return sequelize.query<InvoiceRow>(
    `SELECT id, number, kind, terms, total_cents, voided_at, credits_invoice_id
       FROM invoices WHERE order_id = $1 ORDER BY id`,
    { bind: [orderId], type: QueryTypes.SELECT },
  )
}

beforeAll(async () => {
  ;[owner, prepayBuyer] = await Promise.all([clientAs(app, 'owner'), clientAs(app, 'buyerB')])
  await updateSettings({ autoConfirmGoodStanding: false })
  soap = await makeSellable(owner, { bars: 600 })
})

describe('invoicing a prepay account at confirmation', () => {
  it('raises the invoice, due on issue, when the owner confirms the order', async () => {
    const o = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'placed',
    })
    expect(await invoicesOf(o.orderId)).toEqual([])
    const r = expectStatus(await owner.post(`/api/orders/${o.orderId}/confirm`, {}), 200)
    expect(r.body.order.status).toBe('confirmed')
    const [inv, ...rest] = await invoicesOf(o.orderId)
    expect(rest).toEqual([])
    expect(inv).toMatchObject({ kind: 'invoice', terms: 'prepay', total_cents: r.body.order.totalCents })
    // The buyer sees it among their own shop's invoices.
    const mine = expectStatus(await prepayBuyer.get('/api/invoices'), 200)
    expect(mine.body.items.map((i: { id: number }) => i.id)).toContain(inv!.id)
  })

  it('raises nothing at confirmation for an account on net terms', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'placed',
    })
    const before = await snapshot()
    expectStatus(await owner.post(`/api/orders/${o.orderId}/confirm`, {}), 200)
    expect(await invoicesOf(o.orderId)).toEqual([])
    expect((await snapshot()).counts.invoices).toBe(before.counts.invoices)
  })

  it('raises it with the order when the studio confirms shops in good standing at once', async () => {
    await updateSettings({ autoConfirmGoodStanding: true })
    try {
      const r = expectStatus(
        await prepayBuyer.post(
          '/api/orders',
          { lines: [{ productId: soap.productId, cases: 1 }], poNumber: 'HL-AUTO-1' },
          { 'Idempotency-Key': `prepay-auto-${Date.now()}` },
        ),
        201,
      )
      expect(r.body.order.status).toBe('confirmed')
      const rows = await invoicesOf(r.body.order.id)
      expect(rows).toHaveLength(1)
      expect(rows[0]).toMatchObject({
        kind: 'invoice',
        terms: 'prepay',
        total_cents: r.body.order.totalCents,
      })
    } finally {
      await updateSettings({ autoConfirmGoodStanding: false })
    }
  })

  it('voids the invoice with a credit note when the owner cancels the order', async () => {
    const o = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'confirmed',
    })
    const [inv] = await invoicesOf(o.orderId)
    expectStatus(
      await owner.post(`/api/orders/${o.orderId}/cancel`, { reason: 'Shop closed for the season' }),
      200,
    )
    const rows = await invoicesOf(o.orderId)
    expect(rows).toHaveLength(2)
    expect(rows[0]!.id).toBe(inv!.id)
    expect(rows[0]!.voided_at).not.toBeNull()
    expect(rows[1]).toMatchObject({
      kind: 'credit_note',
      credits_invoice_id: inv!.id,
      total_cents: inv!.total_cents,
    })
  })

  it('refuses to cancel an order whose invoice has a payment, and changes nothing', async () => {
    const o = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'confirmed',
    })
    const [inv] = await invoicesOf(o.orderId)
    expectStatus(
      await owner.post(`/api/invoices/${inv!.id}/payments`, {
        method: 'bank_transfer',
        amountCents: 500,
        receivedOn: new Date().toISOString().slice(0, 10),
        reference: 'HL transfer',
      }),
      201,
    )
    const before = await snapshot([soap.batchId])
    const r = expectStatus(await owner.post(`/api/orders/${o.orderId}/cancel`, {}), 409)
    expect(r.body.error.code).toBe('invoice_has_payments')
    expect(await orderStatus(o.orderId)).toBe('confirmed')
    expect(await snapshot([soap.batchId])).toEqual(before)
  })

  it('voids and raises the invoice again when the owner changes the lines', async () => {
    const o = await makeOrder({
      shop: 'B',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'confirmed',
    })
    const [first] = await invoicesOf(o.orderId)
    const r = expectStatus(
      await owner.patch(`/api/orders/${o.orderId}/lines`, {
        lines: [{ productId: soap.productId, cases: 3 }],
      }),
      200,
    )
    const rows = await invoicesOf(o.orderId)
    const live = rows.filter((i) => i.kind === 'invoice' && i.voided_at === null)
    expect(live).toHaveLength(1)
    expect(live[0]!.id).not.toBe(first!.id)
    expect(live[0]!.total_cents).toBe(r.body.order.totalCents)
    expect(live[0]!.total_cents).toBeGreaterThan(first!.total_cents)
    expect(rows.find((i) => i.kind === 'credit_note')).toMatchObject({ credits_invoice_id: first!.id })
  })
})
