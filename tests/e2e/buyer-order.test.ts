/**
 * A buyer orders from the catalogue through the UI: filters it, adds cases, meets the minimum in
 * the cart, places the order with a PO number, finds it in their orders (and in the CSV), and the
 * "placed" e-mail arrives in the mail catcher. Then the owner finds it, sees its lot codes and
 * confirms it. Screenshots at desktop and phone widths.
 */
import fs from 'node:fs'
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { DEMO_SHOPS } from '../../seeders/demo/scenario'
import { waitForMail } from '@tests/factories/mail'
import { axeViolations, launch, newPage, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

const buyer = DEMO_SHOPS[0]!
const po = `JV-${randomUUID().slice(0, 6).toUpperCase()}`
let orderNumber = ''

/** The catalogue row (wide) or card (phone) of one product, found by its stepper's label. */
const productIn = (page: Page, name: string, container: 'row' | 'listitem') =>
  page.getByRole(container).filter({ has: page.getByLabel(`Cases of ${name}`, { exact: true }) })

describe('a buyer places a case order', () => {
  it('from the catalogue through the cart to the order, with the e-mail', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'buyerA')
    await page.waitForURL(/\/shop$/)
    await page.getByRole('link', { name: 'Browse the catalogue' }).click()
    await page.waitForURL(/\/shop\/catalogue$/)
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Catalogue' }).isVisible()).toBe(true)

    // Filter: ready stock only, then a search.
    await page.getByLabel('Show').selectOption('ready')
    await page.getByLabel('Search').fill('lavender')
    const lavender = productIn(page, 'Lavender Field', 'row')
    await expect.poll(() => lavender.isVisible()).toBe(true)
    await expect.poll(() => lavender.getByText(/Ready now: \d+ cases/).isVisible()).toBe(true)
    // Only the shop's own tier (Preferred): 1 case $4.65 a bar (seeders/demo/catalogue.ts).
    await expect.poll(() => lavender.getByText('$4.65').first().isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'buyer-catalogue')

    // One case first: below the reorder minimum.
    await lavender.getByRole('button', { name: 'Add to cart' }).click()
    await expect
      .poll(() => page.getByText(/1 case of Lavender Field added to the cart/).isVisible())
      .toBe(true)
    await page.getByRole('link', { name: /^Cart/ }).first().click()
    await page.waitForURL(/\/shop\/cart$/)
    await expect.poll(() => page.getByText(/Add \$[\d.,]+ more merchandise to/).isVisible()).toBe(true)
    await expect.poll(() => page.getByText('Reorder minimum').isVisible()).toBe(true)
    await expect.poll(() => page.getByText('Tax exempt (certificate on file)').isVisible()).toBe(true)
    expect(await page.getByRole('button', { name: 'Place order' }).isDisabled()).toBe(true)
    await screenshot(page, 'buyer-cart-below-minimum')

    // Enough cases of a second product to meet the minimum, chosen from what the demo has ready
    // (leaving alone the products the packing flow orders).
    const { cart } = await (await page.request.get('/api/cart')).json()
    const { items } = await (await page.request.get('/api/catalogue')).json()
    type Item = {
      sku: string
      name: string
      casePack: number
      readyCases: number
      priceBreaks: { unitPriceCents: number }[]
    }
    const second = (items as Item[])
      .filter((i) => !['LAV', 'UNS', 'GCL', 'UNS-XL'].includes(i.sku) && i.readyCases > 0)
      .sort(
        (a, b) =>
          b.readyCases * b.casePack * b.priceBreaks[0]!.unitPriceCents -
          a.readyCases * a.casePack * a.priceBreaks[0]!.unitPriceCents,
      )[0]!
    // The lowest break bounds the price from below, so this many cases surely meets the minimum.
    const lowest = Math.min(...second.priceBreaks.map((b) => b.unitPriceCents))
    const needed = Math.ceil(cart.belowMinimumByCents / (lowest * second.casePack))
    if (needed > second.readyCases)
      throw new Error(`the demo has too little ready stock of ${second.sku} for this test`)
    await page.getByRole('link', { name: 'Catalogue' }).first().click()
    await page.getByLabel('Search').fill(second.name)
    const row = productIn(page, second.name, 'row')
    await row.getByLabel(`Cases of ${second.name}`, { exact: true }).fill(String(needed))
    await row.getByRole('button', { name: 'Add to cart' }).click()
    await expect.poll(() => page.getByText(new RegExp(`added to the cart`)).last().isVisible()).toBe(true)
    await page.getByRole('link', { name: /^Cart/ }).first().click()
    await page.waitForURL(/\/shop\/cart$/)
    await expect.poll(() => page.getByText('Your order meets the minimum.').isVisible()).toBe(true)
    await expect.poll(() => page.getByText('12 bars').first().isVisible()).toBe(true)
    await page.getByLabel(/PO number/).fill(po)
    await page.getByLabel(/Note to the studio/).fill('For the winter window, please.')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'buyer-cart-ready')

    // A double click still makes one order (one Idempotency-Key per attempt).
    await page.getByRole('button', { name: 'Place order' }).dblclick()
    await page.waitForURL(/\/shop\/orders\/\d+$/)
    const heading = page.getByRole('heading', { level: 1, name: /Order O\d{2}-\d{5}/ })
    await expect.poll(() => heading.isVisible()).toBe(true)
    orderNumber = /O\d{2}-\d{5}/.exec((await heading.textContent()) ?? '')![0]
    await expect.poll(() => page.getByText(`Your PO ${po}`).isVisible()).toBe(true)
    await expect.poll(() => page.getByRole('button', { name: 'Cancel order' }).isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'buyer-order')

    // In the list of orders, once, and in its CSV.
    await page.getByRole('link', { name: 'All orders' }).click()
    await page.waitForURL(/\/shop\/orders$/)
    await expect.poll(() => page.getByRole('link', { name: orderNumber }).isVisible()).toBe(true)
    expect(await page.getByRole('cell', { name: po }).count()).toBe(1)
    await screenshot(page, 'buyer-orders')
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download CSV' }).click(),
    ])
    const csv = fs.readFileSync((await download.path())!, 'utf8')
    // One row per line: Lavender Field and the second product.
    expect(csv.split('\r\n').filter((l) => l.startsWith(orderNumber))).toHaveLength(2)
    expect(csv).toContain(`,${po},LAV,Lavender Field,1,12,`)

    const mail = await waitForMail(buyer.buyer.email, new RegExp(`Order ${orderNumber} placed`))
    expect(mail.text).toContain(po)
    expect(mail.text).toContain('1 case of Lavender Field (LAV), 12 bars')
    await context.close()
  })

  it('works on a phone: catalogue cards, the cart and the order', async () => {
    const { page, context } = await newPage(browser, { width: 375, height: 740 })
    await signIn(page, 'buyerA')
    await page.goto('/shop/catalogue')
    await page.getByLabel('Search').fill('cedar')
    const cedar = productIn(page, 'Cedar & Sage', 'listitem')
    await expect.poll(() => cedar.isVisible()).toBe(true)
    await screenshot(page, 'phone-buyer-catalogue')
    await cedar.getByRole('button', { name: 'One case more' }).click()
    await cedar.getByRole('button', { name: 'Add to cart' }).click()
    await expect.poll(() => page.getByText(/2 cases of Cedar & Sage added/).isVisible()).toBe(true)
    await page.goto('/shop/cart')
    await expect
      .poll(() =>
        page.getByRole('list', { name: 'Lines in your cart' }).getByText('Cedar & Sage').isVisible(),
      )
      .toBe(true)
    await screenshot(page, 'phone-buyer-cart')
    // Out again: the cart stays as the next test found it.
    await page.getByRole('button', { name: 'Remove Cedar & Sage' }).click()
    await expect.poll(() => page.getByText('Your cart is empty').isVisible()).toBe(true)
    await page.goto('/shop/orders')
    await expect.poll(() => page.getByRole('link', { name: orderNumber }).isVisible()).toBe(true)
    await page.getByRole('link', { name: orderNumber }).click()
    await expect
      .poll(() => page.getByRole('heading', { level: 1, name: new RegExp(orderNumber) }).isVisible())
      .toBe(true)
    await screenshot(page, 'phone-buyer-order')
    await context.close()
  })

  it('the owner finds it, sees the lots behind each line and confirms it', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Orders' }).click()
    await page.waitForURL(/\/studio\/orders$/)
    await page.getByLabel('Shop').selectOption({ label: buyer.tradingName })
    await page.getByLabel('Status').selectOption('placed')
    await expect.poll(() => page.getByRole('link', { name: orderNumber }).isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-orders')
    await page.getByRole('link', { name: orderNumber }).click()
    await page.waitForURL(/\/studio\/orders\/\d+$/)
    // The lot code of the batch the bars come from (pour date, SKU, pour of the day).
    await expect
      .poll(() =>
        page
          .getByText(/^\d{6}-LAV-\d{2}$/)
          .first()
          .isVisible(),
      )
      .toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-order')
    // The line editor offers the shop's catalogue with its stock; nothing is saved here.
    await page.getByRole('button', { name: 'Change lines' }).click()
    const editor = page.getByRole('dialog', { name: `Change the lines of ${orderNumber}` })
    await expect
      .poll(() => editor.getByLabel('Cases of Lavender Field', { exact: true }).isVisible())
      .toBe(true)
    await expect.poll(() => editor.getByLabel('Add a product').isVisible()).toBe(true)
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-order-edit-lines')
    await editor.getByRole('button', { name: 'Discard changes' }).click()
    await page.getByRole('button', { name: 'Confirm order' }).click()
    await expect
      .poll(() => page.getByText(`Order ${orderNumber} is confirmed; the shop is told.`).isVisible())
      .toBe(true)
    await expect.poll(() => page.getByRole('button', { name: 'Confirm order' }).count()).toBe(0)
    await waitForMail(buyer.buyer.email, new RegExp(`Order ${orderNumber} confirmed`))
    await context.close()
  })
})
