import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, newTabletContext, screenshot, signIn, watchForErrors } from '../support/browser'

// The script policy lists the shell's inline scripts by hash (security-headers.ts), so
// Chromium itself is the judge: a hash that does not match the bytes it parsed blocks the
// theme script or Nuxt's config, and the app does not start.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

/**
 * Every Content-Security-Policy violation the page reports, kept across navigations, and
 * whether `dark` reached <html> while the HTML was still being parsed: only the shell's
 * inline theme script can do that (the app's module scripts run after parsing).
 */
async function recordViolations(page: Page) {
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      const seen = JSON.parse(sessionStorage.getItem('csp-violations') ?? '[]')
      seen.push(`${e.effectiveDirective} ${e.blockedURI} ${e.sample}`)
      sessionStorage.setItem('csp-violations', JSON.stringify(seen))
    })
    new MutationObserver(() => {
      const w = window as { darkWhileParsing?: boolean }
      if (document.documentElement.classList.contains('dark')) w.darkWhileParsing ??= document.readyState === 'loading'
    }).observe(document, { attributes: true, attributeFilter: ['class'], subtree: true })
  })
  return {
    violations: () => page.evaluate(() => JSON.parse(sessionStorage.getItem('csp-violations') ?? '[]') as string[]),
    themeScriptRan: () => page.evaluate(() => (window as { darkWhileParsing?: boolean }).darkWhileParsing === true),
  }
}

describe('the hash-based script policy', () => {
  it('lets the app start, sign in and reload from the service worker with no violation and no unsafe-inline script', async () => {
    const context = await newTabletContext(browser, 'landscape', { dark: true })
    const errors = watchForErrors(context)
    const page = await context.newPage()
    const { violations, themeScriptRan } = await recordViolations(page)

    const shell = await page.goto('/login')
    expect(shell!.headers()['content-security-policy']).toMatch(/script-src 'self' 'sha256-[^']+'/)
    expect(shell!.headers()['content-security-policy']).not.toMatch(/script-src[^;]*unsafe-inline/)
    await signIn(page, 'knitter@floatwise.test')
    await page.waitForURL(url => url.pathname === '/')
    await page.waitForSelector('[data-test="dashboard"]')
    expect(await themeScriptRan()).toBe(true)

    // A reload answered by the service worker's cached shell (its own stored headers).
    await page.evaluate(() => navigator.serviceWorker.ready)
    await page.reload()
    await page.waitForSelector('[data-test="dashboard"]')
    expect(await page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true)
    expect(await themeScriptRan()).toBe(true)
    await page.goto('/projects')
    await page.waitForSelector('h1')
    await screenshot(page, 'csp-projects-dark')

    expect(await violations()).toEqual([])
    expect(errors.filter(e => !e.includes('401'))).toEqual([]) // /api/me before signing in
    await context.close()
  })
})
