import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, screenshot, screenshotDir, seriousAxeViolations, signedInPage as signedInTablet } from '../support/browser'

// The planner as a designer uses it (stock, a plan from a target size, shaping, publish) and
// as a knitter (a project from the published plan, then the knit view of its first piece).
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

const signedInPage = (email: string, orientation: 'landscape' | 'portrait' = 'landscape', dark = false) => signedInTablet(browser, email, orientation, dark)

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

    // The preview: one strip block and one table row per section with rows, and the piece drawn in its colours.
    const preview = page.locator('[data-test="piece-preview"]').first()
    expect(await preview.locator('[data-test="timeline-strip"] li').count()).toBe(3) // border, motif, shaping
    expect(await preview.locator('[data-test="timeline-table"] tbody tr').count()).toBe(3)
    const drawn = await preview.locator('[data-test="piece-picture"]').evaluate((el) => {
      const c = el as HTMLCanvasElement
      const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data
      const colours = new Set<string>()
      for (let i = 0; i < data.length; i += 4) if (data[i + 3]) colours.add(`${data[i]},${data[i + 1]},${data[i + 2]}`)
      return { width: c.width, colours: [...colours].sort() }
    })
    // 120 needles; cream #efe6d2 and ink blue #1d2f5a, nothing else.
    expect(drawn).toEqual({ width: 120, colours: ['239,230,210', '29,47,90'] })
    await preview.scrollIntoViewIfNeeded()
    await screenshot(page, 'planner-preview-landscape')

    // Sections drag by their grip: the shaping section goes above the motif, and the order is saved.
    const kinds = () => page.$$eval('[data-test="plan-section"]', els => els.map(e => e.getAttribute('data-kind')))
    expect(await kinds()).toEqual(['cast-on-note', 'plain', 'motif', 'shaping'])
    await page.locator('[data-test="plan-section"][data-kind="motif"]').evaluate(el => el.scrollIntoView({ block: 'start' }))
    const grip = await page.locator('[data-test="plan-section"][data-kind="shaping"] [data-test="section-grip"]').boundingBox()
    const target = await page.locator('[data-test="plan-section"][data-kind="motif"]').boundingBox()
    await page.mouse.move(grip!.x + grip!.width / 2, grip!.y + grip!.height / 2)
    await page.mouse.down()
    await page.mouse.move(grip!.x + 20, grip!.y - 10, { steps: 4 })
    await page.mouse.move(target!.x + 40, target!.y + 10, { steps: 12 })
    await page.mouse.up()
    await page.waitForFunction(
      () => [...document.querySelectorAll('[data-test="plan-section"]')].map(e => e.getAttribute('data-kind')).join() === 'cast-on-note,plain,shaping,motif',
    )
    await page.click('[data-test="plan-save"]')
    await page.waitForFunction(() => document.querySelector('[data-test="form-message"]')?.textContent?.includes('Saved'))
    await page.reload()
    await page.waitForSelector('[data-test="piece-needles"]')
    expect(await kinds()).toEqual(['cast-on-note', 'plain', 'shaping', 'motif'])
    await screenshot(page, 'planner-landscape')
    await page.locator('[data-test="plan-section"][data-kind="shaping"]').scrollIntoViewIfNeeded()
    await screenshot(page, 'planner-piece-landscape')
    await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight))
    await screenshot(page, 'planner-yarn-landscape')
    await page.goto(`/plans/${planId}/print`)
    await page.waitForSelector('[data-test="float-verdict"]')
    await screenshot(page, 'planner-print-landscape')
    // The sheet on paper, both sizes, kept beside the screenshots to look at.
    await page.emulateMedia({ media: 'print' })
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true, path: `${screenshotDir}/planner-sheet-${format}.pdf` })
      expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
      expect(pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g)?.length, `${format} pages`).toBeGreaterThanOrEqual(1)
    }
    await page.emulateMedia({ media: 'screen' })
    await page.goto(`/plans/${planId}`)
    await page.waitForSelector('[data-test="plan-publish"]')

    await page.click('[data-test="plan-publish"]')
    await page.waitForFunction(() => document.querySelector('[data-test="plan-state"]')?.textContent?.trim() === 'published')
    // Once published, it can be shared with someone outside the studio.
    await page.fill('[data-test="field-share-email"]', `guest-${Date.now()}@example.test`)
    await page.click('[data-test="plan-share-send"]')
    await page.waitForFunction(() => document.querySelector('[data-test="plan-share"] [data-test="form-message"]')?.textContent?.includes('Invitation sent'))
    // The stock page now counts the published plan against its yarns, and filters by name.
    await page.goto('/studio/stock')
    await page.fill('[data-test="yarn-filter-text"]', 'ink bl')
    await page.waitForFunction(() => document.querySelectorAll('[data-test="yarn-table"] tbody tr').length === 1)
    expect(await page.textContent('[data-test="yarn-table"] tbody tr [data-test="yarn-planned"]')).toMatch(/\d+ g\s*in \d+ published plans?/)
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
