import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { signedIn } from '../support/api'
import { launchBrowser, newTabletContext, screenshot, signIn, watchForErrors, seriousAxeViolations } from '../support/browser'

// The knit view as a knitter uses it: taps, a pedal, offline reloads, a second tablet.
// Each test knits a piece of its own (made through the API for the demo knitter), so tests
// never depend on each other's rows.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

async function freshPiece(pieces = ['Back']) {
  const api = await signedIn('knitter@floatwise.test', 'floatwise-demo')
  const studioId = (await api.get('/api/me')).body.studios[0].id
  const motifs = (await api.get(`/api/motifs?studioId=${studioId}&pageSize=200`)).body.items
  const yarns = (await api.get(`/api/yarns?studioId=${studioId}`)).body
  const yarn = (name: string) => yarns.find((y: { name: string }) => y.name === name).id
  const res = await api.post('/api/projects', {
    studioId, name: `Test jumper ${Math.random().toString(36).slice(2, 6)}`, motifId: motifs.find((m: { name: string }) => m.name === 'Marsh wave').id,
    borderBefore: 4, chartRows: 12, borderAfter: 4, needles: 60, technique: 'colour-by-colour', passesPerColour: 2,
    mainYarnId: yarn('Cream'), contrastYarnId: yarn('Ink blue'), pieces: pieces.map(name => ({ name })),
  })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return { api, project: res.body, pieceId: res.body.pieces[0].id as number }
}

async function openKnitView(context: BrowserContext, pieceId: number): Promise<Page> {
  const page = await context.newPage()
  await page.goto('/login')
  await signIn(page, 'knitter@floatwise.test')
  await page.waitForURL(url => url.pathname === '/')
  await page.goto(`/pieces/${pieceId}/knit`)
  await page.waitForSelector('[data-test="knit-row"]')
  return page
}

const completed = async (page: Page) => Number(await page.getAttribute('[data-test="knit-row"]', 'data-completed'))
async function waitForCompleted(page: Page, rows: number) {
  await page.waitForFunction(n => document.querySelector('[data-test="knit-row"]')?.getAttribute('data-completed') === String(n), rows)
}
async function waitForServerRows(api: Awaited<ReturnType<typeof signedIn>>, pieceId: number, rows: number) {
  for (let i = 0; i < 100; i++) {
    if ((await api.get(`/api/pieces/${pieceId}/progress`)).body.completedRows === rows) return
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`the server never reached ${rows} rows`)
}
async function waitForState(page: Page, state: string) {
  await page.waitForFunction(s => document.querySelector('[data-test="sync-state"]')?.getAttribute('data-state') === s, state, { timeout: 20_000 })
}

describe('the knit view', () => {
  it('advances by row pairs with taps and keys, says the yarn and the next change, and undoes', async () => {
    const { api, pieceId } = await freshPiece()
    const context = await newTabletContext(browser, 'landscape')
    const errors = watchForErrors(context)
    const page = await openKnitView(context, pieceId)
    expect(await completed(page)).toBe(0)
    expect(await page.textContent('[data-test="knit-yarn"]')).toBe('Cream')
    // 4 plain rows, then the motif colour by colour: Cream rows 5–6, Ink blue 7–8 …
    expect(await page.getAttribute('[data-test="knit-next-change"]', 'data-rows')).toBe('6')

    await page.click('[data-test="knit-advance"]')
    await waitForCompleted(page, 2)
    await page.keyboard.press('Space')
    await waitForCompleted(page, 4)
    await page.keyboard.press('PageDown')
    await waitForCompleted(page, 6)
    expect(await page.textContent('[data-test="knit-yarn"]')).toBe('Ink blue')
    await page.keyboard.press('ArrowLeft')
    await waitForCompleted(page, 4)
    await page.click('[data-test="knit-undo"]')
    await waitForCompleted(page, 2)
    await page.keyboard.press('Enter')
    await waitForCompleted(page, 4)
    await page.keyboard.press('ArrowRight')
    await waitForCompleted(page, 6)
    await screenshot(page, 'knit-landscape')

    await waitForServerRows(api, pieceId, 6)
    await waitForState(page, 'synced')
    expect(errors.filter(e => !e.includes('status of 401'))).toEqual([]) // the sign-in page asks who is signed in first
    await context.close()
  })

  it('keeps knitting offline through a reload and syncs the same row when the network returns', async () => {
    const { api, pieceId } = await freshPiece(['Front', 'Sleeve'])
    const context = await newTabletContext(browser, 'portrait')
    const page = await openKnitView(context, pieceId)
    await page.evaluate(() => navigator.serviceWorker.ready)
    await page.click('[data-test="knit-advance"]')
    await waitForCompleted(page, 2)
    await waitForServerRows(api, pieceId, 2)
    await waitForState(page, 'synced')

    await context.setOffline(true)
    await page.reload()
    await page.waitForSelector('[data-test="knit-row"]')
    expect(await completed(page)).toBe(2)
    for (let i = 0; i < 3; i++) {
      await page.click('[data-test="knit-advance"]')
      await waitForCompleted(page, 4 + 2 * i)
    }
    await waitForState(page, 'offline')
    expect(await page.textContent('[data-test="sync-state"]')).toContain('3')
    await screenshot(page, 'knit-portrait-offline')
    expect((await api.get(`/api/pieces/${pieceId}/progress`)).body.completedRows).toBe(2)

    await context.setOffline(false)
    await page.evaluate(() => window.dispatchEvent(new Event('online')))
    await waitForState(page, 'synced')
    const server = (await api.get(`/api/pieces/${pieceId}/progress`)).body
    expect(server.completedRows).toBe(await completed(page))
    expect(server.completedRows).toBe(8)

    // Another tablet opens the same piece and shows the same row.
    const other = await newTabletContext(browser, 'landscape')
    const second = await openKnitView(other, pieceId)
    await waitForCompleted(second, 8)
    await other.close()
    await context.close()
  })

  it('shows a conflict when two tablets moved on separately offline, and keeps the knitter’s choice', async () => {
    const { api, pieceId } = await freshPiece()
    const a = await newTabletContext(browser, 'landscape')
    const b = await newTabletContext(browser, 'landscape')
    const pageA = await openKnitView(a, pieceId)
    const pageB = await openKnitView(b, pieceId)
    await a.setOffline(true)
    await b.setOffline(true)
    await pageA.click('[data-test="knit-advance"]') // A: row 2
    await waitForCompleted(pageA, 2)
    for (let i = 0; i < 3; i++) { await pageB.click('[data-test="knit-advance"]'); await waitForCompleted(pageB, 2 + 2 * i) } // B: row 6

    await a.setOffline(false)
    await pageA.evaluate(() => window.dispatchEvent(new Event('online')))
    await waitForServerRows(api, pieceId, 2)
    await waitForState(pageA, 'synced')
    await b.setOffline(false)
    await pageB.evaluate(() => window.dispatchEvent(new Event('online')))
    await waitForState(pageB, 'conflict')
    await pageB.waitForSelector('[data-test="knit-conflict"]')
    expect(await pageB.textContent('[data-test="knit-conflict"]')).toMatch(/reached row 7 offline.*row 3 from another device/s)
    await screenshot(pageB, 'knit-conflict')
    expect((await api.get(`/api/pieces/${pieceId}/progress`)).body.completedRows).toBe(2)

    await pageB.click('[data-test="knit-keep-ours"]')
    await waitForServerRows(api, pieceId, 6)
    await waitForState(pageB, 'synced')
    expect((await api.get(`/api/pieces/${pieceId}/progress`)).body.completedRows).toBe(6)
    expect(await completed(pageB)).toBe(6)
    await a.close()
    await b.close()
  })

  it('jumps to a row only after confirming', async () => {
    const { pieceId } = await freshPiece()
    const context = await newTabletContext(browser, 'landscape')
    const page = await openKnitView(context, pieceId)
    await page.click('[data-test="knit-jump"]')
    await page.fill('[data-test="knit-jump-row"]', '11')
    await page.click('[data-test="knit-jump-confirm"]')
    expect(await completed(page)).toBe(0) // asked, not yet moved
    await page.click('[data-test="knit-jump-confirm"]')
    await waitForCompleted(page, 10)
    await context.close()
  })

  it('has no serious or critical accessibility problems (axe-core), in light and dark', async () => {
    const { pieceId } = await freshPiece()
    for (const dark of [false, true]) {
      const context = await newTabletContext(browser, 'landscape', { dark })
      const page = await openKnitView(context, pieceId)
      const serious = await seriousAxeViolations(page)
      expect(serious, dark ? 'dark theme' : 'light theme').toEqual([])
      if (dark) await screenshot(page, 'knit-landscape-dark')
      await context.close()
    }
  })
})
