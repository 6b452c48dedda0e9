import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { signedIn } from '../support/api'
import { launchBrowser, newTabletContext, screenshot, signIn, watchForErrors } from '../support/browser'

// Names that look like HTML and SQL are kept and shown exactly as typed, and never run.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

const designer = 'designer@floatwise.test'
const hostile = `<script>window.__xss=1</script><img src=x onerror="window.__xss=2">' OR 1=1; -- ${Math.random().toString(36).slice(2, 7)}`

async function notRun(page: Page) {
  expect(await page.evaluate(() => (window as unknown as { __xss?: number }).__xss)).toBeUndefined()
}

describe('names that look like code', () => {
  it('a motif and a plan named with a script tag and SQL are stored byte for byte and shown as text everywhere', async () => {
    const api = await signedIn(designer, 'floatwise-demo')
    const me = (await api.get('/api/me')).body
    const studioId = (me.studios.find((s: { personal: boolean }) => !s.personal) ?? me.studios[0]).id as number
    const motif = await api.post('/api/motifs', { studioId, name: hostile, rows: ['x.', '.x'] })
    expect(motif.status).toBe(201)
    const plan = await api.post('/api/plans', {
      studioId,
      name: hostile,
      yarns: [],
      pieces: [
        {
          name: hostile,
          targetWidth: 20,
          targetLength: 10,
          sections: [
            { kind: 'cast-on-note', text: hostile },
            { kind: 'plain', rows: 4, yarn: 'A' },
          ],
        },
      ],
    })
    expect(plan.status, JSON.stringify(plan.body)).toBe(201)
    // The API gives the text back exactly as sent.
    expect((await api.get(`/api/motifs/${motif.body.id}`)).body.name).toBe(hostile)
    expect((await api.get(`/api/plans/${plan.body.id}`)).body.name).toBe(hostile)

    const context = await newTabletContext(browser)
    const errors = watchForErrors(context)
    const dialogs: string[] = []
    const page = await context.newPage()
    page.on('dialog', (d) => { dialogs.push(d.message()); void d.dismiss() })
    await page.goto('/login')
    await signIn(page, designer)
    await page.waitForURL(url => url.pathname === '/')
    const signedInAt = errors.length // the login page's own "who am I?" is a 401 before sign-in

    await page.goto('/motifs')
    await page.fill('[data-test="motif-search"]', hostile.slice(-5))
    const row = page.locator('[data-test="motif-row"]', { hasText: hostile.slice(-5) }).first()
    await row.waitFor()
    expect(await row.getAttribute('data-name')).toBe(hostile)
    expect(await row.textContent()).toContain(hostile)
    await notRun(page)

    await page.goto(`/motifs/${motif.body.id}`)
    await page.waitForSelector('[data-test="motif-name"]')
    expect(await page.inputValue('[data-test="motif-name"]')).toBe(hostile)
    await notRun(page)

    await page.goto(`/plans/${plan.body.id}`)
    await page.waitForSelector('[data-test="plan-title"]')
    expect(await page.textContent('[data-test="plan-title"]')).toBe(hostile)
    await notRun(page)

    await page.goto(`/plans/${plan.body.id}/print`)
    await page.waitForSelector('h1')
    expect(await page.textContent('h1')).toBe(hostile)
    expect(await page.textContent('body')).toContain(hostile)
    await notRun(page)
    await screenshot(page, 'hostile-name-print')

    // No image from the name was ever requested, no dialog opened, nothing went wrong.
    expect(await page.locator('img[src="x"]').count()).toBe(0)
    expect(dialogs).toEqual([])
    expect(errors.slice(signedInAt)).toEqual([])
    await context.close()
  })
})
