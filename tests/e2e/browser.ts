/**
 * Debian's chromium driven by playwright-core: a fresh profile per browser, no background
 * networking (this machine has no outside network), screenshots on demand.
 */
import fs from 'node:fs'
import path from 'node:path'
import { chromium } from 'playwright-core'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { inject } from 'vitest'
import { DEMO } from '@tests/factories/api-client'
import type { DemoCaller } from '@tests/factories/api-client'

const EXECUTABLE = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

export async function launch(): Promise<Browser> {
  // playwright-core gives each launch a fresh temporary profile of its own.
  return chromium.launch({
    executablePath: EXECUTABLE,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  })
}

export const baseUrl = () => inject('baseUrl')

/** A new browser context (its own cookies) with the base URL set. */
export async function newPage(
  browser: Browser,
  viewport = { width: 1280, height: 860 },
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ baseURL: baseUrl(), viewport, acceptDownloads: true })
  const page = await context.newPage()
  page.setDefaultTimeout(15_000)
  return { context, page }
}

/** Signs in through the form, as a person would. */
export async function signIn(page: Page, who: DemoCaller) {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(DEMO[who].email)
  await page.getByLabel('Password').fill(DEMO[who].password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'))
}

export async function screenshot(page: Page, name: string) {
  const dir = path.resolve('test-results', 'screenshots')
  fs.mkdirSync(dir, { recursive: true })
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true })
}

/** axe-core run inside the page; returns the serious and critical violations. */
export async function axeViolations(page: Page) {
  const source = fs.readFileSync(path.resolve('node_modules/axe-core/axe.min.js'), 'utf8')
  // Evaluated through the devtools protocol: the page's CSP (script-src 'self') stays in force.
  await page.evaluate(`${source}\n;true`)
  const result = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            o: object,
          ) => Promise<{
            violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[]
          }>
        }
      }
    ).axe
    return axe.run(document, { resultTypes: ['violations'] })
  })
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.id} (${v.impact}): ${v.help} — ${v.nodes
          .map((n) => n.target.join(' '))
          .slice(0, 3)
          .join(', ')}`,
    )
}

/** JSON calls with the page's own session (and its CSRF token for writes). */
export async function call(
  page: Page,
  method: 'GET' | 'POST' | 'PUT',
  url: string,
  data?: unknown,
  headers: Record<string, string> = {},
) {
  const token = (await (await page.request.get('/api/auth/csrf')).json()).csrfToken as string
  const r = await page.request.fetch(url, { method, data, headers: { 'X-CSRF-Token': token, ...headers } })
  const body = await r.json().catch(() => null)
  if (!r.ok()) throw new Error(`${method} ${url} answered ${r.status()}: ${JSON.stringify(body)}`)
  return body
}

/**
 * Lines of one product worth at least `minSubtotalCents` at the buyer's first price break, from
 * a batch the owner pours for it 60 days back (past any demo recipe's cure): a browser test that
 * orders has ready stock of its own, whatever the other browser tests order meanwhile.
 */
export async function ownStockLines(
  browser: Browser,
  buyerPage: Page,
  sku: string,
  minSubtotalCents: number,
) {
  const items = (await call(buyerPage, 'GET', '/api/catalogue')).items as {
    productId: number
    sku: string
    casePack: number
    priceBreaks: { minCases: number; unitPriceCents: number }[]
  }[]
  const item = items.find((i) => i.sku === sku)
  if (!item || item.priceBreaks.length === 0) throw new Error(`the demo does not offer ${sku} to this shop`)
  const cases = Math.ceil(minSubtotalCents / (item.casePack * item.priceBreaks[0]!.unitPriceCents))
  const studio = await newPage(browser)
  await signIn(studio.page, 'owner')
  const pourDate = new Date(Date.now() - 60 * 86_400_000).toISOString().slice(0, 10)
  const pour = {
    productId: item.productId,
    pourDate,
    barsCut: cases * item.casePack,
    barsKeptBack: 0,
    location: 'Rack E2E',
  }
  const token = (await (await studio.page.request.get('/api/auth/csrf')).json()).csrfToken as string
  const first = await studio.page.request.post('/api/batches', {
    data: pour,
    headers: { 'X-CSRF-Token': token },
  })
  if (first.status() === 409) {
    // Other browser tests pour too: buy what this batch is short of, as the studio would, and pour.
    const short = (await first.json()).error.details as {
      ingredientId: number
      shortBy: number
      unit: string
    }[]
    for (const d of short) {
      await call(studio.page, 'POST', '/api/purchases', {
        ingredientId: d.ingredientId,
        supplier: 'Wharfside Supply',
        supplierLotCode: `E2E-${Date.now()}-${d.ingredientId}`,
        receivedOn: pourDate,
        quantity: Math.ceil(d.shortBy * 2) + 10,
        unit: d.unit,
        costCents: 1000,
        freightCents: 0,
      })
    }
    await call(studio.page, 'POST', '/api/batches', pour)
  } else if (!first.ok()) throw new Error(`pour: ${first.status()} ${await first.text()}`)
  await studio.context.close()
  return [{ productId: item.productId, cases }]
}
