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

describe('the owner plans and pours', () => {
  it('the today home names what needs the owner, with the pours due', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('heading', { level: 2, name: /^Today, / }).waitFor()
    await page.getByText('Orders to confirm').waitFor()
    await page
      .getByRole('list', { name: 'Pours due this week' })
      .getByText('Cedar & Sage', { exact: true })
      .waitFor()
    await page.getByRole('list', { name: 'Ingredients running low' }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'home-owner-today')
    await context.close()
  })

  it('opens the plan, turns a suggestion into a planned batch and pours it through the batch form', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Pour plan' }).click()
    await page.waitForURL(/\/studio\/plan$/)
    await page.getByRole('heading', { level: 1, name: 'Pour plan' }).waitFor()
    const row = page
      .getByRole('row')
      .filter({ hasText: /Cedar & Sage(?! Guest)/ })
      .first()
    await row.getByText('Late: pour now').waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'plan-owner')

    await page.getByRole('button', { name: 'Plan this pour of Cedar & Sage', exact: true }).click()
    const dialog = page.getByRole('dialog', { name: 'Plan a pour of Cedar & Sage', exact: true })
    await dialog.waitFor()
    // A bad count is refused beside its field and nothing is planned.
    await dialog.getByLabel('Moulds').fill('0')
    await dialog.getByRole('button', { name: 'Plan the batch' }).click()
    await dialog.getByText('The number of moulds must be at least 1.').waitFor()
    await dialog.getByLabel('Moulds').fill('1')
    await screenshot(page, 'plan-pour-dialog')
    await dialog.getByRole('button', { name: 'Plan the batch' }).click()
    await page.getByText(/Planned: Cedar & Sage, 1 mould on /).waitFor()
    const planned = page.getByRole('list', { name: 'Planned pours' })
    await planned.getByText('Cedar & Sage (CDR)').waitFor()

    await planned.getByRole('link', { name: 'Pour it: Cedar & Sage', exact: true }).click()
    await page.waitForURL(/\/studio\/batches\/new\?plan=\d+$/)
    await page.getByRole('heading', { level: 1, name: 'Record a batch' }).waitFor()
    await page.getByText(/^Pouring the planned batch of Cedar & Sage: 1 mould/).waitFor()
    await expect
      .poll(async () =>
        page.getByLabel('Product').evaluate((el: HTMLSelectElement) => el.selectedOptions[0]?.textContent),
      )
      .toBe('Cedar & Sage (CDR)')
    await expect.poll(() => page.getByLabel('Oil weight (g)').inputValue(), { timeout: 10_000 }).toBe('1100')
    await expect.poll(() => page.getByLabel('Bars cut').inputValue(), { timeout: 10_000 }).not.toBe('')
    await page.getByRole('button', { name: 'Record the batch' }).click()
    await page.waitForURL(/\/studio\/batches\/\d+$/)
    await page.getByText(/Batch \d{6}-CDR-\d{2} recorded/).waitFor()

    // Poured: the plan no longer lists it, and the new batch counts as curing stock.
    await page.goto('/studio/plan')
    await page.getByRole('heading', { level: 1, name: 'Pour plan' }).waitFor()
    await page.getByText('No planned pours. Plan one from a suggestion below.').waitFor()
    await context.close()
  })

  it('the plan and the sales fit a phone-sized screen', async () => {
    const { page, context } = await newPage(browser, { width: 390, height: 844 })
    await signIn(page, 'owner')
    for (const [path, heading] of [
      ['/studio/plan', 'Pour plan'],
      ['/studio/sales', 'Sales'],
    ] as const) {
      await page.goto(path)
      await page.getByRole('heading', { level: 1, name: heading }).waitFor()
      await page.waitForLoadState('networkidle')
      const overflow = await page.evaluate(
        () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
      )
      expect(overflow, path).toBeLessThanOrEqual(0)
      await screenshot(page, `${heading === 'Sales' ? 'sales' : 'plan'}-owner-phone`)
    }
    await context.close()
  })

  it('shows sales by product and by shop, with a CSV to download', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Sales' }).click()
    await page.waitForURL(/\/studio\/sales/)
    await page.getByRole('heading', { level: 1, name: 'Sales' }).waitFor()
    await page.getByRole('cell', { name: 'Lavender Field (LAV)' }).waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'sales-owner')
    await page.getByLabel('Group by').selectOption('shop')
    await page.getByRole('cell', { name: 'Juniper & Vine' }).waitFor()
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download CSV' }).click(),
    ])
    expect(download.suggestedFilename()).toMatch(/^sales-by-shop-.*\.csv$/)
    await context.close()
  })
})
