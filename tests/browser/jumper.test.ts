import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { launchBrowser, screenshot, seriousAxeViolations, signIn, watchForErrors } from '../support/browser'

// The demo jumper from the plan to the needles: four sizes, a front with armholes and a round
// neck, set-in sleeves. Looked at on the most common tablet, 1024 × 768.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

async function signedInPage(email: string, viewport = { width: 1024, height: 768 }): Promise<{ context: BrowserContext; page: Page; errors: string[] }> {
  const context = await browser.newContext({ baseURL: inject('baseUrl'), viewport, deviceScaleFactor: 1, hasTouch: true })
  const errors = watchForErrors(context)
  const page = await context.newPage()
  await page.goto('/login')
  await signIn(page, email)
  await page.waitForURL(url => url.pathname === '/')
  return { context, page, errors }
}

async function openJumperPlan(page: Page) {
  await page.goto('/plans')
  await page.click('text=Marsh wave jumper plan')
  await page.waitForSelector('[data-test="plan-size-tabs"]')
}

describe('the demo jumper', () => {
  it('a designer reads every size\'s numbers, first size then the others, and switches the size they are worked out for', async () => {
    const { context, page, errors } = await signedInPage('designer@floatwise.test')
    await openJumperPlan(page)
    expect(await page.locator('[data-test="plan-size-tab"]').allTextContents()).toEqual(['S', 'M', 'L', 'XL'])
    const front = page.locator('[data-test="plan-piece"]').nth(1)
    const castOn = front.locator('[data-test="size-count"]').first()
    expect(await castOn.textContent()).toMatch(/Cast on \(stitches\)\s*126 \(141, 156, 171\)/)
    expect(await front.locator('[data-test="size-chosen"]').first().textContent()).toBe('S')
    expect(await front.locator('[data-test="piece-needles"]').textContent()).toBe('126')
    await screenshot(page, 'jumper-plan-1024x768')
    await front.scrollIntoViewIfNeeded()
    await screenshot(page, 'jumper-plan-front-1024x768')

    await page.click('[data-test="plan-size-tab"]:has-text("L")')
    await page.waitForSelector('[data-test="plan-size-tab"][aria-pressed="true"]:has-text("L")')
    expect(await front.locator('[data-test="piece-needles"]').textContent()).toBe('156')
    expect(await front.locator('[data-test="size-count"] strong').first().textContent()).toBe('156')
    expect(await seriousAxeViolations(page)).toEqual([])
    // The page itself never scrolls sideways (the measurement table scrolls in its own box).
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    expect(errors.filter(e => !e.includes('status of 401'))).toEqual([]) // the sign-in page asks who is signed in first
    await context.close()
  })
})
