import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { chartFromRows, punchCard } from '#shared/engine'
import { signedIn } from '../support/api'
import { launchBrowser, screenshot, seriousAxeViolations, signedInPage } from '../support/browser'

// The printable punch card of a demo motif: every hole of the engine's card drawn, the ruler on
// the sheet, a width the repeat does not divide refused with the widths that fit.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('the punch card page', () => {
  it('draws the card of a motif at the default 24 holes across, and refuses a width its repeat does not divide', async () => {
    const api = await signedIn('designer@floatwise.test', 'floatwise-demo')
    const studioId = (await api.get('/api/me')).body.studios[0].id
    const motifs = (await api.get(`/api/motifs?studioId=${studioId}&pageSize=200`)).body.items
    const wave = motifs.find((m: { name: string }) => m.name === 'Marsh wave')
    const rows = (await api.get(`/api/motifs/${wave.id}`)).body.rows as string[]
    const card = punchCard(chartFromRows(rows), { width: 24, minRows: 36, joinRows: 2 })
    const punched = card.holes.reduce((n, h) => n + h, 0)

    const { context, page, errors } = await signedInPage(browser, 'designer@floatwise.test', { width: 1024, height: 768 })
    await page.goto(`/motifs/${wave.id}`)
    await page.click('[data-test="motif-punch-card"]')
    await page.waitForSelector('[data-test="card-svg"]')
    expect(await page.locator('[data-test="card-hole"]').count()).toBe(punched)
    expect(await page.locator('[data-test="card-ruler"]').count()).toBeGreaterThan(0)
    expect(await page.locator('[data-test="card-sheet"]').count()).toBeGreaterThan(0)
    expect(await page.getAttribute('[data-test="card-svg"]', 'width')).toMatch(/mm$/)
    await screenshot(page, 'punch-card-1024x768')
    expect(await seriousAxeViolations(page)).toEqual([])

    await page.fill('[data-test="card-width"]', '25')
    await page.waitForSelector('[data-test="card-width-warning"]')
    expect(await page.textContent('[data-test="card-width-warning"]')).toContain('25')
    expect(await page.locator('[data-test="card-svg"]').count()).toBe(0)
    await page.fill('[data-test="card-width"]', '24')
    await page.waitForSelector('[data-test="card-svg"]')
    await page.emulateMedia({ media: 'print' })
    await screenshot(page, 'punch-card-print')
    expect(errors.filter(e => !e.includes('status of 401'))).toEqual([])
    await context.close()
  })
})
