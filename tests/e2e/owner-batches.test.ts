import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { axeViolations, launch, newPage, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

// The batch the owner records here; the packer's write-off then works on it, so no other flow's
// demo stock changes.
let recorded: { lotCode: string; readyDate: string } | null = null

describe('pouring and curing', () => {
  it('the owner records a batch through the form and finds it on the curing screen with its ready date', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Batches' }).click()
    await page.waitForURL(/\/studio\/batches$/)
    await page.getByRole('heading', { level: 2, name: /Curing/ }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'batches-owner')

    await page.getByRole('link', { name: 'Record a batch' }).first().click()
    await page.waitForURL(/\/studio\/batches\/new$/)
    // The page is its own chunk: wait for it, not for the address bar.
    await page.getByRole('heading', { level: 1, name: 'Record a batch' }).waitFor()
    await page.getByLabel('Product').selectOption({ label: 'Rose Clay Glow (RSC)' })
    // The oil weight defaults to the recipe's mould; the lots are suggested oldest first.
    await expect.poll(() => page.getByLabel('Oil weight (g)').inputValue(), { timeout: 10_000 }).toBe('1100')
    const cocoa = page.getByLabel(/^Cocoa butter from NSS-CB-1010/)
    await expect.poll(() => cocoa.inputValue(), { timeout: 10_000 }).toBe('220')
    await expect.poll(() => page.getByLabel('Bars cut').inputValue(), { timeout: 10_000 }).toBe('12')
    await expect.poll(() => page.getByLabel('Bars kept back').inputValue(), { timeout: 10_000 }).toBe('2')
    const lotCode = (await page.getByTestId('lot-code-preview').textContent())!.trim()
    const readyDate = (await page.getByTestId('ready-date-preview').textContent())!.trim()
    expect(lotCode).toMatch(/^\d{6}-RSC-\d{2}$/)
    await page.getByText(/Danger \(GHS05\)/).waitFor()

    // One bar more came out of the mould than the suggestion: the cut is what the owner says.
    await page.getByLabel('Bars cut').fill('13')
    await page.getByLabel('Location', { exact: false }).fill('Curing rack E2E')
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'batch-new-owner')
    await page.getByRole('button', { name: 'Record the batch' }).click()

    await page.waitForURL(/\/studio\/batches\/\d+$/)
    await page.getByRole('heading', { level: 1, name: lotCode }).waitFor()
    await page.getByText(`Batch ${lotCode} recorded: 11 bars, ready on ${readyDate}.`).waitFor()
    await page.getByRole('cell', { name: 'NSS-CB-1010' }).waitFor()
    await screenshot(page, 'batch-owner')

    await page.getByRole('link', { name: 'All batches' }).click()
    await page.waitForURL(/\/studio\/batches$/)
    const card = page
      .getByRole('region', { name: /^Curing/ })
      .getByRole('listitem')
      .filter({ hasText: lotCode })
    await card.waitFor()
    expect(await card.textContent()).toContain(`Ready ${readyDate}`)
    expect(await card.textContent()).toContain('28 days left')
    recorded = { lotCode, readyDate }
    await context.close()
  })

  it('a packer writes off 2 bars with a reason, and sees no costs', async () => {
    expect(recorded).not.toBeNull()
    const { lotCode } = recorded!
    const { page, context } = await newPage(browser)
    await signIn(page, 'packer')
    await page.getByRole('link', { name: 'Stock' }).click()
    await page.waitForURL(/\/packing\/stock$/)
    const card = page
      .getByRole('region', { name: /^Curing/ })
      .getByRole('listitem')
      .filter({ hasText: lotCode })
    await card.waitFor()
    expect(await page.getByText(/cost/i).count()).toBe(0)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'stock-packer')

    await page.getByRole('button', { name: `Write off or correct ${lotCode}` }).click()
    const dialog = page.getByRole('dialog', { name: `Write off or correct ${lotCode}` })
    await dialog.waitFor()
    await dialog.getByLabel('Reason').selectOption({ label: 'Damaged' })
    // Asking for more than the batch holds is refused, beside the field.
    await dialog.getByLabel('Bars to write off').fill('40')
    await dialog.getByRole('button', { name: 'Write off' }).click()
    await dialog
      .getByText(/Only 11 free bars are in this batch; writing off 40 would leave -29/)
      .first()
      .waitFor()
    await dialog.getByLabel('Bars to write off').fill('2')
    await dialog.getByLabel('Note').fill('Corner chipped when unmoulding')
    await screenshot(page, 'stock-write-off-dialog')
    await dialog.getByRole('button', { name: 'Write off' }).click()
    await page.getByText(`2 bars of ${lotCode} written off. 9 bars left free.`).waitFor()
    await expect.poll(() => card.textContent(), { timeout: 10_000 }).toContain('9 bars free')

    await card.getByRole('link', { name: lotCode }).click()
    await page.waitForURL(/\/packing\/stock\/\d+$/)
    const row = page.getByRole('row').filter({ hasText: 'Written off' })
    await row.waitFor()
    expect(await row.textContent()).toMatch(/−2.*Damaged.*Corner chipped when unmoulding.*Teo Lindqvist/)
    expect(await page.getByText(/cost/i).count()).toBe(0)
    await screenshot(page, 'batch-packer')
    await context.close()
  })

  it('the owner traces an ingredient lot to its batches and downloads the CSV', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Trace a lot' }).click()
    await page.waitForURL(/\/studio\/trace$/)
    const picker = page.getByLabel('Ingredient lot')
    await expect.poll(() => picker.locator('option').count(), { timeout: 10_000 }).toBeGreaterThan(1)
    const value = await picker.locator('optgroup[label="Rose clay"] option').first().getAttribute('value')
    await picker.selectOption(value!)
    await page.getByRole('heading', { name: /Rose clay, NSS-RC-140/ }).waitFor()
    if (recorded) await page.getByRole('link', { name: recorded!.lotCode }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'trace-owner')
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download CSV' }).click(),
    ])
    expect(download.suggestedFilename()).toMatch(/^trace-lot-\d+-NSS-RC-140\.csv$/)
    const text = fs.readFileSync(await download.path(), 'utf8')
    expect(text.split('\r\n')[0]).toBe(
      'lot,ingredient,supplier lot code,batch lot code,pour date,product SKU,shop,order number,bars,ship date',
    )
    if (recorded) expect(text).toContain(`,Rose clay,NSS-RC-140,${recorded.lotCode},`)
    await context.close()
  })

  it('works on a phone-sized screen', async () => {
    const { page, context } = await newPage(browser, { width: 360, height: 740 })
    await signIn(page, 'packer')
    await page.goto('/packing/stock')
    await page.getByRole('heading', { level: 1, name: 'Stock' }).waitFor()
    await page.waitForLoadState('networkidle')
    await screenshot(page, 'stock-packer-phone')
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    )
    expect(overflow).toBeLessThanOrEqual(0)
    await context.close()
  })
})
