/**
 * Paying an invoice by card, in the browser against the local card-service fake: the buyer of a
 * prepay shop (invoiced at confirmation) clicks "Pay by card" on the invoices screen, lands on the
 * hosted card page, is declined once (the invoice stays open), pays with the test card, comes back
 * to the return page that waits for the signed confirmation, and sees the invoice paid. The owner
 * then refunds part of it from the invoice screen, the buyer cancels a second attempt, and a
 * mismatched card payment waits on Receivables until the owner dismisses it.
 */
import { randomUUID } from 'node:crypto'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { waitForMail } from '@tests/factories/mail'
import { DEMO } from '@tests/factories/api-client'
import { TEST_CARDS } from '../../scripts/lib/card-service-fake'
import { axeViolations, baseUrl, call, launch, newPage, ownStockLines, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

type Invoice = {
  id: number
  number: string
  status: string
  totalCents: number
  paidCents: number
  orderId: number
}
let invoice: Invoice

const dollars = (cents: number) => `$${(cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2 })}`

async function fillCard(page: Page, number: string) {
  await page.getByLabel('Name on card').fill('Jonah Whitcombe')
  await page.getByLabel('Card number').fill(number)
  await page.getByLabel('Expiry (MM/YY)').fill('11/38')
  await page.getByLabel('Security code').fill('314')
  await page.getByRole('button', { name: /^Pay \$/ }).click()
}

describe('a shop pays an invoice by card', () => {
  it('a prepay order is confirmed and invoiced', async () => {
    const buyer = await newPage(browser)
    await signIn(buyer.page, 'buyerB')
    // Over any order minimum, from a batch poured for this test.
    const lines = await ownStockLines(browser, buyer.page, 'LAV-MINI', 20_000)
    const placed = await call(
      buyer.page,
      'POST',
      '/api/orders',
      { lines, poNumber: `HL-CARD-${randomUUID().slice(0, 4)}` },
      { 'Idempotency-Key': randomUUID() },
    )
    const owner = await newPage(browser)
    await signIn(owner.page, 'owner')
    if (placed.order.status === 'placed')
      await call(owner.page, 'POST', `/api/orders/${placed.order.id}/confirm`)
    await owner.context.close()
    const list = await call(buyer.page, 'GET', '/api/invoices')
    invoice = list.items.find((i: Invoice) => i.orderId === placed.order.id)
    expect(invoice).toBeDefined()
    expect(invoice.status).toBe('open')
    await buyer.context.close()
  })

  it('declined once, then paid: the invoice shows paid once the confirmation lands', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'buyerB')
    await page.goto('/shop/invoices')
    await page.getByRole('heading', { level: 1, name: 'Invoices' }).waitFor()
    const row = page.getByRole('row').filter({ hasText: invoice.number })
    const pay = row.getByRole('button', { name: `Pay by card: invoice ${invoice.number}` })
    await pay.waitFor()
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'buyer-invoices-pay-by-card')
    await pay.click()

    // The hosted card page, served by the card service (the fake, on loopback).
    await page.waitForURL(`${inject('services').cardUrl}/checkout/**`)
    await page.getByRole('heading', { name: 'Pay by card' }).waitFor()
    expect(await page.locator('body').innerText()).toContain(`Invoice ${invoice.number}`)
    expect(await page.locator('.amount').innerText()).toBe(dollars(invoice.totalCents))
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'card-checkout-page')

    await fillCard(page, TEST_CARDS.declined.replace(/(\d{4})(?=\d)/g, '$1 '))
    await expect.poll(() => page.getByRole('alert').innerText()).toContain('Your card was declined')
    await screenshot(page, 'card-checkout-declined')
    const stillOpen = await call(page, 'GET', `/api/invoices/${invoice.id}`)
    expect(stillOpen.invoice).toMatchObject({ status: 'open', paidCents: 0 })

    await fillCard(page, TEST_CARDS.pays)
    await page.waitForURL(/\/shop\/invoices\/\d+\/card-return\?outcome=paid/)
    await expect
      .poll(() => page.getByText(`Thank you: ${dollars(invoice.totalCents)} received by card.`).isVisible())
      .toBe(true)
    await expect.poll(() => page.getByText(`Invoice ${invoice.number} is paid.`).isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'card-return-paid')

    await page.getByRole('link', { name: 'Back to invoices' }).last().click()
    const paidRow = page.getByRole('row').filter({ hasText: invoice.number })
    await expect.poll(() => paidRow.getByText('Paid', { exact: true }).isVisible()).toBe(true)
    expect(await paidRow.getByRole('button', { name: /by card/ }).count()).toBe(0)
    await screenshot(page, 'buyer-invoices-paid-by-card')
    await waitForMail(DEMO.buyerB.email, new RegExp(`Receipt: .* invoice ${invoice.number}`))
    await context.close()
  })

  it('the owner refunds part of the card payment; the invoice owes it again', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.goto(`/studio/invoices/${invoice.id}`)
    await page.getByRole('heading', { level: 2, name: 'Card payments' }).waitFor()
    await page.getByRole('button', { name: /^Refund: card payment of/ }).click()
    const dialog = page.getByRole('dialog')
    await dialog.getByLabel('Amount to refund').fill('999999')
    await dialog.getByRole('button', { name: 'Refund to card' }).click()
    await expect.poll(() => dialog.getByText(/At most \$/).isVisible()).toBe(true)
    await dialog.getByLabel('Amount to refund').fill('12.50')
    await dialog.getByLabel('Reason').fill('One case arrived crushed')
    await screenshot(page, 'owner-card-refund-dialog')
    await dialog.getByRole('button', { name: 'Refund to card' }).click()
    await expect.poll(() => page.getByText(/\$12\.50 refunded to the card/).isVisible()).toBe(true)
    await expect.poll(() => page.getByText('$12.50 refunded ·').isVisible()).toBe(true)
    const after = await call(page, 'GET', `/api/invoices/${invoice.id}`)
    expect(after.invoice.paidCents).toBe(invoice.totalCents - 1250)
    expect(['part_paid', 'overdue']).toContain(after.invoice.status)
    await screenshot(page, 'owner-invoice-card-refunded')
    await context.close()
  })

  it('the buyer starts paying the rest and cancels: nothing is taken', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'buyerB')
    await page.goto('/shop/invoices')
    const row = page.getByRole('row').filter({ hasText: invoice.number })
    await row.getByRole('button', { name: `Pay by card: invoice ${invoice.number}` }).click()
    await page.waitForURL(`${inject('services').cardUrl}/checkout/**`)
    expect(await page.locator('.amount').innerText()).toBe('$12.50')
    await page.getByRole('link', { name: 'Cancel and go back' }).click()
    await page.waitForURL(/card-return\?outcome=cancelled/)
    await page.getByText('No payment was taken.', { exact: false }).waitFor()
    await screenshot(page, 'card-return-cancelled')
    const after = await call(page, 'GET', `/api/invoices/${invoice.id}`)
    expect(after.invoice.paidCents).toBe(invoice.totalCents - 1250)
    await context.close()
  })

  it('a card payment that does not match waits on Receivables until the owner dismisses it', async () => {
    const payload = JSON.stringify({
      id: `evt_test_${randomUUID().replace(/-/g, '')}`,
      object: 'event',
      type: 'checkout.session.completed',
      data: {
        object: {
          object: 'checkout.session',
          id: `cs_test_${randomUUID().replace(/-/g, '')}`,
          payment_status: 'paid',
          amount_total: 4321,
          currency: 'usd',
          payment_intent: 'pi_test_stray_e2e',
        },
      },
    })
    const signer = new Stripe('sk_test_signing_only')
    const r = await fetch(`${baseUrl()}/api/webhooks/card`, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        'stripe-signature': signer.webhooks.generateTestHeaderString({
          payload,
          secret: inject('services').cardWebhookSecret,
        }),
      },
      body: payload,
    })
    expect(await r.json()).toMatchObject({ outcome: 'problem' })

    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.goto('/studio/receivables')
    const list = page.getByRole('list', { name: 'Card payments to look at' })
    const item = list.getByRole('listitem').filter({ hasText: 'pi_test_stray_e2e' })
    await item.waitFor()
    expect(await item.innerText()).toContain('received $43.21')
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-card-problems')
    await item.getByRole('button', { name: 'Dismiss' }).click()
    await expect.poll(() => item.count()).toBe(0)
    await context.close()
  })
})
