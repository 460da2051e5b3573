/**
 * The packer's day and the buyer's invoice, through the UI: the packer opens the queue, claims an
 * order, prints a pick list (the PDF downloads), records the order packed and ships it; the buyer
 * then signs in and downloads the invoice PDF. The order is the test's own: the buyer places it
 * through the API (one case each of three products others do not order) and the owner confirms it.
 */
import fs from 'node:fs'
import path from 'node:path'
import { randomUUID } from 'node:crypto'
import { PDFParse } from 'pdf-parse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { waitForMail } from '@tests/factories/mail'
import { DEMO } from '@tests/factories/api-client'
import { axeViolations, call, launch, newPage, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

const PO = `JV-E2E-${randomUUID().slice(0, 6).toUpperCase()}`
let order: { id: number; number: string } | null = null
let invoiceNumber = ''

async function pdfText(file: string) {
  const parser = new PDFParse({ data: new Uint8Array(fs.readFileSync(file)) })
  try {
    return (await parser.getText()).text
  } finally {
    await parser.destroy()
  }
}

function keep(name: string, file: string) {
  const dir = path.resolve('test-results', 'pdf')
  fs.mkdirSync(dir, { recursive: true })
  fs.copyFileSync(file, path.join(dir, name))
}

describe('the packer packs and ships; the buyer downloads the invoice', () => {
  it('an order is placed by the buyer and confirmed by the studio', async () => {
    const buyer = await newPage(browser)
    await signIn(buyer.page, 'buyerA')
    const catalogue = await call(buyer.page, 'GET', '/api/catalogue')
    const pick = ['UNS', 'GCL', 'UNS-XL'].map((sku) => {
      const item = catalogue.items.find((i: { sku: string }) => i.sku === sku)
      if (!item || item.readyCases < 1) throw new Error(`the demo has no ready case of ${sku}`)
      return item.productId as number
    })
    const placed = await call(
      buyer.page,
      'POST',
      '/api/orders',
      { lines: pick.map((productId) => ({ productId, cases: 1 })), poNumber: PO },
      { 'Idempotency-Key': randomUUID() },
    )
    order = { id: placed.order.id, number: placed.order.number }
    await buyer.context.close()

    const owner = await newPage(browser)
    await signIn(owner.page, 'owner')
    await call(owner.page, 'POST', `/api/orders/${order.id}/confirm`)
    await owner.context.close()
  })

  it('the packer claims it, prints a pick list, records it packed and ships it', async () => {
    expect(order).not.toBeNull()
    const { page, context } = await newPage(browser)
    await signIn(page, 'packer')
    await page.waitForURL(/\/packing$/)
    await page.getByRole('heading', { level: 1, name: 'Packing' }).waitFor()
    const row = page.getByRole('row').filter({ hasText: order!.number })
    await row.waitFor()
    await expect.poll(() => row.getByText('Juniper & Vine').isVisible()).toBe(true)
    await expect.poll(() => row.getByText('Not claimed').isVisible()).toBe(true)
    // No price anywhere on the packer's screen.
    expect(await page.locator('main').innerText()).not.toMatch(/\$\s?\d/)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'packing-queue')

    await row.getByRole('button', { name: `Claim ${order!.number}` }).click()
    await expect.poll(() => page.getByText(`${order!.number} is yours to pack.`).isVisible()).toBe(true)
    await expect.poll(() => row.getByText('You').isVisible()).toBe(true)

    // Tick it for the pick list: the on-screen list appears, and the PDF downloads.
    await page.getByLabel(`Add ${order!.number} to the pick list`).check()
    const pickList = page.getByRole('heading', { level: 2, name: 'Pick list' })
    await pickList.waitFor()
    // In walking order, shelf by shelf: each shelf a heading, each lot with its product and lot code.
    await expect
      .poll(() =>
        page
          .getByRole('list', { name: /^Lots on / })
          .getByText(/^\d{6}-UNS-XL-\d{2}$/)
          .isVisible(),
      )
      .toBe(true)
    await screenshot(page, 'packing-pick-list')
    // Print opens the PDF in a tab of its own; the download link saves it.
    const [tab] = await Promise.all([
      context.waitForEvent('page'),
      page.getByRole('link', { name: /^Print pick list/ }).click(),
    ])
    await expect.poll(() => tab.url()).toContain(`/api/pick-list.pdf?orders=${order!.id}`)
    const printed = await tab.request.get(tab.url())
    expect(printed.headers()['content-type']).toMatch(/^application\/pdf/)
    await tab.close()
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download pick list (PDF)' }).click(),
    ])
    const file = await download.path()
    expect(fs.readFileSync(file).subarray(0, 5).toString()).toBe('%PDF-')
    keep('e2e-pick-list.pdf', file)
    const text = await pdfText(file)
    expect(text).toContain(order!.number)
    expect(text).toMatch(/\d{6}-UNS-XL-\d{2}/)
    expect(text).not.toMatch(/\$\s?\d/)

    // The order's page: lines with lot codes, tick boxes, the packed form prefilled.
    await page.getByRole('link', { name: order!.number }).first().click()
    await page.waitForURL(/\/packing\/orders\/\d+$/)
    await page.getByRole('heading', { level: 1, name: `Order ${order!.number}` }).waitFor()
    await page
      .getByRole('list', { name: /Batch lots for UNS$/ })
      .getByText(/^\d{6}-UNS-\d{2}$/)
      .waitFor()
    for (const sku of ['UNS', 'GCL', 'UNS-XL']) await page.getByLabel(new RegExp(`^Packed ${sku} `)).check()
    await page.getByLabel('Cartons').fill('2')
    await page.getByLabel('Packed weight (g)').fill('3400')
    expect(await page.getByLabel(/^UNS-XL · /).inputValue()).toBe('8')
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'packing-order')
    expect(await page.locator('main').innerText()).not.toMatch(/\$\s?\d/)

    // A wrong count is refused with the line at fault; the right one is recorded.
    await page.getByLabel(/^GCL · /).fill('9')
    await page.getByRole('button', { name: 'Record packed' }).click()
    await expect
      .poll(() =>
        page
          .getByText(/GCL: 10 bars are allocated/)
          .first()
          .isVisible(),
      )
      .toBe(true)
    await page.getByLabel(/^GCL · /).fill('10')
    await page.getByRole('button', { name: 'Record packed' }).click()
    await expect
      .poll(() => page.getByText(`${order!.number} is packed. Ship it when the carrier comes.`).isVisible())
      .toBe(true)

    await page.getByRole('heading', { level: 2, name: 'Ship', exact: true }).waitFor()
    await page.getByLabel('Carrier').fill('UPS')
    await page.getByLabel('Tracking number').fill('1Z E2E 4471 0098')
    await screenshot(page, 'packing-ship')
    await page.getByRole('button', { name: 'Ship order' }).click()
    const shipped = page.getByText(
      new RegExp(`${order!.number} shipped\\. Invoice (\\S+) raised and sent\\.`),
    )
    await expect.poll(() => shipped.isVisible(), { timeout: 15_000 }).toBe(true)
    invoiceNumber = /Invoice (\S+) raised/.exec((await shipped.textContent()) ?? '')![1]!
    await page.getByText('1Z E2E 4471 0098').waitFor()
    await screenshot(page, 'packing-shipped')

    const mail = await waitForMail(
      DEMO.buyerA.email,
      new RegExp(`Order ${order!.number} has shipped: UPS 1Z E2E 4471 0098`),
    )
    expect(mail.attachments?.[0]?.contentType).toBe('application/pdf')
    await context.close()

    // On a phone the queue still works: the table scrolls sideways inside its card.
    const phone = await newPage(browser, { width: 375, height: 740 })
    await signIn(phone.page, 'packer')
    await phone.page.getByRole('heading', { level: 1, name: 'Packing' }).waitFor()
    await phone.page.getByRole('heading', { level: 2, name: /Packed, waiting for the carrier/ }).waitFor()
    await phone.page.waitForLoadState('networkidle')
    expect(await axeViolations(phone.page)).toEqual([])
    await screenshot(phone.page, 'packing-queue-phone')
    await phone.context.close()
  })

  it('the buyer finds the invoice and downloads its PDF', async () => {
    expect(invoiceNumber).not.toBe('')
    const { page, context } = await newPage(browser)
    await signIn(page, 'buyerA')
    await page.getByRole('link', { name: 'Invoices' }).click()
    await page.waitForURL(/\/shop\/invoices$/)
    await page.getByRole('heading', { level: 1, name: 'Invoices' }).waitFor()
    const row = page.getByRole('row').filter({ hasText: invoiceNumber })
    await row.waitFor()
    await expect.poll(() => row.getByText('Open').isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'buyer-invoices')

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      row.getByRole('link', { name: `Download invoice ${invoiceNumber} (PDF)` }).click(),
    ])
    const file = await download.path()
    keep('e2e-invoice.pdf', file)
    const text = await pdfText(file)
    for (const s of [
      `Invoice ${invoiceNumber}`,
      order!.number,
      PO,
      'Juniper & Vine Mercantile Co.',
      'Net 30',
      'Amount due',
    ]) {
      expect(text).toContain(s)
    }
    expect(text).toMatch(/\$\d+\.\d{2}/)
    await context.close()
  })

  it('the owner sees it among the invoices and the receivables', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Invoices' }).click()
    await page.waitForURL(/\/studio\/invoices$/)
    await page.getByRole('row').filter({ hasText: invoiceNumber }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-invoices')
    await page.getByRole('link', { name: invoiceNumber }).click()
    await page.getByRole('heading', { level: 1, name: `Invoice ${invoiceNumber}` }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-invoice')

    // A payment larger than owed is refused on the amount; a part payment is recorded.
    await page.getByRole('button', { name: 'Record a payment' }).click()
    const dialog = page.getByRole('dialog', { name: `Record a payment on ${invoiceNumber}` })
    await dialog.getByLabel('Amount').fill('99999')
    await dialog.getByRole('button', { name: 'Record payment' }).click()
    await expect
      .poll(() =>
        dialog
          .getByText(/is owed on invoice/)
          .first()
          .isVisible(),
      )
      .toBe(true)
    await screenshot(page, 'owner-payment-refused')
    await dialog.getByLabel('Amount').fill('50.00')
    await dialog.getByLabel('Method').selectOption('cheque')
    await dialog.getByLabel(/Reference/).fill('Cheque 3310')
    await dialog.getByRole('button', { name: 'Record payment' }).click()
    await expect
      .poll(() => page.getByText(`$50.00 recorded against ${invoiceNumber}.`).isVisible())
      .toBe(true)
    await expect.poll(() => page.locator('header').getByText('Part paid').isVisible()).toBe(true)
    await page.getByText('Cheque 3310', { exact: false }).waitFor()

    await page.getByRole('link', { name: 'Receivables' }).click()
    await page.waitForURL(/\/studio\/receivables$/)
    await page.getByRole('heading', { level: 2, name: 'By shop' }).waitFor()
    await page.getByRole('img', { name: /Amount owed by age/ }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-receivables')
    await context.close()
  })
})
