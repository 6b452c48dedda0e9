import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newTabletContext, screenshot, signIn, seriousAxeViolations } from '../support/browser'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('the studio page', () => {
  it('shows the owner the projects in production and the members, without serious accessibility problems', async () => {
    const context = await newTabletContext(browser, 'landscape')
    const page = await context.newPage()
    await page.goto('/login')
    await signIn(page, 'owner@floatwise.test')
    await page.waitForURL(url => url.pathname === '/')
    await page.goto('/studio')
    await page.waitForSelector('[data-test="production"] li')
    expect(await page.textContent('[data-test="production"]')).toContain('Marsh wave jumper')
    expect(await page.textContent('[data-test="member-list"]')).toContain('Tamsin Roe')
    await screenshot(page, 'studio-owner-landscape')
    expect(await seriousAxeViolations(page)).toEqual([])
    await context.close()
  })

  it('does not show a knitter the production list', async () => {
    const context = await newTabletContext(browser, 'portrait')
    const page = await context.newPage()
    await page.goto('/login')
    await signIn(page, 'knitter@floatwise.test')
    await page.waitForURL(url => url.pathname === '/')
    await page.goto('/studio')
    await page.waitForSelector('[data-test="member-list"] li')
    expect(await page.locator('[data-test="production"]').count()).toBe(0)
    await context.close()
  })
})
