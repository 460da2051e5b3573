/**
 * Invoices and credit notes: the contract's list, one invoice, its PDF, voiding with a credit
 * note, a second invoice for one order, e-mailing again, and the bookkeeper's CSV. A buyer sees
 * only their own shop's invoices (another shop's answers 404); a packer none.
 */
import { QueryTypes } from 'sequelize'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { addDays, formatDate } from '@shared/domain/dates/dates'
import { dueDate, parseInvoiceNumber } from '@shared/domain/invoices/terms'
import { formatCents } from '@shared/domain/money/money'
import { parseCsv } from '@shared/domain/csv/csv'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { waitForMail } from '@tests/factories/mail'
import { binary, expectStatus, keepPdf, pdfText } from '@tests/factories/responses'
import { demoShop, makeOrder, makeSellable, snapshot } from '@tests/factories/fulfilment'
import type { MadeOrder, Sellable } from '@tests/factories/fulfilment'

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let packer: ApiClient
let buyerA: ApiClient
let buyerC: ApiClient
let anon: ApiClient
let soap: Sellable
let today: string
let netThirty: MadeOrder
let netFifteen: MadeOrder

const CONTRACT_KEYS = [
  'id',
  'number',
  'orderId',
  'shopId',
  'status',
  'issueDate',
  'dueDate',
  'totalCents',
  'paidCents',
]
const ALLOWED_EXTRA = ['orderNumber', 'shopName', 'kind', 'outstandingCents']

async function invoiceFor(orderId: number) {
  const [row] = await sequelize.query<{ id: number; number: string }>(
    `SELECT id, number FROM invoices WHERE order_id = $1 AND kind = 'invoice' AND voided_at IS NULL`,
    { bind: [orderId], type: QueryTypes.SELECT },
  )
  if (!row) throw new Error(`no invoice for order ${orderId}`)
  return row
}

beforeAll(async () => {
  ;[owner, packer, buyerA, buyerC, anon] = await Promise.all([
    clientAs(app, 'owner'),
    clientAs(app, 'packer'),
    clientAs(app, 'buyerA'),
    clientAs(app, 'buyerC'),
    clientAs(app, 'anon'),
  ])
  soap = await makeSellable(owner, { bars: 600, unitPriceCents: 1875 })
  today = await studioToday()
  netThirty = await makeOrder({
    shop: 'A',
    lines: [{ productId: soap.productId, cases: 3 }],
    status: 'shipped',
    poNumber: 'JV-PO-2231',
    notify: false,
  })
  netFifteen = await makeOrder({
    shop: 'C',
    lines: [{ productId: soap.productId, cases: 2 }],
    status: 'shipped',
    poNumber: 'QK-5567',
    notify: false,
  })
})

describe('GET /api/invoices', () => {
  it('gives the owner every invoice in the contract shape, with the allowed extras only', async () => {
    const r = expectStatus(await owner.get('/api/invoices'), 200)
    const mine = r.body.items.filter((i: { orderId: number }) =>
      [netThirty.orderId, netFifteen.orderId].includes(i.orderId),
    )
    expect(mine).toHaveLength(2)
    for (const item of r.body.items) {
      expect(Object.keys(item).sort()).toEqual([...CONTRACT_KEYS, ...ALLOWED_EXTRA].sort())
    }
    const a = mine.find((i: { orderId: number }) => i.orderId === netThirty.orderId)
    // 3 cases × 6 bars × $18.75; shipping by weight band; tax exempt (certificate on file).
    expect(a).toMatchObject({
      shopId: netThirty.shopId,
      status: 'open',
      issueDate: today,
      // Net 30: due 30 days after the invoice date (REFERENCES.md, common practice).
      dueDate: addDays(today, 30),
      paidCents: 0,
      orderNumber: netThirty.number,
      shopName: 'Juniper & Vine',
      kind: 'invoice',
    })
    expect(a.totalCents).toBe(a.outstandingCents)
    const c = mine.find((i: { orderId: number }) => i.orderId === netFifteen.orderId)
    // Net 15: due 15 days after the invoice date (the same rule; common practice).
    expect(c.dueDate).toBe(dueDate(today, 'net_15'))
    expect(c.dueDate).toBe(addDays(today, 15))
  })

  it('filters by shop, status and issue date', async () => {
    const byShop = expectStatus(await owner.get(`/api/invoices?shopId=${netFifteen.shopId}`), 200)
    expect(byShop.body.items.every((i: { shopId: number }) => i.shopId === netFifteen.shopId)).toBe(true)
    expect(byShop.body.items.map((i: { orderId: number }) => i.orderId)).toContain(netFifteen.orderId)
    const open = expectStatus(await owner.get('/api/invoices?status=open,part_paid'), 200)
    expect(open.body.items.every((i: { status: string }) => ['open', 'part_paid'].includes(i.status))).toBe(
      true,
    )
    const paid = expectStatus(await owner.get('/api/invoices?status=paid'), 200)
    expect(paid.body.items.map((i: { orderId: number }) => i.orderId)).not.toContain(netThirty.orderId)
    const past = expectStatus(await owner.get(`/api/invoices?to=${addDays(today, -1)}`), 200)
    expect(past.body.items.map((i: { orderId: number }) => i.orderId)).not.toContain(netThirty.orderId)
    const now = expectStatus(await owner.get(`/api/invoices?from=${today}&to=${today}`), 200)
    expect(now.body.items.map((i: { orderId: number }) => i.orderId)).toContain(netThirty.orderId)
  })

  it('gives a buyer their own shop’s invoices only; a packer none', async () => {
    const a = expectStatus(await buyerA.get('/api/invoices'), 200)
    expect(a.body.items.length).toBeGreaterThan(0)
    expect(a.body.items.every((i: { shopId: number }) => i.shopId === netThirty.shopId)).toBe(true)
    // Asking for another shop's is ignored: the buyer's own shop bounds the list.
    const other = expectStatus(await buyerA.get(`/api/invoices?shopId=${netFifteen.shopId}`), 200)
    expect(other.body.items.every((i: { shopId: number }) => i.shopId === netThirty.shopId)).toBe(true)
    expectStatus(await packer.get('/api/invoices'), 403)
    expectStatus(await anon.get('/api/invoices'), 401)
  })

  it('answers 400 with the field for bad filters', async () => {
    for (const [q, field] of [
      ['status=late', 'query.status.0'],
      ['shopId=abc', 'query.shopId'],
      ['from=2026-13-01', 'query.from'],
      [`from=${today}&to=${addDays(today, -3)}`, 'query.to'],
      ['kind=receipt', 'query.kind'],
    ] as const) {
      const r = expectStatus(await owner.get(`/api/invoices?${q}`), 400)
      expect(r.body.error.details.map((d: { field: string }) => d.field)).toContain(field)
    }
  })
})

describe('GET /api/invoices/:id and /pdf', () => {
  it('shows one invoice with its lines, bill-to, terms and shipment', async () => {
    const inv = await invoiceFor(netThirty.orderId)
    const r = expectStatus(await buyerA.get(`/api/invoices/${inv.id}`), 200)
    expect(r.body.invoice).toMatchObject({
      id: inv.id,
      number: inv.number,
      terms: 'net_30',
      poNumber: 'JV-PO-2231',
      billTo: { legalName: 'Juniper & Vine Mercantile Co.', tradingName: 'Juniper & Vine' },
      lines: [{ sku: soap.sku, cases: 3, bars: 18, unitPriceCents: 1875, lineTotalCents: 18 * 1875 }],
      shipment: { carrier: 'UPS', shipDate: today },
      creditNote: null,
      reminders: [],
    })
    expect(r.body.invoice.subtotalCents).toBe(18 * 1875)
    expect(r.body.invoice.totalCents).toBe(
      r.body.invoice.subtotalCents + r.body.invoice.shippingCents + r.body.invoice.taxCents,
    )
  })

  it('makes a PDF with the studio, bill-to, number, dates, terms, lines, totals, paid, due and PO', async () => {
    const inv = await invoiceFor(netFifteen.orderId)
    const detail = (await owner.get(`/api/invoices/${inv.id}`)).body.invoice
    const r = expectStatus(await buyerC.get(`/api/invoices/${inv.id}/pdf`).buffer(true).parse(binary), 200)
    expect(r.headers['content-type']).toMatch(/^application\/pdf/)
    expect(r.headers['content-disposition']).toContain(`invoice-${inv.number}.pdf`)
    keepPdf('invoice.pdf', r.body as Buffer)
    const text = await pdfText(r.body as Buffer)
    const money = (c: number) => formatCents(c, 'USD')
    for (const s of [
      'Brindlewick Soapery',
      `Invoice ${inv.number}`,
      'Quiet Kettle Wellness Supply Inc.',
      '4100 Commerce Park Dr',
      netFifteen.number,
      'QK-5567',
      'Net 15',
      formatDate(today),
      formatDate(addDays(today, 15)),
      soap.sku,
      money(1875),
      money(detail.subtotalCents),
      money(detail.shippingCents),
      money(detail.totalCents),
      'Amount due',
    ]) {
      expect(text).toContain(s)
    }
  })

  it('answers 404 for another shop’s invoice, 403 to a packer, 401 signed out', async () => {
    const inv = await invoiceFor(netFifteen.orderId)
    expectStatus(await buyerA.get(`/api/invoices/${inv.id}`), 404)
    expectStatus(await buyerA.get(`/api/invoices/${inv.id}/pdf`), 404)
    expectStatus(await packer.get(`/api/invoices/${inv.id}`), 403)
    expectStatus(await packer.get(`/api/invoices/${inv.id}/pdf`), 403)
    expectStatus(await anon.get(`/api/invoices/${inv.id}/pdf`), 401)
    expectStatus(await owner.get('/api/invoices/99999999'), 404)
    expectStatus(await owner.get('/api/invoices/abc'), 400)
  })
})

describe('POST /api/invoices/:id/void', () => {
  it('voids the invoice and issues a credit note of the same totals with the next number', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'shipped',
      notify: false,
    })
    const inv = await invoiceFor(o.orderId)
    const before = await snapshot()
    const r = expectStatus(
      await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'Shipped to the wrong store' }),
      200,
    )
    expect(r.body.invoice).toMatchObject({
      id: inv.id,
      number: inv.number,
      status: 'void',
      outstandingCents: 0,
      voidReason: 'Shipped to the wrong store',
    })
    expect(r.body.creditNote).toMatchObject({
      kind: 'credit_note',
      status: 'credit',
      orderId: o.orderId,
      totalCents: r.body.invoice.totalCents,
      subtotalCents: r.body.invoice.subtotalCents,
      shippingCents: r.body.invoice.shippingCents,
      taxCents: r.body.invoice.taxCents,
      creditsInvoice: { id: inv.id, number: inv.number },
      issueDate: today,
    })
    expect(r.body.invoice.creditNote).toEqual({ id: r.body.creditNote.id, number: r.body.creditNote.number })
    expect(parseInvoiceNumber(r.body.creditNote.number, 'LC')!.seq).toBe(before.counts.last_seq + 1)
    const after = await snapshot()
    expect(after.counts.invoices).toBe(before.counts.invoices + 1)

    const mail = await waitForMail(o.buyerEmail, new RegExp(`Credit note ${r.body.creditNote.number}`))
    expect(mail.attachments?.[0]).toMatchObject({
      contentType: 'application/pdf',
      filename: `credit-note-${r.body.creditNote.number}.pdf`,
    })
    const pdf = expectStatus(
      await owner.get(`/api/invoices/${r.body.creditNote.id}/pdf`).buffer(true).parse(binary),
      200,
    )
    keepPdf('credit-note.pdf', pdf.body as Buffer)
    expect(await pdfText(pdf.body as Buffer)).toContain(`Credits invoice`)

    // Never deleted or renumbered: the database itself refuses.
    await expect(sequelize.query('DELETE FROM invoices WHERE id = $1', { bind: [inv.id] })).rejects.toThrow(
      /never deleted/,
    )
    await expect(
      sequelize.query(`UPDATE invoices SET number = 'X' WHERE id = $1`, { bind: [inv.id] }),
    ).rejects.toThrow(/keeps its number/)
  })

  it('refuses a void invoice, a credit note, and an invoice with payments (409), writing nothing', async () => {
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'shipped',
      notify: false,
    })
    const inv = await invoiceFor(o.orderId)
    const voided = expectStatus(
      await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'Duplicate order' }),
      200,
    )
    const before = await snapshot()
    expect(
      expectStatus(await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'Again' }), 409).body.error
        .code,
    ).toBe('already_void')
    expect(
      expectStatus(
        await owner.post(`/api/invoices/${voided.body.creditNote.id}/void`, { reason: 'Nope' }),
        409,
      ).body.error.code,
    ).toBe('not_voidable')

    const paidOrder = await makeOrder({
      shop: 'C',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'shipped',
      notify: false,
    })
    const paid = await invoiceFor(paidOrder.orderId)
    expectStatus(
      await owner.post(`/api/invoices/${paid.id}/payments`, {
        method: 'card',
        amountCents: 500,
        receivedOn: today,
      }),
      201,
    )
    const mid = await snapshot()
    const r = expectStatus(await owner.post(`/api/invoices/${paid.id}/void`, { reason: 'Changed mind' }), 409)
    expect(r.body.error.code).toBe('invoice_has_payments')
    expect(await snapshot()).toEqual(mid)
    expect(mid.counts.invoices).toBe(before.counts.invoices + 1)
  })

  it('checks the reason and its callers', async () => {
    const inv = await invoiceFor(netThirty.orderId)
    for (const body of [{}, { reason: '' }, { reason: 'x'.repeat(501) }]) {
      const r = expectStatus(await owner.post(`/api/invoices/${inv.id}/void`, body), 400)
      expect(r.body.error.details[0].field).toBe('reason')
    }
    expectStatus(await buyerA.post(`/api/invoices/${inv.id}/void`, { reason: 'Please' }), 403)
    expectStatus(await anon.post(`/api/invoices/${inv.id}/void`, { reason: 'Please' }), 401)
    expectStatus(await owner.post('/api/invoices/99999999/void', { reason: 'Missing one' }), 404)
    expect((await owner.get(`/api/invoices/${inv.id}`)).body.invoice.status).toBe('open')
  })
})

describe('POST /api/orders/:id/invoice', () => {
  it('refuses a second invoice for one order (409 invoice_exists) and writes nothing', async () => {
    const before = await snapshot()
    const r = expectStatus(await owner.post(`/api/orders/${netThirty.orderId}/invoice`), 409)
    expect(r.body.error.code).toBe('invoice_exists')
    expect(r.body.error.details[0]).toMatchObject({
      field: 'orderId',
      number: (await invoiceFor(netThirty.orderId)).number,
    })
    expect(await snapshot()).toEqual(before)
  })

  it('raises a new invoice after the old one was voided', async () => {
    const o = await makeOrder({
      shop: 'C',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'shipped',
      notify: false,
    })
    const old = await invoiceFor(o.orderId)
    expectStatus(await owner.post(`/api/invoices/${old.id}/void`, { reason: 'Wrong terms' }), 200)
    const r = expectStatus(await owner.post(`/api/orders/${o.orderId}/invoice`), 201)
    expect(r.body.invoice).toMatchObject({ orderId: o.orderId, kind: 'invoice', status: 'open' })
    expect(r.body.invoice.number).not.toBe(old.number)
  })

  it('refuses an order that is not yet due an invoice, and answers 403/401/404', async () => {
    const confirmed = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 2 }],
      status: 'confirmed',
    })
    const before = await snapshot()
    const r = expectStatus(await owner.post(`/api/orders/${confirmed.orderId}/invoice`), 409)
    expect(r.body.error.code).toBe('order_not_invoiceable')
    expect(await snapshot()).toEqual(before)
    expectStatus(await buyerA.post(`/api/orders/${confirmed.orderId}/invoice`), 403)
    expectStatus(await packer.post(`/api/orders/${confirmed.orderId}/invoice`), 403)
    expectStatus(await anon.post(`/api/orders/${confirmed.orderId}/invoice`), 401)
    expectStatus(await owner.post('/api/orders/99999999/invoice'), 404)
  })
})

describe('POST /api/invoices/:id/send', () => {
  it('e-mails the invoice again with its PDF', async () => {
    const inv = await invoiceFor(netFifteen.orderId)
    const shop = await demoShop('C')
    const r = expectStatus(await owner.post(`/api/invoices/${inv.id}/send`), 200)
    expect(r.body.sentTo).toContain(shop.email)
    const mail = await waitForMail(
      shop.email,
      new RegExp(`Invoice ${inv.number} from Brindlewick Soapery \\(copy\\)`),
    )
    expect(mail.attachments?.[0]).toMatchObject({
      contentType: 'application/pdf',
      filename: `invoice-${inv.number}.pdf`,
    })
    expectStatus(await buyerC.post(`/api/invoices/${inv.id}/send`), 403)
    expectStatus(await anon.post(`/api/invoices/${inv.id}/send`), 401)
    expectStatus(await owner.post('/api/invoices/99999999/send'), 404)
  })
})

describe('GET /api/invoices.csv', () => {
  it('exports the invoices for the bookkeeper as a CSV attachment', async () => {
    const r = expectStatus(await owner.get(`/api/invoices.csv?shopId=${netThirty.shopId}`), 200)
    expect(r.headers['content-type']).toMatch(/^text\/csv/)
    expect(r.headers['content-disposition']).toMatch(
      /^attachment; filename="invoices-\d{4}-\d{2}-\d{2}\.csv"$/,
    )
    const [header, ...rows] = parseCsv(r.text).map((x) => x.fields)
    expect(header).toEqual([
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
    ])
    const inv = await invoiceFor(netThirty.orderId)
    const row = rows.find((x) => x[0] === inv.number)!
    expect(row.slice(1, 8)).toEqual([
      'Invoice',
      today,
      addDays(today, 30),
      'Juniper & Vine',
      netThirty.number,
      'JV-PO-2231',
      'Net 30',
    ])
    expect(row[8]).toBe(((18 * 1875) / 100).toFixed(2))
    expect(rows.every((x) => x[4] === 'Juniper & Vine')).toBe(true)
  })

  it('keeps a shop name that looks like a formula from running in a spreadsheet', async () => {
    const shop = await demoShop('C')
    await sequelize.query(`UPDATE shops SET trading_name = '=HYPERLINK("x")' WHERE id = $1`, {
      bind: [shop.shopId],
    })
    try {
      const r = expectStatus(await owner.get(`/api/invoices.csv?shopId=${shop.shopId}`), 200)
      const rows = parseCsv(r.text).slice(1)
      expect(rows.length).toBeGreaterThan(0)
      expect(rows.every((x) => x.fields[4] === `'=HYPERLINK("x")`)).toBe(true)
    } finally {
      await sequelize.query('UPDATE shops SET trading_name = $2 WHERE id = $1', {
        bind: [shop.shopId, shop.tradingName],
      })
    }
  })

  it('is for the owner only', async () => {
    expectStatus(await buyerA.get('/api/invoices.csv'), 403)
    expectStatus(await packer.get('/api/invoices.csv'), 403)
    expectStatus(await anon.get('/api/invoices.csv'), 401)
    expect(
      expectStatus(await owner.get('/api/invoices.csv?status=soon'), 400).body.error.details[0].field,
    ).toBe('query.status.0')
  })
})
