import { randomBytes } from 'node:crypto'
import fs from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DEMO } from '@tests/factories/api-client'
import { certificatePdf } from '@tests/factories/applications'
import { linkIn, waitForMail } from '@tests/factories/mail'
import { axeViolations, baseUrl, launch, newPage, screenshot, signIn } from './browser'

// The first answers after a fresh start can take a few seconds on a busy machine.
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { timeout: 15_000, interval: 100 })

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

// An invented shop of our own, unique per run so other flows' data stays as it is.
const tag = randomBytes(3).toString('hex')
const shop = {
  tradingName: `Fernhollow Provisions ${tag}`,
  legalName: `Fernhollow Provisions ${tag} LLC`,
  contactName: 'Odile Marchetti',
  contactEmail: `odile.${tag}@fernhollow.test`,
  phone: '(555) 017-2468',
}

describe('a shop applies and the owner opens its account', () => {
  it('a visitor applies from the sign-in page with a PDF certificate', async () => {
    const { page, context } = await newPage(browser)
    await page.goto('/sign-in')
    await page.getByRole('link', { name: 'Apply for a wholesale account' }).click()
    await page.waitForURL(/\/apply$/)
    await poll(() =>
      page.getByRole('heading', { level: 1, name: 'Apply for a wholesale account' }).isVisible(),
    ).toBe(true)
    expect(await axeViolations(page)).toEqual([])

    // Sending it empty shows what each field needs, without a request.
    await page.getByRole('button', { name: 'Send application' }).click()
    await poll(() => page.getByText('Enter the shop name.').isVisible()).toBe(true)
    expect(await page.getByText('Attach the resale certificate (PDF, JPEG or PNG).').isVisible()).toBe(true)
    expect(await page.getByText('Choose the kind of store.').isVisible()).toBe(true)
    await screenshot(page, 'apply-errors')

    await page.getByLabel('Shop name').fill(shop.tradingName)
    await page.getByLabel('Legal business name').fill(shop.legalName)
    await page.getByLabel('Kind of store').selectOption('Bath and body shop')
    await page.getByLabel('Website').fill('fernhollow.test')
    await page.getByLabel('Contact name').fill(shop.contactName)
    await page.getByLabel('Contact e-mail').fill(shop.contactEmail)
    await page.getByLabel('Contact phone').fill(shop.phone)
    await page.getByLabel('Street address').fill('7 Millrace Road')
    await page.getByLabel('City').fill('Larchmere')
    await page.getByLabel('State or region').fill('VT')
    await page.getByLabel('Postal code').fill('05601')
    await page.getByLabel('Resale or tax number').fill(`VT-S3-${tag}`)
    await page.getByLabel('Certificate file').setInputFiles({
      name: 'fernhollow-resale-certificate.pdf',
      mimeType: 'application/pdf',
      buffer: certificatePdf(),
    })
    await screenshot(page, 'apply-filled')
    await page.getByRole('button', { name: 'Send application' }).click()
    await poll(() => page.getByRole('heading', { name: 'Thank you for applying' }).isVisible()).toBe(true)
    expect(await page.getByText(shop.contactEmail).isVisible()).toBe(true)
    await screenshot(page, 'apply-thank-you')

    const received = await waitForMail(shop.contactEmail, /We received your application/)
    expect(received.text).toContain(shop.tradingName)
    await context.close()
  })

  it('the form fits a 360 px phone and says what a refused file is', async () => {
    const { page, context } = await newPage(browser, { width: 360, height: 740 })
    await page.goto('/apply')
    await page.getByLabel('Certificate file').setInputFiles({
      name: 'cert.pdf',
      mimeType: 'application/pdf',
      buffer: Buffer.from('not a pdf at all'),
    })
    await page.getByLabel('Shop name').fill(`Not Sent ${tag}`)
    await page.getByLabel('Legal business name').fill(`Not Sent ${tag} LLC`)
    await page.getByLabel('Kind of store').selectOption('Gift shop')
    await page.getByLabel('Contact name').fill('Nobody Here')
    await page.getByLabel('Contact e-mail').fill(`nobody.${tag}@fernhollow.test`)
    await page.getByLabel('Contact phone').fill('(555) 017-0000')
    await page.getByLabel('Street address').fill('1 Nowhere Lane')
    await page.getByLabel('City').fill('Larchmere')
    await page.getByLabel('State or region').fill('VT')
    await page.getByLabel('Postal code').fill('05601')
    await page.getByLabel('Resale or tax number').fill('VT-0')
    await page.getByRole('button', { name: 'Send application' }).click()
    // The server sniffs the bytes: a text file named .pdf is refused beside its field.
    await poll(() => page.getByText('The certificate must be a PDF, JPEG or PNG file.').isVisible()).toBe(
      true,
    )
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    )
    expect(overflow).toBeLessThanOrEqual(0)
    await screenshot(page, 'apply-phone-refused-file')
    await context.close()
  })

  it('the owner approves it on Preferred, net 30; the buyer sets a password from the e-mail and sees the account', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.getByRole('link', { name: 'Shop accounts', exact: true }).click()
    await page.waitForURL(/\/studio\/accounts$/)
    await poll(() => page.getByText(/waiting for review/).isVisible()).toBe(true)
    await page.getByRole('button', { name: 'Review applications' }).click()
    await page.waitForURL(/status=applied/)
    await poll(() => page.getByRole('tab', { name: /Applications/, selected: true }).isVisible()).toBe(true)
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-accounts-applications')

    await page.getByRole('link', { name: new RegExp(shop.tradingName) }).click()
    await page.waitForURL(/\/studio\/accounts\/\d+$/)
    await poll(() => page.getByRole('heading', { level: 1, name: shop.tradingName }).isVisible()).toBe(true)
    const download = page.waitForEvent('download')
    await page.getByRole('link', { name: 'Download certificate' }).click()
    const file = await download
    expect(file.suggestedFilename()).toBe('fernhollow-resale-certificate.pdf')
    expect(
      fs
        .readFileSync((await file.path())!)
        .subarray(0, 5)
        .toString(),
    ).toBe('%PDF-')
    await page.waitForLoadState('networkidle')
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'owner-account-application')

    await page.getByRole('button', { name: 'Approve', exact: true }).click()
    const dialog = page.getByRole('dialog', { name: `Approve ${shop.tradingName}` })
    await poll(() => dialog.isVisible()).toBe(true)
    await poll(async () => (await dialog.getByLabel('Price tier').locator('option').count()) > 1).toBe(true)
    await dialog.getByLabel('Price tier').selectOption({ label: 'Preferred' })
    await dialog.getByLabel('Payment terms').selectOption({ label: 'Net 30' })
    await dialog.getByLabel('Certificate valid until').fill('2028-06-30')
    expect(await dialog.getByLabel('Buyer e-mail').inputValue()).toBe(shop.contactEmail)
    await screenshot(page, 'owner-approve-dialog')
    await dialog.getByRole('button', { name: 'Approve and invite' }).click()
    await poll(() => dialog.isVisible()).toBe(false)
    await poll(() => page.getByRole('button', { name: 'Put on hold' }).isVisible()).toBe(true)
    expect(await page.getByText('Net 30').first().isVisible()).toBe(true)
    expect(await page.getByText('Preferred').first().isVisible()).toBe(true)
    expect(await page.getByText(shop.contactEmail).first().isVisible()).toBe(true)
    await screenshot(page, 'owner-account-approved')
    await context.close()

    const mail = await waitForMail(shop.contactEmail, /You are invited/)
    const link = linkIn(mail, `${baseUrl()}/set-password?token=`)
    const buyer = await newPage(browser)
    await buyer.page.goto(link)
    await buyer.page.getByLabel('New password').fill('fernhollow-first-2026')
    await buyer.page.getByLabel('Type it again').fill('fernhollow-first-2026')
    await buyer.page.getByRole('button', { name: 'Save password' }).click()
    await buyer.page.waitForURL(/\/sign-in$/)
    await buyer.page.getByLabel('E-mail').fill(shop.contactEmail)
    await buyer.page.getByLabel('Password').fill('fernhollow-first-2026')
    await buyer.page.getByRole('button', { name: 'Sign in' }).click()
    await buyer.page.waitForURL(/\/shop$/)
    await poll(() => buyer.page.getByRole('heading', { level: 1, name: shop.tradingName }).isVisible()).toBe(
      true,
    )
    expect(await buyer.page.getByText('Net 30').isVisible()).toBe(true)
    expect(await buyer.page.getByText('Preferred').isVisible()).toBe(true)
    expect(await buyer.page.getByText(/Valid until Jun 30, 2028/).isVisible()).toBe(true)
    await buyer.page.waitForLoadState('networkidle')
    expect(await axeViolations(buyer.page)).toEqual([])
    await screenshot(buyer.page, 'buyer-new-account')

    // The buyer sends a renewed certificate from their account page.
    await buyer.page.getByRole('button', { name: 'Upload a renewed certificate' }).click()
    const renew = buyer.page.getByRole('dialog', { name: 'Upload a renewed certificate' })
    await renew.getByLabel('Certificate file').setInputFiles({
      name: 'renewed-2029.pdf',
      mimeType: 'application/pdf',
      buffer: certificatePdf('% renewed\n'),
    })
    await renew.getByLabel('Valid until').fill('2029-06-30')
    await renew.getByRole('button', { name: 'Upload', exact: true }).click()
    await poll(() => renew.isVisible()).toBe(false)
    await poll(() => buyer.page.getByText('Valid until Jun 30, 2029.').isVisible()).toBe(true)
    expect(await buyer.page.getByText('renewed-2029.pdf').isVisible()).toBe(true)
    await waitForMail(DEMO.owner.email, new RegExp(`Renewed resale certificate from ${shop.tradingName}`))
    await screenshot(buyer.page, 'buyer-renewed-certificate')
    await buyer.context.close()
  })

  it('the owner edits the terms, puts the account on hold and reactivates it', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'owner')
    await page.waitForLoadState('networkidle')
    await screenshot(page, 'owner-home-with-accounts')
    await page.goto('/studio/accounts?status=active')
    await page.getByRole('link', { name: new RegExp(shop.tradingName) }).click()
    await poll(() => page.getByRole('heading', { level: 1, name: shop.tradingName }).isVisible()).toBe(true)

    await page.getByRole('button', { name: 'Edit account' }).click()
    const edit = page.getByRole('dialog', { name: `Edit ${shop.tradingName}` })
    await poll(() => edit.isVisible()).toBe(true)
    await edit.getByLabel('Payment terms').selectOption({ label: 'Net 15' })
    await edit.getByLabel('Notes').fill('Prefers deliveries on Tuesdays.')
    await edit.getByLabel('Contact phone').fill('12')
    await edit.getByRole('button', { name: 'Save changes' }).click()
    await poll(() => edit.getByText('Enter a phone number with at least 7 digits.').isVisible()).toBe(true)
    await edit.getByLabel('Contact phone').fill(shop.phone)
    await screenshot(page, 'owner-edit-account')
    await edit.getByRole('button', { name: 'Save changes' }).click()
    await poll(() => edit.isVisible()).toBe(false)
    await poll(() => page.getByText('Prefers deliveries on Tuesdays.').isVisible()).toBe(true)
    expect(await page.locator('dd', { hasText: 'Net 15' }).isVisible()).toBe(true)

    await page.getByRole('button', { name: 'Put on hold' }).click()
    const confirm = page.getByRole('dialog', { name: `Put ${shop.tradingName} on hold?` })
    await confirm.getByRole('button', { name: 'Put on hold' }).click()
    await poll(() => page.getByText(/This account is on hold/).isVisible()).toBe(true)
    await screenshot(page, 'owner-account-on-hold')
    await page.getByRole('button', { name: 'Reactivate' }).click()
    await page
      .getByRole('dialog', { name: `Reactivate ${shop.tradingName}?` })
      .getByRole('button', { name: 'Reactivate' })
      .click()
    await poll(() => page.getByRole('button', { name: 'Put on hold' }).isVisible()).toBe(true)
    await context.close()
  })
})
