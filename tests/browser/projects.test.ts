import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newTabletContext, screenshot, signIn, seriousAxeViolations } from '../support/browser'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('projects', () => {
  it('the demo knitter carries on from the projects page and starts a new project with the form', async () => {
    const context = await newTabletContext(browser, 'portrait')
    const page = await context.newPage()
    await page.goto('/projects')
    await page.waitForURL(url => url.pathname === '/login') // sent to sign in first, coming back after
    await signIn(page, 'knitter@floatwise.test')
    await page.waitForSelector('[data-test="project-list"]')
    // The page offers to carry on with the piece knitted most recently (other test files knit
    // pieces of their own as this knitter, so ask the server which one that is).
    const pieces = (await page.evaluate(() => fetch('/api/pieces').then(r => r.json()))) as {
      projectName: string
      name: string
      completedRows: number
      totalRows: number
      lastKnittedAt: string | null
    }[]
    const latest = pieces.find(p => p.completedRows < p.totalRows && p.lastKnittedAt)!
    expect(await page.textContent('[data-test="resume-piece"]')).toContain(`${latest.projectName} · ${latest.name}`)
    expect(await page.textContent('[data-test="project-list"]')).toContain('Marsh wave jumper')
    await screenshot(page, 'projects-portrait')

    await page.click('[data-test="new-project"]')
    await page.waitForSelector('[data-test="new-project-form"]')
    await page.fill('[data-test="field-name"]', 'Tide cushion')
    await page.selectOption('[data-test="field-motif"]', { label: 'Pebble check · 4 × 4 · floats tidy' })
    await page.selectOption('[data-test="field-mainYarnId"]', { label: 'Cream (#efe6d2)' })
    await page.selectOption('[data-test="field-contrastYarnId"]', { label: 'Charcoal (#33383b)' })
    expect(await page.textContent('[data-test="colour-judgement"]')).toContain('Easy to tell apart')
    await screenshot(page, 'new-project-portrait')
    await page.click('[data-test="create-project"]')
    await page.waitForURL(url => /^\/projects\/\d+$/.test(url.pathname))
    await page.waitForSelector('[data-test="piece-list"]')
    expect(await page.textContent('h1')).toBe('Tide cushion')
    expect(await page.locator('[data-test="knit-piece"]').count()).toBe(2) // Back and Front by default

    await page.locator('[data-test="knit-piece"]').first().click()
    await page.waitForSelector('[data-test="knit-row"]')
    expect(await page.getAttribute('[data-test="knit-row"]', 'data-completed')).toBe('0')
    await context.close()
  })

  it('shows the form’s field errors next to the fields', async () => {
    const context = await newTabletContext(browser, 'landscape')
    const page = await context.newPage()
    await page.goto('/projects/new')
    await page.waitForURL(url => url.pathname === '/login')
    await signIn(page, 'knitter@floatwise.test')
    await page.waitForSelector('[data-test="new-project-form"]')
    await page.click('[data-test="create-project"]')
    await page.waitForSelector('[data-test="form-message"]')
    expect(await page.textContent('[data-test="new-project-form"]')).toMatch(/name: is required|is required/)
    expect(await seriousAxeViolations(page)).toEqual([])
    await context.close()
  })
})
