import { mkdirSync, readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { join } from 'node:path'
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { inject } from 'vitest'
import { root } from './appServer'

// Debian's chromium, driven by playwright-core (no browser download of its own).
const flags = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync']

export const screenshotDir = join(root, 'test-results/screenshots')

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: flags })
}

export const tablet = {
  landscape: { width: 1180, height: 820 },
  portrait: { width: 820, height: 1180 },
}

/** A touch screen: one of the tablet orientations, or a viewport of its own (a phone, a 1024 × 768 tablet). */
export async function newTabletContext(
  browser: Browser, orientation: keyof typeof tablet | { width: number; height: number } = 'landscape', options: { dark?: boolean } = {},
) {
  return browser.newContext({
    baseURL: inject('baseUrl'),
    viewport: typeof orientation === 'string' ? tablet[orientation] : orientation,
    deviceScaleFactor: 1,
    hasTouch: true,
    colorScheme: options.dark ? 'dark' : 'light',
  })
}

export async function signIn(page: Page, email: string, password = 'floatwise-demo') {
  if (!new URL(page.url()).pathname.startsWith('/login')) await page.goto('/login')
  await page.waitForSelector('[data-test="login-form"]')
  await page.fill('[data-test="field-email"]', email)
  await page.fill('[data-test="field-password"]', password)
  await page.click('[data-test="login-submit"]')
}

/** A new touch-screen context with the demo person signed in and on the home page, watching for errors. */
export async function signedInPage(
  browser: Browser, email: string, orientation: Parameters<typeof newTabletContext>[1] = 'landscape', dark = false,
): Promise<{ context: BrowserContext; page: Page; errors: string[] }> {
  const context = await newTabletContext(browser, orientation, { dark })
  const errors = watchForErrors(context)
  const page = await context.newPage()
  await page.goto('/login')
  await signIn(page, email)
  await page.waitForURL(url => url.pathname === '/')
  return { context, page, errors }
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(screenshotDir, { recursive: true })
  const path = join(screenshotDir, `${name}.png`)
  await page.screenshot({ path, fullPage: false })
  return path
}

/** Collects page errors and failed same-origin requests, so a test can say none happened. */
export function watchForErrors(context: BrowserContext) {
  const errors: string[] = []
  context.on('weberror', e => errors.push(`page error: ${e.error().message}`))
  context.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`) })
  return errors
}

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

/**
 * Puts axe-core (window.axe) into the page. Evaluated through DevTools rather than added as
 * a <script> tag: the page's policy runs no inline script without its hash (security-headers.ts),
 * and a test must not loosen the policy it runs under.
 */
export async function addAxe(page: Page) {
  await page.evaluate(`${axeSource}\n;void 0`)
}

/** axe-core's serious and critical findings on the page, each as "rule (where)"; [] when none. */
export async function seriousAxeViolations(page: Page): Promise<string[]> {
  await addAxe(page)
  const result = await page.evaluate(async () =>
    (window as unknown as { axe: { run: () => Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe.run(),
  )
  return result.violations
    .filter(v => v.impact === 'serious' || v.impact === 'critical')
    .map(v => `${v.id} (${v.nodes.map(n => n.target.join(' ')).join(', ')})`)
}
