// Page budgets, run by `npm run bench` (one bench: `npm run bench -- budgets`): JavaScript
// each page makes the browser load (gzipped), the knit view's first paint offline from the
// service worker's cache under 4× CPU throttling, and Lighthouse scores. Prints figures
// against their budgets; never asserts on them.
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import * as chromeLauncher from 'chrome-launcher'
import lighthouse from 'lighthouse'
import desktopConfig from 'lighthouse/core/config/desktop-config.js'
import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, expect, inject, it } from 'vitest'
import { signedIn, type ApiClient } from '../support/api'
import { root } from '../support/appServer'
import { launchBrowser, tablet } from '../support/browser'

let browser: Browser
let knitter: ApiClient
let designer: ApiClient
const pages: Record<'knit view' | 'motif editor' | 'planner', { path: string; as: () => ApiClient }> = {} as never

beforeAll(async () => {
  browser = await launchBrowser()
  knitter = await signedIn('knitter@floatwise.test', 'floatwise-demo')
  designer = await signedIn('designer@floatwise.test', 'floatwise-demo')
  const studioId = (await designer.get('/api/me')).body.studios[0].id as number
  const projects = (await knitter.get(`/api/projects?studioId=${studioId}`)).body
  const project = (await knitter.get(`/api/projects/${(Array.isArray(projects) ? projects : projects.items)[0].id}`)).body
  const motifs = (await designer.get(`/api/motifs?studioId=${studioId}&pageSize=200`)).body
  const motif = (Array.isArray(motifs) ? motifs : motifs.items).find((m: { name: string }) => m.name === 'Marsh wave')
  pages['knit view'] = { path: `/pieces/${project.pieces[0].id}/knit`, as: () => knitter }
  pages['motif editor'] = { path: `/motifs/${motif.id}`, as: () => designer }
  pages.planner = { path: `/plans/${await makePlan(studioId, motif.id)}`, as: () => designer }
})
afterAll(async () => { await browser?.close() })

/** A plan with a plain and a motif section on the demo stock, so the planner has numbers to show. */
async function makePlan(studioId: number, motifId: number) {
  const machines = (await designer.get(`/api/machines?studioId=${studioId}`)).body
  const yarns = (await designer.get(`/api/yarns?studioId=${studioId}`)).body
  const swatch = await designer.post('/api/swatches', { studioId, stitches: 30, rows: 40, width: 10, height: 10, unit: 'cm', grams: 4, yarnId: yarns[0].id })
  const plan = await designer.post('/api/plans', {
    studioId, name: 'Bench plan', machineId: machines[0].id, swatchId: swatch.body.id,
    yarns: [{ slot: 'A', yarnId: yarns[0].id }, { slot: 'B', yarnId: yarns[1].id }],
    pieces: [{ name: 'Back', targetWidth: 50, targetLength: 60, unit: 'cm', sections: [
      { kind: 'plain', lengthCm: 5, yarn: 'A' },
      { kind: 'motif', motifId, placement: 'centred', chartRows: 40, main: 'A', contrast: 'B' },
    ] }],
  })
  expect(plan.status, JSON.stringify(plan.body)).toBe(201)
  return plan.body.id as number
}

async function signedInContext(client: ApiClient, options: { serviceWorkers?: 'allow' | 'block' } = {}): Promise<BrowserContext> {
  const context = await browser.newContext({ baseURL: inject('baseUrl'), viewport: tablet.landscape, hasTouch: true, ...options })
  const [name, value] = client.cookie.split(/=(.*)/s) as [string, string]
  await context.addCookies([{ name, value, url: inject('baseUrl') }])
  return context
}

it('JavaScript each page loads, gzipped, against 200 KB', async () => {
  const rows = []
  for (const [name, { path, as }] of Object.entries(pages)) {
    // No service worker: it would fetch the whole precache list alongside the page.
    const context = await signedInContext(as(), { serviceWorkers: 'block' })
    const page = await context.newPage()
    const scripts = new Map<string, number>()
    page.on('response', async (res) => {
      if (res.request().resourceType() !== 'script' || !res.ok()) return
      scripts.set(res.url(), gzipSync(await res.body()).length)
    })
    await page.goto(path, { waitUntil: 'networkidle' })
    await page.waitForTimeout(500)
    await context.close()
    const kb = [...scripts.values()].reduce((a, b) => a + b, 0) / 1024
    rows.push({ 'page': name, path, 'scripts': scripts.size, 'KB gzipped': +kb.toFixed(1), 'budget KB': 200, 'ratio to budget': +(kb / 200).toFixed(2) })
  }
  console.log('\nJavaScript loaded per page (script responses until network idle, each gzipped with node:zlib)')
  console.table(rows)
  expect(rows.every(r => r.scripts > 0)).toBe(true)
})

it('knit view: first paint offline from the service worker cache, 4× CPU throttling, against 1 s', async () => {
  const { path } = pages['knit view']
  const context = await signedInContext(knitter)
  const page = await context.newPage()
  await page.goto(path)
  await page.waitForSelector('[data-test="knit-row"]')
  await page.evaluate(() => navigator.serviceWorker.ready)
  await page.reload() // now controlled by the worker, runtime caches filled
  await page.waitForSelector('[data-test="knit-row"]')
  await context.setOffline(true)
  const cdp = await context.newCDPSession(page)
  const runs: { paint: number; row: number }[] = []
  for (let i = 0; i < 6; i++) {
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 })
    await page.goto(path)
    await page.waitForSelector('[data-test="knit-row"]')
    runs.push(await page.evaluate(() => ({
      paint: performance.getEntriesByName('first-contentful-paint')[0]?.startTime ?? Number.NaN,
      row: performance.now(),
    })))
  }
  await context.close()
  const median = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
  const measured = runs.slice(1) // the first warms the worker up
  const paint = median(measured.map(r => r.paint))
  const row = median(measured.map(r => r.row))
  console.log(
    `\nknit view offline (service worker cache, 4× CPU throttling, median of ${measured.length}): first contentful paint ${paint.toFixed(0)} ms (ratio to 1 s: ${(paint / 1000).toFixed(2)}); knit row on screen ${row.toFixed(0)} ms (ratio ${(row / 1000).toFixed(2)})`,
  )
  expect(measured.every(r => Number.isFinite(r.paint))).toBe(true)
})

it('Lighthouse: performance, accessibility and best practices (goal ≥ 90 each)', async () => {
  const rows = []
  for (const [settings, config] of [['mobile (default)', undefined], ['desktop', desktopConfig]] as const) {
    for (const [name, { path, as }] of Object.entries(pages)) {
      // A fresh profile per page: cookies the server set for one person must not ride along
      // with the next person's Cookie header.
      const chrome = await chromeLauncher.launch({
        chromePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
        chromeFlags: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      })
      try {
        const result = await lighthouse(inject('baseUrl') + path, {
          port: chrome.port, output: 'json', logLevel: 'error',
          onlyCategories: ['performance', 'accessibility', 'best-practices'],
          extraHeaders: { Cookie: as().cookie },
        }, config)
        const lhr = result!.lhr
        // The whole report, to read which element or metric cost the points.
        mkdirSync(join(root, 'test-results/lighthouse'), { recursive: true })
        writeFileSync(join(root, 'test-results/lighthouse', `${name.replace(/ /g, '-')}-${settings.split(' ')[0]}.json`), JSON.stringify(lhr))
        const score = (id: string) => Math.round((lhr.categories[id]?.score ?? Number.NaN) * 100)
        const misses = Object.values(lhr.audits).filter(a => a.score !== null && a.score < 0.9 && a.scoreDisplayMode === 'binary').map(a => a.id)
        rows.push({
          settings, 'page': name, 'final URL': new URL(lhr.finalDisplayedUrl).pathname,
          'performance': score('performance'), 'accessibility': score('accessibility'), 'best-practices': score('best-practices'),
          'FCP s': +((lhr.audits['first-contentful-paint']?.numericValue ?? Number.NaN) / 1000).toFixed(1),
          'failed checks': misses.join(', '),
        })
      }
      finally {
        chrome.kill()
      }
    }
  }
  console.log('\nLighthouse 12 (simulated throttling); goal ≥ 90 each')
  console.table(rows)
  // A page that bounced to the sign-in form would score the wrong page.
  expect(rows.map(r => r['final URL'])).toEqual([...Object.values(pages), ...Object.values(pages)].map(p => p.path))
})
