import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newTabletContext, screenshot, signIn, watchForErrors } from '../support/browser'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('signing in as the demo knitter', () => {
  it('lands on the dashboard with the studio, and signs out', async () => {
    const context = await newTabletContext(browser, 'landscape')
    const errors = watchForErrors(context)
    const page = await context.newPage()
    await page.goto('/projects')
    await page.waitForURL(/\/login\?next=(%2F|\/)projects/)

    await signIn(page, 'knitter@floatwise.test')
    await page.waitForURL(url => url.pathname === '/projects')
    await page.goto('/')
    await page.waitForSelector('[data-test="dashboard"]')
    expect(await page.textContent('h1')).toContain('Hello, Tamsin')
    expect(await page.textContent('[data-test="dashboard"]')).toContain('Saltmarsh Knitwear · you are knitter')
    await screenshot(page, 'dashboard-knitter-landscape')

    // Every navigation target is a touch-sized target (≥ 44 px).
    const sizes = await page.$$eval('[data-test="nav-link"]', links =>
      links.filter(l => (l as HTMLElement).offsetParent).map(l => l.getBoundingClientRect().height),
    )
    expect(sizes.length).toBe(4)
    for (const h of sizes) expect(h).toBeGreaterThanOrEqual(44)

    await page.click('[data-test="sign-out"]')
    await page.waitForURL(/\/login/)
    const me = await page.evaluate(() => fetch('/api/me').then(r => r.status))
    expect(me).toBe(401)
    expect(errors.filter(e => !e.includes('401'))).toEqual([])
    await context.close()
  })

  it('shows the server’s message for a wrong password, next to the form', async () => {
    const context = await newTabletContext(browser, 'portrait', { dark: true })
    const page = await context.newPage()
    await signIn(page, 'knitter@floatwise.test', 'not-the-password')
    await page.waitForSelector('[data-test="form-message"]')
    expect(await page.textContent('[data-test="form-message"]')).toContain('E-mail or password is wrong')
    await screenshot(page, 'login-error-portrait-dark')
    await context.close()
  })
})
