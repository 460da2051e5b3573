import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DEMO } from '@tests/factories/api-client'
import { linkIn, waitForMail } from '@tests/factories/mail'
import { axeViolations, baseUrl, call, launch, newPage, screenshot, signIn } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

describe('signing in', () => {
  it('the sign-in page has no serious accessibility problems', async () => {
    const { page, context } = await newPage(browser)
    await page.goto('/')
    await page.waitForURL(/\/sign-in/)
    await expect.poll(() => page.getByRole('heading', { name: 'Sign in' }).isVisible()).toBe(true)
    expect(await axeViolations(page)).toEqual([])
    await screenshot(page, 'sign-in')
    await context.close()
  })

  it.each([
    ['owner', /\/studio$/, 'Good to see you'],
    ['packer', /\/packing$/, 'Packing'],
    ['buyerA', /\/shop$/, 'Juniper & Vine'],
  ] as const)(
    '%s lands on their own home, with no serious accessibility problems',
    async (who, url, heading) => {
      const { page, context } = await newPage(browser)
      await signIn(page, who)
      await page.waitForURL(url)
      await expect
        .poll(() => page.getByRole('heading', { level: 1, name: new RegExp(heading) }).isVisible())
        .toBe(true)
      await page.waitForLoadState('networkidle')
      expect(await axeViolations(page)).toEqual([])
      await screenshot(page, `home-${who}`)
      await context.close()
    },
  )

  it('shows an error for a wrong password', async () => {
    const { page, context } = await newPage(browser)
    await page.goto('/sign-in')
    await page.getByLabel('E-mail').fill(DEMO.owner.email)
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect.poll(() => page.getByText(/do not match an active account/).isVisible()).toBe(true)
    expect(new URL(page.url()).pathname).toBe('/sign-in')
    await context.close()
  })

  it('tells a buyer who opens an owner page that it is not for them', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'buyerB')
    await page.goto('/studio/team')
    await expect
      .poll(() => page.getByRole('heading', { name: 'This page is not for your account' }).isVisible())
      .toBe(true)
    await context.close()
  })

  it('signs out, and a signed-out visit to a page asks to sign in first', async () => {
    const { page, context } = await newPage(browser)
    await signIn(page, 'packer')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/sign-in$/)
    await page.goto('/packing')
    await page.waitForURL(/\/sign-in\?next=%2Fpacking/)
    await context.close()
  })

  it('works on a phone-sized screen: the menu opens and signs out', async () => {
    const { page, context } = await newPage(browser, { width: 375, height: 740 })
    await signIn(page, 'buyerC')
    await page.getByRole('button', { name: 'Menu' }).click()
    await expect.poll(() => page.getByRole('link', { name: /Account/ }).isVisible()).toBe(true)
    await screenshot(page, 'phone-buyer-menu')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/sign-in$/)
    await context.close()
  })
})

describe('password reset through the e-mail', () => {
  it('a forgotten password is reset from the link in the mail catcher', async () => {
    const { page, context } = await newPage(browser)
    await page.goto('/sign-in')
    await page.getByRole('link', { name: 'Forgot your password?' }).click()
    await page.getByLabel('E-mail').fill(DEMO.buyerB.email)
    await page.getByRole('button', { name: 'Send me a reset link' }).click()
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'on its way' }).isVisible()).toBe(true)
    const mail = await waitForMail(DEMO.buyerB.email, /Reset your/)
    const link = linkIn(mail, `${baseUrl()}/set-password?token=`)
    await page.goto(link)
    await page.getByLabel('New password').fill('harbor-lane-new-2026')
    await page.getByLabel('Type it again').fill('harbor-lane-new-2026')
    await page.getByRole('button', { name: 'Save password' }).click()
    await page.waitForURL(/\/sign-in$/)
    await page.getByLabel('E-mail').fill(DEMO.buyerB.email)
    await page.getByLabel('Password').fill('harbor-lane-new-2026')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(/\/shop$/)
    // The other browser tests sign in as this buyer with the demo password: give it back.
    await call(page, 'PUT', '/api/auth/password', {
      currentPassword: 'harbor-lane-new-2026',
      newPassword: DEMO.buyerB.password,
    })
    await context.close()
  })
})
