/**
 * A prepay account's order on the bench and on the owner's order page: Harbor Lane (prepay) places
 * an order, the owner confirms it (the invoice is raised at once), the packer sees that payment is
 * awaited on the queue and on the order, packs it, and finds no way to ship it. The owner's order
 * page says the same and links to the packing view, the packing slip and the invoice; once the
 * payment is recorded the order can ship.
 */
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { axeViolations, call, launch, newPage, ownStockLines, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

const PO = `HL-E2E-${randomUUID().slice(0, 6).toUpperCase()}`
let order: { id: number; number: string; invoiceId: number; invoiceNumber: string; totalCents: number }

describe('a prepay order waits for its payment before it ships', () => {
  it('Harbor Lane orders and the studio confirms: the invoice is raised at confirmation', async () => {
    const buyer = await newPage(browser)
    await signIn(buyer.page, 'buyerB')
    // Over the reorder minimum (150.00, the settings' default), from a batch poured for this test.
    const lines = await ownStockLines(browser, buyer.page, 'CDR-MINI', 20_000)
    const placed = await call(
      buyer.page,
      'POST',
      '/api/orders',
      { lines, poNumber: PO },
      { 'Idempotency-Key': randomUUID() },
    )
    await buyer.context.close()

    const owner = await newPage(browser)
    await signIn(owner.page, 'owner')
    await call(owner.page, 'POST', `/api/orders/${placed.order.id}/confirm`)
    const detail = (await call(owner.page, 'GET', `/api/orders/${placed.order.id}`)).order
    expect(detail.awaitingPayment).toBe(true)
    order = {
      id: placed.order.id,
      number: placed.order.number,
      invoiceId: detail.invoice.id,
      invoiceNumber: detail.invoice.number,
      totalCents: detail.totalCents,
    }
    await owner.context.close()
  })

  it('the packer sees payment awaited on the queue and the order, packs it, and cannot ship it', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'packer')
    await page.getByRole('heading', { level: 1, name: 'Packing' }).waitFor()
    const row = page.getByRole('row').filter({ hasText: order.number })
    await row.waitFor()
    await expect.poll(() => row.getByText('Payment awaited').isVisible()).toBe(true)
    await screenshot(page, 'prepay-packing-queue')

    await row.getByRole('button', { name: `Claim ${order.number}` }).click()
    await expect.poll(() => page.getByText(`${order.number} is yours to pack.`).isVisible()).toBe(true)
    await row.getByRole('link', { name: `Continue ${order.number}` }).click()
    await page.getByRole('heading', { level: 1, name: `Order ${order.number}` }).waitFor()
    const note = page.getByRole('note', { name: 'Payment awaited' })
    await expect.poll(() => note.isVisible()).toBe(true)
    expect(await note.innerText()).toMatch(
      /can be packed now; it can ship once the studio records the payment/,
    )
    // No amount on the packer's screen, the note included.
    expect(await page.locator('main').innerText()).not.toMatch(/\$\s?\d/)

    // Pack it: the packed form is prefilled with the allocated bars.
    for (const box of await page.getByRole('checkbox', { name: /^Packed / }).all()) await box.check()
    await page.getByLabel('Cartons').fill('2')
    await page.getByLabel('Packed weight (g)').fill('4200')
    await page.getByRole('button', { name: 'Record packed' }).click()
    await expect
      .poll(() => page.getByText(`${order.number} is packed. Ship it when the carrier comes.`).isVisible())
      .toBe(true)
    await page.getByRole('heading', { level: 2, name: 'Ship', exact: true }).waitFor()
    await expect
      .poll(() => page.getByText('Shipping opens once the prepay invoice is paid.').isVisible())
      .toBe(true)
    expect(await page.getByRole('button', { name: 'Ship order' }).count()).toBe(0)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'prepay-packer-order')

    // Back on the queue it waits among the packed orders, to open but not to ship.
    await page.goto('/packing')
    const waiting = page
      .getByRole('table', { name: 'Packed orders waiting for the carrier' })
      .getByRole('row')
      .filter({ hasText: order.number })
    await waiting.waitFor()
    await expect.poll(() => waiting.getByText('Payment awaited').isVisible()).toBe(true)
    await waiting.getByRole('link', { name: `View ${order.number}` }).waitFor()
    expect(await waiting.getByRole('link', { name: `Ship ${order.number}` }).count()).toBe(0)
    await context.close()
  })

  it('the owner sees it on the order page, with links to packing, the slip and the invoice', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.goto(`/studio/orders/${order.id}`)
    await page.getByRole('heading', { level: 1, name: new RegExp(`Order ${order.number}`) }).waitFor()
    const note = page.getByRole('note', { name: 'Payment awaited' })
    await expect.poll(() => note.isVisible()).toBe(true)
    expect(await note.innerText()).toContain(order.invoiceNumber)

    const links = page.getByRole('navigation', { name: 'Packing and invoice' })
    expect(await links.getByRole('link', { name: 'Packing view' }).getAttribute('href')).toBe(
      `/studio/packing/orders/${order.id}`,
    )
    const slip = links.getByRole('link', { name: 'Packing slip (PDF)' })
    expect(await slip.getAttribute('href')).toBe(`/api/orders/${order.id}/packing-slip.pdf`)
    const pdf = await page.request.get(`/api/orders/${order.id}/packing-slip.pdf`)
    expect(pdf.headers()['content-type']).toMatch(/^application\/pdf/)
    expect(
      await links.getByRole('link', { name: `Invoice ${order.invoiceNumber}` }).getAttribute('href'),
    ).toBe(`/studio/invoices/${order.invoiceId}`)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'prepay-owner-order')

    // The invoice link opens the invoice; once paid, the note is gone and the packing view can ship.
    await links.getByRole('link', { name: `Invoice ${order.invoiceNumber}` }).click()
    await page.waitForURL(new RegExp(`/studio/invoices/${order.invoiceId}$`))
    await call(page, 'POST', `/api/invoices/${order.invoiceId}/payments`, {
      method: 'card',
      amountCents: order.totalCents,
      receivedOn: new Date().toISOString().slice(0, 10),
      reference: 'Card ending 3307',
    })
    await page.goto(`/studio/orders/${order.id}`)
    await page.getByRole('navigation', { name: 'Packing and invoice' }).waitFor()
    expect(await page.getByRole('note', { name: 'Payment awaited' }).count()).toBe(0)
    await page.getByRole('link', { name: 'Packing view' }).click()
    await page.waitForURL(new RegExp(`/studio/packing/orders/${order.id}$`))
    await page.getByRole('button', { name: 'Ship order' }).waitFor()
    await context.close()
  })

  it('an order not yet confirmed has no packing or invoice links', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    const placed = await call(page, 'GET', '/api/orders?status=placed')
    const o = placed.items[0]
    expect(o).toBeTruthy()
    await page.goto(`/studio/orders/${o.id}`)
    await page.getByRole('heading', { level: 1, name: new RegExp(`Order ${o.number}`) }).waitFor()
    await page.getByRole('button', { name: 'Confirm order' }).waitFor()
    expect(await page.getByRole('navigation', { name: 'Packing and invoice' }).count()).toBe(0)
    await context.close()
  })
})
