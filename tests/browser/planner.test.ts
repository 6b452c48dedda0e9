import { createRequire } from 'node:module'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, newTabletContext, screenshot, signIn, watchForErrors } from '../support/browser'

// The planner as a designer uses it (stock, a plan from a target size, shaping, publish) and
// as a knitter (a project from the published plan, then the knit view of its first piece).
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

async function signedInPage(email: string, orientation: 'landscape' | 'portrait' = 'landscape', dark = false) {
  const context = await newTabletContext(browser, orientation, { dark })
  const errors = watchForErrors(context)
  const page = await context.newPage()
  await page.goto('/login')
  await signIn(page, email)
  await page.waitForURL(url => url.pathname === '/')
  return { context, page, errors }
}

async function seriousAxeViolations(page: Page) {
  await page.addScriptTag({ path: createRequire(import.meta.url).resolve('axe-core/axe.min.js') })
  const result = await page.evaluate(async () => (window as unknown as { axe: { run: () => Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe.run())
  return result.violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => `${v.id} (${v.nodes.map(n => n.target.join(' ')).join(', ')})`)
}

async function chooseOption(page: Page, selector: string, text: string) {
  const value = await page.$eval(selector, (el, t) => [...(el as HTMLSelectElement).options].find(o => o.textContent?.includes(t))?.value, text)
  expect(value, `an option with “${text}” in ${selector}`).toBeTruthy()
  await page.selectOption(selector, value!)
}

describe('the planner', () => {
  let planId = 0

  it('a designer records a swatch, makes a plan from a target size, adds shaping and publishes', async () => {
    const { context, page, errors } = await signedInPage('designer@floatwise.test')
    const stitchSize = `test ${Math.random().toString(36).slice(2, 7)}`

    await page.goto('/studio/stock')
    await page.waitForSelector('[data-test="machine-table"]')
    // A refused field is named next to its input, in the server's words.
    await page.click('[data-test="yarn-add"]')
    await page.fill('[data-test="field-yarn-name"]', 'Not a colour')
    await page.fill('[data-test="field-yarn-hex"]', 'red')
    await page.click('[data-test="yarn-save"]')
    await page.waitForSelector('[data-test="yarn-form"] .field-error')
    expect(await page.textContent('[data-test="yarn-form"] .field-error')).toContain('#1a2b3c')
    await page.click('[data-test="yarn-form"] >> text=Cancel')
    await page.click('[data-test="swatch-add"]')
    await page.waitForSelector('[data-test="swatch-form"]')
    await page.selectOption('[data-test="field-swatch-machine"]', { index: 1 })
    await page.fill('[data-test="field-swatch-stitch-size"]', stitchSize)
    await chooseOption(page, '#swatch-mainYarnId', 'Cream')
    await chooseOption(page, '#swatch-contrastYarnId', 'Ink blue')
    await page.fill('[data-test="field-swatch-stitches"]', '30')
    await page.fill('[data-test="field-swatch-rows"]', '40')
    await page.fill('[data-test="field-swatch-width"]', '10')
    await page.fill('[data-test="field-swatch-height"]', '10')
    await page.fill('#swatch-weight', '12')
    // 30 stitches over 10 cm: 30.5 per 4 in, so 1 Super Fine (common practice: CYC table).
    expect(await page.textContent('[data-test="swatch-preview"]')).toContain('30.0 stitches × 40.0 rows per 10 cm')
    await page.locator('[data-test="swatch-form"]').scrollIntoViewIfNeeded()
    await screenshot(page, 'planner-swatch-form-landscape')
    await page.click('[data-test="swatch-save"]')
    await page.waitForSelector(`[data-test="swatch-row"]:has-text("${stitchSize}")`)
    const row = await page.textContent(`[data-test="swatch-row"]:has-text("${stitchSize}")`)
    expect(row).toContain('30.5 st × 40.6 rows') // per 4 in
    expect(row).toContain('3.33 × 2.50 mm')
    expect(row).toContain('1 Super Fine')
    await screenshot(page, 'planner-stock-landscape')

    await page.goto('/plans')
    await page.click('[data-test="new-plan"]')
    await page.fill('[data-test="field-plan-name"]', `Test plan ${stitchSize}`)
    await chooseOption(page, '[data-test="field-plan-swatch"]', stitchSize)
    await page.fill('[data-test="field-plan-targetWidth"]', '40')
    await page.fill('[data-test="field-plan-targetLength"]', '50')
    await page.click('[data-test="create-plan"]')
    await page.waitForURL(url => /^\/plans\/\d+$/.test(url.pathname))
    planId = Number(new URL(page.url()).pathname.split('/').pop())
    // 40 cm at 30 stitches per 10 cm: 120 needles.
    await page.waitForSelector('[data-test="piece-needles"]')
    expect(await page.textContent('[data-test="piece-needles"]')).toBe('120')

    await page.selectOption('[data-test="section-kind"]', 'motif')
    await page.click('[data-test="section-add"]')
    await page.selectOption('[data-test="section-kind"]', 'shaping')
    await page.click('[data-test="section-add"]')
    const shaping = page.locator('[data-test="plan-section"][data-kind="shaping"]')
    await shaping.locator('[data-test="section-stitches"]').fill('8')
    await shaping.locator('[data-test="section-rows"]').fill('60')
    await page.click('[data-test="plan-save"]')
    // 8 decreases over 60 rows (common practice: spread evenly).
    await page.waitForSelector('[data-test="shaping-text"]')
    expect(await page.textContent('[data-test="shaping-text"]')).toMatch(/every \d+(st|nd|rd|th) row/)
    expect(Number(await page.textContent('[data-test="total-rows"]'))).toBeGreaterThan(60)
    await page.waitForSelector('[data-test="yarn-estimate"]')
    expect(await page.textContent('[data-test="yarn-estimate"]')).toContain('Cream')
    expect(await page.textContent('[data-test="yarn-estimate"]')).toContain('Ink blue')
    expect(await page.textContent('[data-test="plan-section"][data-kind="motif"] [data-test="section-numbers"]')).toMatch(/\d+ full repeats of \d+/)
    expect(Number(await page.textContent('[data-test="total-changes"]'))).toBeGreaterThan(0)
    await screenshot(page, 'planner-landscape')
    await page.locator('[data-test="plan-section"][data-kind="shaping"]').scrollIntoViewIfNeeded()
    await screenshot(page, 'planner-piece-landscape')
    await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight))
    await screenshot(page, 'planner-yarn-landscape')
    await page.goto(`/plans/${planId}/print`)
    await page.waitForSelector('[data-test="float-verdict"]')
    await screenshot(page, 'planner-print-landscape')
    await page.goto(`/plans/${planId}`)
    await page.waitForSelector('[data-test="plan-publish"]')

    await page.click('[data-test="plan-publish"]')
    await page.waitForFunction(() => document.querySelector('[data-test="plan-state"]')?.textContent?.trim() === 'published')
    // Once published, it can be shared with someone outside the studio.
    await page.fill('[data-test="field-share-email"]', `guest-${Date.now()}@example.test`)
    await page.click('[data-test="plan-share-send"]')
    await page.waitForFunction(() => document.querySelector('[data-test="plan-share"] [data-test="form-message"]')?.textContent?.includes('Invitation sent'))
    // The sign-in page asks who is signed in first (401); the refused yarn above is a 400.
    expect(errors.filter(e => !/status of 40[01]/.test(e))).toEqual([])
    await context.close()
  })

  it('a knitter starts a project from the published plan and knits its first piece', async () => {
    expect(planId).toBeGreaterThan(0)
    const { context, page } = await signedInPage('knitter@floatwise.test', 'portrait')
    await page.goto('/plans')
    await page.waitForSelector(`a[href="/plans/${planId}"]`)
    await page.goto(`/plans/${planId}`)
    await page.waitForSelector('[data-test="plan-start"]')
    expect(await page.$('[data-test="plan-save"]')).toBeNull()
    await screenshot(page, 'planner-knitter-portrait')
    await page.click('[data-test="plan-start"]')
    await page.waitForURL(url => /^\/projects\/\d+$/.test(url.pathname))
    await page.click('[data-test="knit-piece"] >> nth=0')
    await page.waitForURL(url => /^\/pieces\/\d+\/knit$/.test(url.pathname))
    await page.waitForSelector('[data-test="knit-row"]')
    await context.close()
  })

  it('has no serious or critical accessibility problems on the stock and planner pages, light and dark', async () => {
    expect(planId).toBeGreaterThan(0)
    for (const dark of [false, true]) {
      const { context, page } = await signedInPage('designer@floatwise.test', dark ? 'portrait' : 'landscape', dark)
      await page.goto('/studio/stock')
      await page.waitForSelector('[data-test="swatch-table"]')
      expect(await seriousAxeViolations(page), `stock, ${dark ? 'dark' : 'light'}`).toEqual([])
      if (dark) await screenshot(page, 'planner-stock-portrait-dark')
      await page.goto(`/plans/${planId}`)
      await page.waitForSelector('[data-test="piece-numbers"]')
      expect(await seriousAxeViolations(page), `planner, ${dark ? 'dark' : 'light'}`).toEqual([])
      if (dark) await screenshot(page, 'planner-portrait-dark')
      await page.goto('/plans')
      await page.waitForSelector('[data-test="plan-list"]')
      expect(await seriousAxeViolations(page), `plan list, ${dark ? 'dark' : 'light'}`).toEqual([])
      await context.close()
    }
  })

  it('keeps touch targets at 44 px or more on the planner', async () => {
    const { context, page } = await signedInPage('designer@floatwise.test', 'portrait')
    await page.goto(`/plans/${planId}`)
    await page.waitForSelector('[data-test="piece-numbers"]')
    const small = await page.$$eval('main button, main select, main input:not([type="checkbox"])', els => els
      .map(e => ({ e, r: e.getBoundingClientRect() }))
      .filter(({ r }) => r.width > 0 && (r.height < 44 || r.width < 44))
      .map(({ e, r }) => `${e.tagName} ${e.id || e.textContent?.trim()} ${Math.round(r.width)}×${Math.round(r.height)}`))
    expect(small).toEqual([])
    await context.close()
  })
})
