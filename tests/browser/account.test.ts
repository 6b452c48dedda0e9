import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { apiClient, uniqueEmail } from '../support/api'
import { closeTestDb, fixturePassword, makeUser } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'
import { launchBrowser, screenshot, signIn, watchForErrors } from '../support/browser'

// The account page at the most common tablet size: devices listed and ended, an address
// confirmed from its mailed link.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close(); await closeTestDb() })

const context = () => browser.newContext({ baseURL: inject('baseUrl'), viewport: { width: 1024, height: 768 }, hasTouch: true })

describe('account page', () => {
  it('lists the devices and signs out every other one', async () => {
    const user = await makeUser('browser-devices')
    const [here, there] = [await context(), await context()]
    const errors = watchForErrors(here)
    const [page, other] = [await here.newPage(), await there.newPage()]
    for (const p of [other, page]) {
      await signIn(p, user.email, fixturePassword)
      await p.waitForURL(url => url.pathname === '/')
    }
    await page.click('[data-test="account-link"]')
    await page.waitForSelector('[data-test="device"] >> nth=1')
    expect(await page.locator('[data-test="device"]').count()).toBe(2)
    expect(await page.textContent('[data-test="account-devices"]')).toContain('this device')
    await screenshot(page, 'account-1024x768')
    const target = await page.locator('[data-test="end-other-devices"]').boundingBox()
    expect(target!.height).toBeGreaterThanOrEqual(44)
    await page.click('[data-test="end-other-devices"]')
    await page.waitForFunction(() => document.querySelectorAll('[data-test="device"]').length === 1)
    expect(await other.evaluate(() => fetch('/api/me').then(r => r.status))).toBe(401)
    expect(await page.evaluate(() => fetch('/api/me').then(r => r.status))).toBe(200)
    expect(errors.filter(e => !e.includes('401'))).toEqual([]) // the 401 is the check before signing in
    await here.close()
    await there.close()
  })

  it('confirms an address from the mailed link', async () => {
    const email = uniqueEmail('browser-confirm')
    expect((await apiClient().post('/api/auth/register', { email, password: 'my-own-password', name: 'Ffion' })).status).toBe(201)
    const link = linkIn(await waitForMail(email), '/confirm-address')
    const ctx = await context()
    const page = await ctx.newPage()
    await page.goto(link.pathname + link.search)
    await page.waitForSelector('[data-test="confirm-address"] >> text=is confirmed')
    await screenshot(page, 'confirm-address-1024x768')
    await ctx.close()
  })
})
