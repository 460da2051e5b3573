import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inject } from 'vitest'
import type { Browser } from 'playwright-core'
import { allMail } from '@tests/factories/mail'
import { axeViolations, call, launch, newPage, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

type Invoice = { id: number; number: string; kind: string; shopName: string }

/** What a relay that kept refusing leaves in the outbox: no screen can make it, so it is written here. */
async function refusedInvoiceMail(invoiceId: number, attempts: number, gaveUp: boolean) {
  const db = new pg.Client({ connectionString: inject('databaseUrl') })
  await db.connect()
  try {
    await db.query(
      `INSERT INTO mail_outbox (job, label, attempts, last_error, next_attempt_at, gave_up_at)
       VALUES (jsonb_build_object('kind', 'invoice', 'invoiceId', $1::int, 'reason', 'issued'), 'browser test',
               $2, '550 5.1.1 mailbox unavailable', now() + interval '2 hours', CASE WHEN $3 THEN now() END)`,
      [invoiceId, attempts, gaveUp],
    )
  } finally {
    await db.end()
  }
}

describe('e-mails the relay refused', () => {
  it('the owner sees them on the home, sends one now and dismisses the other', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    const invoices = ((await call(page, 'GET', '/api/invoices')).items as Invoice[]).filter(
      (i) => i.kind === 'invoice',
    )
    const [toSend, toDismiss] = invoices
    if (!toSend || !toDismiss) throw new Error('the demo needs two invoices')
    await refusedInvoiceMail(toSend.id, 6, true)
    await refusedInvoiceMail(toDismiss.id, 2, false)
    await page.reload()
    const list = page.getByRole('list', { name: 'E-mails not sent' })
    const sendRow = list.getByRole('listitem').filter({ hasText: `Invoice ${toSend.number}` })
    const dismissRow = list.getByRole('listitem').filter({ hasText: `Invoice ${toDismiss.number}` })
    await sendRow.getByText('Given up').waitFor()
    await dismissRow.getByText('Will try again').waitFor()
    expect(await sendRow.textContent()).toContain('550 5.1.1 mailbox unavailable')
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'home-owner-unsent-mail')

    await sendRow.getByRole('button', { name: 'Send now' }).click()
    await page.getByText(`Sent: Invoice ${toSend.number}.`).waitFor()
    await expect.poll(() => sendRow.count()).toBe(0)
    await expect
      .poll(async () => (await allMail()).some((m) => m.subject.startsWith(`Invoice ${toSend.number} from`)))
      .toBe(true)

    await dismissRow.getByRole('button', { name: 'Dismiss' }).click()
    const dialog = page.getByRole('dialog', { name: 'Dismiss this e-mail?' })
    expect(await dialog.textContent()).toContain(`will not be sent to ${toDismiss.shopName}`)
    await dialog.getByRole('button', { name: 'Dismiss it' }).click()
    await expect.poll(() => list.count()).toBe(0)
    expect((await call(page, 'GET', '/api/unsent-mail')).items).toEqual([])
    await context.close()
  })

  it('fits a phone-sized screen', async () => {
    const { page, context } = await newPage(browser, { width: 375, height: 740 })
    await signIn(page, 'owner')
    const [invoice] = ((await call(page, 'GET', '/api/invoices')).items as Invoice[]).filter(
      (i) => i.kind === 'invoice',
    )
    await refusedInvoiceMail(invoice!.id, 1, false)
    await page.reload()
    const list = page.getByRole('list', { name: 'E-mails not sent' })
    await list.getByRole('button', { name: 'Send now' }).waitFor()
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(375)
    await screenshot(page, 'phone-owner-unsent-mail')
    await list.getByRole('button', { name: 'Send now' }).click()
    await expect.poll(() => list.count()).toBe(0)
    await context.close()
  })
})
