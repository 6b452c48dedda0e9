import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { apiClient, signedIn, type ApiClient } from '../support/api'
import { startExtraAppServer } from '../support/extraServer'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { chartPicture, pictureForm, pngBomb, webpBomb } from '../support/pictures'
import type { PicturePreview } from '#shared/types/motif'

// Decompression bombs: tiny files declaring large pictures. Under the caps they are read in a
// worker thread while the server keeps answering (over the pixel cap they are refused from the
// header: pictures.test.ts). A 4-megapixel all-zero PNG is about 19 KB with the Paeth filter on every row (about
// a second to decode and shrink here), 35 KB at 16 bits a channel (several seconds, up to the
// time limit on a busy machine); the WebP is 30 bytes.
const slowPng = () => pngBomb(2000, 2000, { paeth: true })
const slowestPng = () => pngBomb(2000, 2000, { bitDepth: 16, paeth: true })

let s: Awaited<ReturnType<typeof makeStudio>>
let designer: ApiClient
let owner: ApiClient

beforeAll(async () => {
  s = await makeStudio()
  designer = await signedIn(s.designer.email, fixturePassword)
  owner = await signedIn(s.owner.email, fixturePassword)
})
afterAll(closeTestDb)

// Untyped answers: a refusal's body is { message }, not a preview.
const preview = (client: ApiClient, bytes: Uint8Array, type = 'image/png') =>
  client.post(
    '/api/motifs/picture-preview',
    pictureForm({ studioId: s.studio.id, width: 4, height: 3 }, bytes, type === 'image/png' ? 'bomb.png' : 'bomb.webp', type),
  )

async function healthMs(baseUrl = inject('baseUrl')) {
  const start = performance.now()
  const res = await fetch(`${baseUrl}/api/health`)
  await res.arrayBuffer()
  if (!res.ok) throw new Error(`/api/health answered ${res.status}`)
  return performance.now() - start
}
const p95 = (ms: number[]) => [...ms].sort((a, b) => a - b)[Math.ceil(ms.length * 0.95) - 1]!
const round = (ms: number) => Math.round(ms * 10) / 10

describe('pictures are read off the request thread', () => {
  it('/api/health stays quick while bombs just under the pixel cap are read', { timeout: 90_000 }, async () => {
    const bombs = [slowPng(), webpBomb(2000, 2000)] // made first: deflating blocks this process too
    for (let i = 0; i < 5; i++) await healthMs() // warm up
    const idle: number[] = []
    for (let i = 0; i < 40; i++) idle.push(await healthMs())

    // Polled back to back for as long as the uploads are in flight.
    const during: number[] = []
    let uploading = true
    const started = performance.now()
    const uploads = (async () => {
      try {
        return [await preview(designer, bombs[0]!), await preview(designer, bombs[1]!, 'image/webp')]
      }
      finally { uploading = false }
    })()
    while (uploading) during.push(await healthMs())
    const answers = await uploads
    const uploadMs = performance.now() - started

    for (const res of answers) {
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      expect(res.body.rows).toEqual(['....', '....', '....']) // transparent black over white: all light
    }
    const limit = Math.max(5 * p95(idle), 100)
    console.log(`health idle p95 ${round(p95(idle))} ms (max ${round(Math.max(...idle))}); while two 4-megapixel bombs were read (${Math.round(uploadMs)} ms): `
      + `p95 ${round(p95(during))} ms, max ${round(Math.max(...during))} ms, ${during.length} calls; limit ${round(limit)} ms`)
    expect(during.length).toBeGreaterThan(2)
    expect(p95(during)).toBeLessThanOrEqual(limit)
  })
})

describe('one picture at a time per user', () => {
  it('a user\'s uploads wait their turn; a fourth at once → 429 with Retry-After, and another user is not held up', { timeout: 90_000 }, async () => {
    const bomb = pngBomb(2000, 2000)
    const mine = await Promise.all([1, 2, 3, 4].map(() => preview(designer, bomb)))
    const statuses = mine.map(r => r.status).sort()
    expect(statuses, JSON.stringify(mine.map(r => r.body))).toEqual([200, 200, 200, 429])
    const refused = mine.find(r => r.status === 429)!
    expect(refused.body.message).toContain('You already have 3 pictures being read or waiting to be')
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)

    // Users take turns: with the designer's line full, the owner's picture is read before the
    // designer's last one (on a one-worker server it goes second, not fourth).
    const finished: string[] = []
    const track = (who: string, answer: ReturnType<typeof preview>) => answer.then((res) => { finished.push(who); return res })
    const full = [1, 2, 3].map(i => track(`designer ${i}`, preview(designer, bomb)))
    await new Promise(r => setTimeout(r, 50)) // the designer's three are in the line first
    const other = await track('owner', preview(owner, chartPicture(['x..x', '.xx.', 'xxx.'])))
    expect(other.status, JSON.stringify(other.body)).toBe(200)
    expect((await Promise.all(full)).map(r => r.status)).toEqual([200, 200, 200])
    expect(finished.at(-1), finished.join(', ')).not.toBe('owner')
  })
})

describe('a picture that takes too long', () => {
  let server: Awaited<ReturnType<typeof startExtraAppServer>>
  beforeAll(async () => {
    // A time limit far below what the slowest 4-megapixel PNG takes (seconds), far above a
    // tiny picture (a millisecond, more on a busy machine).
    server = await startExtraAppServer({ NUXT_PICTURE_DECODE_TIMEOUT_MS: '500' })
  })
  afterAll(() => server?.close())

  it('is stopped → 422 saying so, and the next picture is read as usual', async () => {
    const client = apiClient(server.baseUrl)
    const login = await client.post('/api/auth/login', { email: s.designer.email, password: fixturePassword })
    expect(login.status).toBe(200)
    const form = (bytes: Uint8Array) => pictureForm({ studioId: s.studio.id, width: 4, height: 3 }, bytes)
    const slow = await client.post('/api/motifs/picture-preview', form(slowestPng()))
    expect(slow.status, JSON.stringify(slow.body)).toBe(422)
    expect(slow.body.message).toContain('took too long to read and was stopped (reading took longer than 500 ms)')
    const quick = await client.post<PicturePreview>('/api/motifs/picture-preview', form(chartPicture(['x..x', '.xx.', 'xxx.'])))
    expect(quick.status, JSON.stringify(quick.body)).toBe(200)
    expect(quick.body.rows).toEqual(['x..x', '.xx.', 'xxx.'])
    expect(await healthMs(server.baseUrl)).toBeLessThan(1000)
  })
})
