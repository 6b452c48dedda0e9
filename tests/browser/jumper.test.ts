import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { shapedNeedles } from '#shared/engine'
import { signedIn } from '../support/api'
import { launchBrowser, screenshot, seriousAxeViolations, signedInPage as signedInTablet } from '../support/browser'

// The demo jumper from the plan to the needles: four sizes, a front with armholes and a round
// neck, set-in sleeves. Looked at on the most common tablet, 1024 × 768.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

const signedInPage = (email: string, viewport = { width: 1024, height: 768 }) => signedInTablet(browser, email, viewport)

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

    // The schematic of the front in S, its neck width labelled for every size.
    const schematic = front.locator('[data-test="piece-schematic"]')
    await schematic.scrollIntoViewIfNeeded()
    expect(await schematic.getAttribute('aria-label')).toContain('Front, drawn to scale')
    expect(await front.locator('[data-test="schematic-dimension"][data-key="neckWidth"]').textContent()).toMatch(/\(.*,.*,.*\) cm/)
    await screenshot(page, 'jumper-plan-schematic-1024x768')

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

  it('a knitter starts it in M and knits the front through the neckline: each side, its instructions and its needles', async () => {
    const { context, page, errors } = await signedInPage('knitter@floatwise.test')
    await openJumperPlan(page)
    await page.selectOption('[data-test="plan-start-size"]', { label: 'M' })
    expect(await page.textContent('[data-test="plan-start"]')).toBe('Start a project in M')
    await page.click('[data-test="plan-start"]')
    await page.waitForURL(url => /^\/projects\/\d+$/.test(url.pathname))
    const projectId = Number(new URL(page.url()).pathname.split('/').pop())
    const api = await signedIn('knitter@floatwise.test', 'floatwise-demo')
    const project = (await api.get(`/api/projects/${projectId}`)).body
    expect(project.pieces.map((p: any) => p.name)).toEqual(['Back', 'Front', 'Sleeve 1 of 2', 'Sleeve 2 of 2'])
    const front = (await api.get(`/api/pieces/${project.pieces[1].id}`)).body
    const shape = front.timeline.shape
    expect(shape).toMatchObject({ size: 'M', kind: 'body' })
    const needles = shapedNeedles(shape)
    const split = shape.rows.findIndex((r: any) => r.part === 'right')
    const other = shape.rows.findIndex((r: any) => r.part === 'left')
    const sideRows = other - split

    await page.goto(`/pieces/${front.id}/knit`)
    await page.waitForSelector('[data-test="knit-shaping"]')
    const jump = async (row: number) => {
      await page.click('[data-test="knit-jump"]')
      await page.fill('[data-test="knit-jump-row"]', String(row))
      const place = await page.textContent('[data-test="knit-jump-place"]')
      await page.click('[data-test="knit-jump-confirm"]')
      await page.click('[data-test="knit-jump-confirm"]')
      await page.waitForFunction(n => document.querySelector('[data-test="knit-row"]')?.getAttribute('data-completed') === String(n), row - 1)
      return place
    }
    const text = (hook: string) => page.textContent(`[data-test="${hook}"]`)

    // One row before the neck, the split is announced; on it, it is the thing to do.
    await jump(split)
    expect(await text('shaping-next')).toContain(`Cast off the centre ${shape.rows[split].castOff.centre} stitches`)
    // The jump says where it lands before it is made.
    expect(await jump(split + 1)).toBe(`Row ${split + 1}: Left side of neck, row 1 of ${sideRows}`)
    expect(await text('shaping-now')).toContain(`Cast off the centre ${shape.rows[split].castOff.centre} stitches`)
    expect(await text('shaping-now')).toContain(`Push the right ${shape.rows[split].held} needles to holding position`)
    expect(await text('shaping-part')).toContain(`Left side of neck · 1 of ${sideRows} rows`)
    expect(Number(await page.getAttribute('[data-test="needles-in-work"]', 'data-count'))).toBe(needles[split]!.knitTo - needles[split]!.knitFrom)
    expect(await text('needles-in-work')).toContain(`${shape.rows[split].held} in holding position`)
    await screenshot(page, 'jumper-knit-neck-1024x768')

    // Knit on by pairs to the end of this side: the step stops on its last row.
    await jump(other - 1)
    await page.click('[data-test="knit-advance"]')
    await page.waitForFunction(n => document.querySelector('[data-test="knit-row"]')?.getAttribute('data-completed') === String(n), other)
    expect(await text('shaping-now')).toContain(`Now the right side: bring the ${shape.rows[split].held} held needles back to work`)
    expect(await text('shaping-part')).toContain(`Right side of neck · 1 of ${sideRows} rows`)
    expect(Number(await page.getAttribute('[data-test="needles-in-work"]', 'data-count'))).toBe(needles[other]!.knitTo - needles[other]!.knitFrom)
    expect(await page.getAttribute('[data-test="carriage-side"]', 'data-before')).toBe(shape.rows[other].carriage === 'left' ? 'right' : 'left')
    await screenshot(page, 'jumper-knit-other-side-1024x768')
    for (const [name, viewport] of [['768x1024', { width: 768, height: 1024 }], ['390x844', { width: 390, height: 844 }]] as const) {
      await page.setViewportSize(viewport)
      await page.locator('[data-test="knit-shaping"]').scrollIntoViewIfNeeded()
      expect(await page.locator('[data-test="shaping-now"]').isVisible()).toBe(true)
      await screenshot(page, `jumper-knit-other-side-${name}`)
    }
    await page.setViewportSize({ width: 1024, height: 768 })
    expect(await seriousAxeViolations(page)).toEqual([])
    expect(errors.filter(e => !e.includes('status of 401'))).toEqual([])
    await context.close()
  })

  it('prints the sheet with every size\'s figures and each piece\'s schematic, on A4 and on Letter', async () => {
    for (const [paper, viewport] of [['a4', { width: 794, height: 1123 }], ['letter', { width: 816, height: 1056 }]] as const) {
      const { context, page, errors } = await signedInPage('designer@floatwise.test', viewport)
      await openJumperPlan(page)
      await page.click('[data-test="plan-size-tab"]:has-text("M")')
      await page.waitForSelector('[data-test="plan-size-tab"][aria-pressed="true"]:has-text("M")')
      await page.click('[data-test="plan-print"]')
      await page.waitForSelector('[data-test="piece-schematic"]')
      await page.emulateMedia({ media: 'print' })
      expect(await page.textContent('[data-test="sheet-sizes"]')).toContain('S (M, L, XL); rows and sections below are for M')
      expect(await page.locator('[data-test="piece-schematic"]').count()).toBe(3) // back, front, sleeve
      expect(await page.locator('[data-test="size-chosen"]').first().textContent()).toBe('M')
      await screenshot(page, `jumper-sheet-${paper}`)
      await page.locator('[data-test="piece-schematic"]').nth(1).scrollIntoViewIfNeeded()
      await screenshot(page, `jumper-sheet-${paper}-front`)
      expect(errors.filter(e => !e.includes('status of 401'))).toEqual([])
      await context.close()
    }
  })
})
