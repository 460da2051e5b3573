import fs from 'node:fs'
import path from 'node:path'
import { PDFParse } from 'pdf-parse'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { axeViolations, launch, newPage, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

// The machine may be busy: give the page time to answer.
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { timeout: 15_000, interval: 100 })

const visible = (page: Page, text: string | RegExp) => () => page.getByText(text).first().isVisible()

describe('the owner builds a recipe and prints its batch sheet', () => {
  it('lists the recipes with their cost per bar', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Recipes' }).click()
    await page.waitForURL(/\/studio\/recipes$/)
    await poll(() => page.getByRole('heading', { level: 1, name: 'Recipes' }).isVisible()).toBe(true)
    await poll(() => page.getByRole('link', { name: 'Lavender classic' }).isVisible()).toBe(true)
    const row = page.getByRole('row', { name: /Lavender classic/ })
    await poll(async () => (await row.textContent()) ?? '').toMatch(/\$\d+\.\d\d/)
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-recipes')
    await context.close()
  })

  it('sees the running sum, fixes it to 100, saves, opens the batch sheet and downloads the PDF', async () => {
    const name = `Garden mint ${Date.now().toString(36)}`
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.waitForURL(/\/studio$/)
    await page.goto('/studio/recipes')
    await page.getByRole('link', { name: 'New recipe' }).click()
    await page.waitForURL(/\/studio\/recipes\/new$/)

    await page.getByLabel('Name').fill(name)
    await page.getByLabel('Oil 1', { exact: true }).selectOption({ label: 'Olive oil' })
    await page.getByLabel('Oil 1 share (%)').fill('60')
    await page.getByRole('button', { name: 'Add an oil' }).click()
    await page.getByLabel('Oil 2', { exact: true }).selectOption({ label: 'Coconut oil' })
    await page.getByLabel('Oil 2 share (%)').fill('30')
    await poll(visible(page, 'Oils add up to 90 % — 10 % to go')).toBe(true)
    const save = page.getByRole('button', { name: 'Save recipe' })
    expect(await save.isDisabled()).toBe(true)

    // A fragrance over its certificate's limit is flagged as it is typed (peppermint: 3 %).
    await page.getByRole('button', { name: 'Add a fragrance' }).click()
    await page.getByLabel('Fragrance 1', { exact: true }).selectOption({ label: 'Peppermint essential oil' })
    await page.getByLabel('Fragrance 1 (% of oils)').fill('4')
    await poll(visible(page, /Over the maximum usage/)).toBe(true)
    await page.getByLabel('Fragrance 1 (% of oils)').fill('2.5')
    await poll(visible(page, /Over the maximum usage/)).toBe(false)

    await page.getByRole('button', { name: 'Add packaging' }).click()
    await page.getByLabel('Packaging 1', { exact: true }).selectOption({ label: 'Kraft bar box' })
    await page.getByLabel('Oil weight for one mould (g)').fill('1000')
    await page.getByLabel('Cut bar weight (g)').fill('120')
    await page.getByLabel('Bars per mould').fill('11')
    await screenshot(page, 'owner-recipe-form-sum-short')

    await page.getByLabel('Oil 2 share (%)').fill('40')
    await poll(visible(page, 'Oils add up to 100 % ✓')).toBe(true)
    expect(await save.isEnabled()).toBe(true)
    await save.click()

    await page.waitForURL(/\/studio\/recipes\/\d+$/)
    await poll(() => page.getByRole('heading', { level: 1, name }).isVisible()).toBe(true)
    const recipeId = Number(new URL(page.url()).pathname.split('/').pop())

    // The batch sheet: every line in g and oz, the lye, and the cautions.
    await expect
      .poll(() => page.getByRole('tab', { name: 'Batch sheet', selected: true }).isVisible())
      .toBe(true)
    const table = page.getByRole('table', { name: 'What to weigh for this batch' })
    await poll(async () => (await table.textContent()) ?? '').toContain('Sodium hydroxide')
    expect(await table.textContent()).toContain('600.0 g')
    expect(await table.textContent()).toContain('Peppermint essential oil')
    await poll(visible(page, 'Causes severe skin burns and eye damage.')).toBe(true)
    expect(await page.getByText('Always add lye to water, never water to lye.').isVisible()).toBe(true)
    expect(await page.getByText(/studio's own safety assessment/).isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-recipe-batch-sheet')

    // Sized for a number of bars.
    await page.getByLabel('Number of bars').check()
    await page.getByLabel('Bars to cut').fill('22')
    await page.getByRole('button', { name: 'Show sheet' }).click()
    await expect
      .poll(async () => (await page.getByText('Bars expected').locator('..').textContent()) ?? '')
      .toContain('22')

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download PDF' }).click(),
    ])
    const file = await download.path()
    const pdf = fs.readFileSync(file)
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
    const parser = new PDFParse({ data: new Uint8Array(pdf) })
    const { text } = await parser.getText()
    await parser.destroy()
    expect(text).toContain(`Batch sheet: ${name}`)
    expect(text).toContain('Sized for 22 bars')
    expect(text).toContain('H314')
    fs.mkdirSync(path.resolve('test-results', 'pdf'), { recursive: true })
    fs.writeFileSync(path.resolve('test-results', 'pdf', 'owner-recipe-download.pdf'), pdf)

    // The cost sheet, with a what-if on the olive oil price.
    await page.getByRole('tab', { name: 'Cost sheet' }).click()
    await poll(visible(page, 'Cost per sellable bar')).toBe(true)
    await expect
      .poll(() => page.getByRole('img', { name: /Where the batch cost goes/ }).isVisible())
      .toBe(true)
    await page.getByLabel('What if this ingredient cost…').selectOption({ label: 'Olive oil' })
    await page.getByLabel('Price per kg').fill('20')
    await page.getByRole('button', { name: 'Work it out' }).click()
    await poll(visible(page, /What-if: Olive oil at \$20\.00\/kg/)).toBe(true)
    await poll(() => page.getByRole('row', { name: /Olive oil.*What-if/ }).isVisible()).toBe(true)
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-recipe-cost-sheet')

    // Editing starts from the saved recipe and saves it back unchanged.
    await page.getByRole('link', { name: 'Edit recipe' }).click()
    await page.waitForURL(/\/edit$/)
    await poll(() => page.getByLabel('Oil 1', { exact: true }).isVisible()).toBe(true)
    expect(await page.getByLabel('Oil 1', { exact: true }).locator('option:checked').textContent()).toBe(
      'Olive oil',
    )
    expect(await page.getByLabel('Oil 2 share (%)').inputValue()).toBe('40')
    expect(await page.getByLabel('Lye', { exact: true }).locator('option:checked').textContent()).toBe(
      'Sodium hydroxide (99 %)',
    )
    expect(await page.getByLabel('Fragrance 1 (% of oils)').inputValue()).toBe('2.5')
    await page.getByRole('button', { name: 'Save recipe' }).click()
    await page.waitForURL(/\/studio\/recipes\/\d+$/)
    await poll(visible(page, `${name} is updated.`)).toBe(true)

    // It is on the list now.
    await page.goto('/studio/recipes')
    await poll(() => page.getByRole('link', { name }).isVisible()).toBe(true)
    expect(recipeId).toBeGreaterThan(0)
    await context.close()
  })

  it('works at a phone width', async () => {
    const { page, context } = await newPage(browser, { width: 360, height: 780 })
    await signIn(page, 'owner')
    await page.waitForURL(/\/studio$/)
    await page.goto('/studio/recipes/new')
    await expect
      .poll(() => page.getByRole('heading', { level: 1, name: 'New recipe' }).isVisible())
      .toBe(true)
    await page.getByLabel('Oil 1', { exact: true }).selectOption({ label: 'Olive oil' })
    await page.getByLabel('Oil 1 share (%)').fill('100')
    await poll(visible(page, 'Oils add up to 100 % ✓')).toBe(true)
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(360)
    await screenshot(page, 'owner-recipe-form-phone')
    await context.close()
  })
})
