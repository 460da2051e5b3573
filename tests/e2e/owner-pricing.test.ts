import path from 'node:path'
import fs from 'node:fs'
import os from 'node:os'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Locator, Page } from 'playwright-core'
import { axeViolations, launch, newPage, screenshot, signIn } from './browser'

/** Waits for what a person would see; the machine may be slow, so the wait is generous. */
const visible = (locator: Locator) => expect.poll(() => locator.isVisible(), { timeout: 20_000 }).toBe(true)

let browser: Browser
/** A signed-out page with room for a busy machine: actions wait up to 30 s. */
async function open(viewport?: { width: number; height: number }) {
  const opened = await newPage(browser, viewport)
  opened.page.setDefaultTimeout(30_000)
  return opened
}
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

// A SKU of this run's own, so the shared demo data other flows use stays as it is.
const SKU = `TRY-${Date.now().toString(36).slice(-4).toUpperCase()}`
const NAME = `Meadow Trial ${SKU}`

/**
 * REFERENCES: suggested unit price = cost ÷ (1 − margin), up to the next cent, then up to the
 * studio's price step. Integer arithmetic on hundredths of a percent, so no float noise enters.
 */
function expectedSuggestion(costCents: number, marginPct: number, stepCents: number) {
  const cents = Math.ceil((costCents * 10000) / (10000 - Math.round(marginPct * 100)))
  return Math.ceil(cents / stepCents) * stepCents
}
const usd = (cents: number) =>
  new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(cents / 100)

type Overview = {
  priceStepCents: number
  tiers: { id: number; name: string; targetMarginPct: number }[]
  items: { sku: string; productId: number; costPerBarCents: number }[]
}
async function overview(page: Page) {
  const r = await page.request.get('/api/pricing')
  expect(r.status()).toBe(200)
  return (await r.json()) as Overview
}

// A real 1×1 PNG for the photo upload.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==',
  'base64',
)

describe('owner: products and the pricing screen', () => {
  it('creates a product with a photo and a confirmed declaration', async () => {
    const { page, context } = await open()
    await signIn(page, 'owner')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Products' }).click()
    await page.waitForURL(/\/studio\/products$/)
    await visible(page.getByRole('link', { name: 'LAV-MINI' }))
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-products')

    await page.getByRole('link', { name: 'New product' }).click()
    await page.waitForURL(/\/studio\/products\/new$/)
    await page.getByLabel('SKU').fill(SKU.toLowerCase())
    await page.getByLabel('Name', { exact: true }).fill(NAME)
    await page.getByLabel('Recipe').selectOption({ label: 'Lavender classic' })
    await page.getByLabel('Scent notes').fill('Lavender and meadow grass')
    await page.getByLabel('Net weight (g)').fill('113')
    await page.getByLabel('Cut weight (g)').fill('130')
    await page.getByLabel('Case pack (bars per case)').fill('12')
    await page.getByLabel('MSRP').fill('11.00')
    // The GTIN is checked as it is typed: GS1's worked example 629104150021 has check digit 3.
    await page.getByLabel('GTIN').fill('6291041500214')
    await visible(page.getByText('The check digit is wrong: for these digits it should be 3.'))
    await page.getByLabel('GTIN').fill('')
    await visible(page.getByText(/Optional\. 8, 12, 13 or 14 digits/))
    await screenshot(page, 'owner-product-new')
    await page.getByRole('button', { name: 'Create product' }).click()
    await page.waitForURL(/\/studio\/products\/\d+$/)
    await visible(page.getByRole('heading', { level: 1, name: NAME }))
    // No photo yet: a tile naming the SKU stands in.
    await visible(page.getByRole('img', { name: `${NAME}: no photo yet` }))

    // Photo: chosen, previewed, uploaded.
    await page
      .getByLabel('Choose a photo')
      .setInputFiles({ name: 'meadow.png', mimeType: 'image/png', buffer: PNG })
    await visible(page.getByRole('img', { name: `Preview of the new photo for ${NAME}` }))
    await page.getByRole('button', { name: 'Upload photo' }).click()
    await visible(page.getByRole('img', { name: `Photo of ${NAME}` }))

    // A text file with an image's name is refused with the server's reason.
    const fake = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'lc-photo-')), 'not-a-photo.png')
    fs.writeFileSync(fake, 'plain text, not an image\n')
    await page.getByLabel('Choose a new photo').setInputFiles(fake)
    await page.getByRole('button', { name: 'Upload photo' }).click()
    await visible(page.getByText('The photo must be a JPEG, PNG or WebP image.'))
    await page.getByRole('button', { name: 'Cancel' }).click()

    // Declaration: the draft in descending order of weight, confirmed as worded.
    const draft = page.getByText(/^Sodium Olivate, Aqua, Sodium Cocoate/).first()
    await visible(draft)
    await page.getByRole('button', { name: 'Confirm declaration' }).click()
    await visible(page.getByText(/^Confirmed on /))
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-product')
    await context.close()
  }, 120_000)

  it('accepts suggestions in bulk, shows the new prices and margins, and refuses a price under cost', async () => {
    const { page, context } = await open()
    await signIn(page, 'owner')
    await page.goto('/studio/pricing')
    await visible(page.getByRole('heading', { level: 1, name: 'Pricing' }))
    const o = await overview(page)
    const item = o.items.find((i) => i.sku === SKU)!
    expect(item, 'the product made in the test before').toBeDefined()

    await page.getByLabel('Search').fill(SKU)
    for (const tier of o.tiers) {
      await page.getByRole('checkbox', { name: `Select the suggestion for ${SKU} in ${tier.name}` }).check()
    }
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-pricing-selected')
    await page.getByRole('button', { name: `Accept selected suggestions (${o.tiers.length})` }).click()
    await visible(page.getByText(`${o.tiers.length} prices set to the suggestion.`))

    for (const tier of o.tiers) {
      const price = expectedSuggestion(item.costPerBarCents, tier.targetMarginPct, o.priceStepCents)
      const margin = ((price - item.costPerBarCents) / price) * 100
      const row = page.getByRole('row').filter({ hasText: SKU }).filter({ hasText: tier.name })
      await visible(row.getByText('On target'))
      await visible(row.getByText(`${margin.toFixed(1)} %`))
      // The 1-case price and the suggestion now read the same.
      expect(await row.getByText(usd(price), { exact: true }).count()).toBe(2)
      await visible(row.getByText('Already the price'))
      expect(margin).toBeGreaterThanOrEqual(tier.targetMarginPct)
    }
    await screenshot(page, 'owner-pricing-accepted')

    // One break table with a price under cost: the server refuses it and nothing changes.
    const standard = o.tiers.find((t) => t.name === 'Standard')!
    await page.getByRole('button', { name: `Edit breaks for ${SKU} in Standard` }).click()
    const dialog = page.getByRole('dialog', { name: `${SKU} · Standard price breaks` })
    await visible(dialog)
    await dialog.getByRole('button', { name: 'Add a break' }).click()
    await dialog.getByLabel('From cases (break 2)').fill('5')
    const under = item.costPerBarCents - 1
    await dialog.getByLabel('Price per bar (break 2)').fill((under / 100).toFixed(2))
    await visible(dialog.getByText(/under cost/))
    await dialog.getByRole('button', { name: 'Save breaks' }).click()
    await visible(dialog.getByText(/^Refused: .*under the cost per bar/))
    await visible(
      dialog.getByText(`${usd(under)} is under the cost per bar of ${usd(item.costPerBarCents)}.`).first(),
    )
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-pricing-refused')
    await dialog.getByRole('button', { name: 'Cancel' }).click()
    const after = (await overview(page)).items.find((i) => i.sku === SKU)!
    expect(after).toBeDefined()
    const std = (after as unknown as { cells: { tierId: number; breaks: unknown[] }[] }).cells.find(
      (c) => c.tierId === standard.id,
    )!
    expect(std.breaks).toHaveLength(1)

    // The tiers editor is on the same page.
    await visible(page.getByRole('heading', { name: 'Price tiers' }))
    await context.close()
  }, 120_000)

  it('takes the trial product off sale again, leaving the catalogue as other flows expect it', async () => {
    const { page, context } = await open()
    await signIn(page, 'owner')
    await page.goto('/studio/products')
    await page.getByLabel('Search').fill(SKU)
    await page.getByRole('link', { name: SKU }).click()
    await visible(page.getByRole('heading', { level: 1, name: NAME }))
    await page.getByLabel('On sale to shops').uncheck()
    await page.getByRole('button', { name: 'Save product' }).click()
    await visible(page.getByText('Off sale', { exact: true }).first())
    await context.close()
  }, 120_000)

  it('works at phone width', async () => {
    const { page, context } = await open({ width: 360, height: 740 })
    await signIn(page, 'owner')
    await page.goto('/studio/pricing')
    await visible(page.getByRole('button', { name: /Accept selected suggestions/ }))
    await screenshot(page, 'owner-pricing-phone')
    await context.close()
  }, 120_000)
})
