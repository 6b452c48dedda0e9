import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { signedIn } from '../support/api'
import { launchBrowser, screenshot, signIn, watchForErrors, seriousAxeViolations } from '../support/browser'

// Two people (or two tabs) editing one motif or plan: the one whose copy is old sees the other
// copy and chooses; nothing is overwritten silently and nothing of theirs is lost unasked.
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

const designer = 'designer@floatwise.test'
const owner = 'owner@floatwise.test'
const tag = () => Math.random().toString(36).slice(2, 7)

async function studioApi(email: string) {
  const api = await signedIn(email, 'floatwise-demo')
  const me = (await api.get('/api/me')).body
  const studioId = (me.studios.find((s: { personal: boolean }) => !s.personal) ?? me.studios[0]).id as number
  return { api, studioId }
}

/** A person's own browser at 1024 × 768 (a small laptop, or a tablet with the keyboard on), signed in, on `path`. */
async function openAs(email: string, path: string) {
  const context = await browser.newContext({ baseURL: inject('baseUrl'), viewport: { width: 1024, height: 768 }, deviceScaleFactor: 1 })
  const errors = watchForErrors(context)
  const page = await context.newPage()
  await page.goto('/login')
  await signIn(page, email)
  await page.waitForURL(url => url.pathname === '/')
  await page.goto(path)
  return { context, page, errors }
}

async function stitch(page: Page, row: number, col: number) {
  const grid = page.locator('[data-test="motif-grid"]')
  await grid.scrollIntoViewIfNeeded()
  const box = (await grid.boundingBox())!
  const size = Number(await grid.getAttribute('data-cell-size'))
  const gutterLeft = Number(await grid.getAttribute('data-gutter-left'))
  const scroll = await page.$eval('[data-test="motif-grid-box"]', el => ({ top: el.scrollTop, left: el.scrollLeft }))
  const heightRows = Number(await grid.getAttribute('data-height'))
  await page.mouse.click(box.x + gutterLeft + col * size + size / 2 - scroll.left, box.y + (heightRows - 1 - row) * size + size / 2 - scroll.top)
}
const saveState = (page: Page) => page.getAttribute('[data-test="motif-save-state"]', 'data-state')
async function waitForState(page: Page, state: string) {
  await page.waitForFunction(s => document.querySelector('[data-test="motif-save-state"]')?.getAttribute('data-state') === s, state, { timeout: 15_000 })
}

describe('two people editing one motif', () => {
  it('the one with the old copy sees both charts and chooses: Combine, Take theirs, Keep mine', async () => {
    const { api, studioId } = await studioApi(designer)
    const made = (await api.post('/api/motifs', { studioId, name: `Shared border ${tag()}`, rows: ['........', '........', '........', '........'] })).body
    const rows = async () => (await api.get(`/api/motifs/${made.id}`)).body.rows as string[]
    const idris = await openAs(designer, `/motifs/${made.id}`)
    const maren = await openAs(owner, `/motifs/${made.id}`)
    for (const { page } of [idris, maren]) await page.waitForSelector('[data-test="motif-grid"]')

    // Idris draws first and is saved; Maren, still on the copy she opened, draws elsewhere.
    await idris.page.click('[data-test="motif-colour-contrast"]')
    await stitch(idris.page, 0, 0)
    await waitForState(idris.page, 'saved')
    await maren.page.click('[data-test="motif-colour-contrast"]')
    await stitch(maren.page, 3, 7)
    await waitForState(maren.page, 'conflict')
    await screenshot(maren.page, 'motif-conflict-appears-1024x768')
    const banner = maren.page.locator('[data-test="motif-conflict"]')
    expect(await banner.textContent()).toContain('Idris Vale saved this motif')
    expect(await banner.textContent()).toContain('you changed 1 stitch and they changed 1 stitch')
    expect(await maren.page.textContent('[data-test="motif-save-state"]')).toContain('changed elsewhere')
    // Nothing of Maren's went over Idris's.
    expect(await rows()).toEqual(['x.......', '........', '........', '........'])
    // Her chart stays hers while she looks: one more stitch is kept, still not sent.
    await stitch(maren.page, 3, 6)
    await maren.page.waitForFunction(() => document.querySelector('[data-test="motif-conflict-counts"]')?.textContent?.includes('you changed 2 stitches'))
    expect(await rows()).toEqual(['x.......', '........', '........', '........'])
    await maren.page.locator('[data-test="motif-conflict"]').scrollIntoViewIfNeeded()
    await screenshot(maren.page, 'motif-conflict-1024x768')
    expect(await seriousAxeViolations(maren.page), 'conflict banner').toEqual([])

    // Combine: her two stitches on top of his chart.
    await maren.page.click('[data-test="motif-conflict-combine"]')
    await waitForState(maren.page, 'saved')
    expect(await maren.page.locator('[data-test="motif-conflict"]').count()).toBe(0)
    const combined = ['x.......', '........', '........', '......xx']
    expect(await rows()).toEqual(combined)

    // Idris's copy is old now: his next stitch meets the conflict; he takes theirs (the combined
    // chart), and his next change is made from it.
    await stitch(idris.page, 1, 1)
    await waitForState(idris.page, 'conflict')
    expect(await idris.page.textContent('[data-test="motif-conflict"]')).toContain('Maren Holt saved this motif')
    await idris.page.click('[data-test="motif-conflict-theirs-take"]')
    await waitForState(idris.page, 'saved')
    expect(await rows()).toEqual(combined)
    await stitch(idris.page, 2, 2)
    await waitForState(idris.page, 'saved')
    expect(await rows()).toEqual(['x.......', '........', '..x.....', '......xx'])

    // Maren's copy is the old one now; she keeps hers knowingly, over his.
    await stitch(maren.page, 0, 7)
    await waitForState(maren.page, 'conflict')
    await maren.page.click('[data-test="motif-conflict-mine-keep"]')
    await waitForState(maren.page, 'saved')
    expect(await rows()).toEqual(['x......x', '........', '........', '......xx'])
    expect(await saveState(idris.page)).toBe('saved')

    // A resized chart cannot be combined stitch by stitch: only the two whole copies are offered.
    await idris.page.fill('[data-test="motif-width"]', '6')
    await idris.page.click('[data-test="motif-resize"] button[type="submit"]')
    await waitForState(idris.page, 'conflict')
    expect(await idris.page.locator('[data-test="motif-conflict-combine"]').count()).toBe(0)
    expect(await idris.page.textContent('[data-test="motif-conflict"]')).toContain('Yours is 6 stitches × 4 rows, theirs 8 stitches × 4 rows')
    await idris.page.locator('[data-test="motif-conflict"]').scrollIntoViewIfNeeded()
    await screenshot(idris.page, 'motif-conflict-sizes-1024x768')
    await idris.page.click('[data-test="motif-conflict-theirs-take"]')
    await waitForState(idris.page, 'saved')
    expect(await idris.page.inputValue('[data-test="motif-width"]')).toBe('8')
    expect(await rows()).toEqual(['x......x', '........', '........', '......xx'])

    expect([...idris.errors, ...maren.errors].filter(e => !/status of (401|409)/.test(e))).toEqual([]) // sign-in asks who is signed in; the refused saves
    await idris.context.close()
    await maren.context.close()
  })
})

describe('two people editing one plan', () => {
  it('the later save sees what differs and takes theirs or keeps its own', async () => {
    const { api, studioId } = await studioApi(designer)
    const plan = (
      await api.post('/api/plans', {
        studioId,
        name: `Shared cardigan ${tag()}`,
        pieces: [{ name: 'Back', targetWidth: 40, targetLength: 50, sections: [{ kind: 'plain', rows: 10, yarn: 'A' }] }],
      })
    ).body
    const idris = await openAs(designer, `/plans/${plan.id}`)
    const maren = await openAs(owner, `/plans/${plan.id}`)
    for (const { page } of [idris, maren]) await page.waitForSelector('[data-test="plan-title"]')

    await idris.page.fill('[data-test="field-plan-name"]', 'Cardigan, Idris')
    await idris.page.click('[data-test="plan-save"]')
    await idris.page.waitForFunction(() => document.querySelector('[data-test="plan-title"]')?.textContent === 'Cardigan, Idris')
    await maren.page.fill('#plan-notes', 'Knit the ribs a size smaller')
    await maren.page.fill('[data-test="field-plan-name"]', 'Cardigan, Maren')
    await maren.page.click('[data-test="plan-save"]')
    await maren.page.waitForSelector('[data-test="plan-conflict"]')
    expect(await maren.page.textContent('[data-test="plan-conflict"]')).toContain('Idris Vale saved this plan')
    expect(await maren.page.textContent('[data-test="plan-conflict-differs"]')).toContain('name, notes')
    expect((await api.get(`/api/plans/${plan.id}`)).body).toMatchObject({ name: 'Cardigan, Idris', notes: '', version: 1 })
    await screenshot(maren.page, 'plan-conflict-1024x768')
    expect(await seriousAxeViolations(maren.page), 'plan conflict').toEqual([])

    await maren.page.click('[data-test="plan-conflict-mine-keep"]')
    await maren.page.waitForFunction(() => document.querySelector('[data-test="plan-title"]')?.textContent === 'Cardigan, Maren')
    expect((await api.get(`/api/plans/${plan.id}`)).body).toMatchObject({ name: 'Cardigan, Maren', notes: 'Knit the ribs a size smaller', version: 2 })

    // Idris, on version 1, changes the notes: he takes hers instead, and the page shows her plan.
    await idris.page.fill('#plan-notes', 'Ribs as written')
    await idris.page.click('[data-test="plan-save"]')
    await idris.page.waitForSelector('[data-test="plan-conflict"]')
    await idris.page.click('[data-test="plan-conflict-theirs-take"]')
    await idris.page.waitForFunction(() => document.querySelector('[data-test="plan-title"]')?.textContent === 'Cardigan, Maren')
    expect(await idris.page.inputValue('#plan-notes')).toBe('Knit the ribs a size smaller')
    expect((await api.get(`/api/plans/${plan.id}`)).body).toMatchObject({ notes: 'Knit the ribs a size smaller', version: 2 })

    expect([...idris.errors, ...maren.errors].filter(e => !/status of (401|409)/.test(e))).toEqual([]) // sign-in asks who is signed in; the refused saves
    await idris.context.close()
    await maren.context.close()
  })
})
