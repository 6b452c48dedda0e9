import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { chartPicture, jpegOf, pictureForm, pngBomb, pngOf, webpBomb } from '../support/pictures'
import { Motif } from '../../server/db/models'
import { chartToRows, imageToChart, otsuThreshold } from '#shared/engine'
import type { PicturePreview } from '#shared/types/motif'

// Pictures are made here with pngjs and jpeg-js; the WebP files in tests/fixtures/pictures
// were made once with cwebp 1.2.4 from the same 4 × 3 chart (10 px cells) as `chartRows`:
// lossless (VP8L), lossy (VP8) and lossy with transparent light cells (VP8X).
const chartRows = ['x..x', '.xx.', 'xxx.'] // rows[0] first knitted = bottom band of the picture
const fixture = (name: string) => readFileSync(join(import.meta.dirname, '../fixtures/pictures', name))

let s: Awaited<ReturnType<typeof makeStudio>>
let designer: ApiClient
let knitter: ApiClient
let outsider: ApiClient
const picturesDir = inject('picturesDir')

beforeAll(async () => {
  s = await makeStudio()
  designer = await signedIn(s.designer.email, fixturePassword)
  knitter = await signedIn(s.knitter.email, fixturePassword)
  outsider = await signedIn(s.outsider.email, fixturePassword)
})
afterAll(closeTestDb)

const upload = (client: ApiClient, fields: Record<string, string | number | boolean>, bytes?: Uint8Array, filename?: string, type?: string) =>
  client.post('/api/motifs/from-picture', pictureForm({ studioId: s.studio.id, name: 'From a picture', width: 4, height: 3, ...fields }, bytes, filename, type))
const preview = (fields: Record<string, string | number | boolean>, bytes: Uint8Array) =>
  designer.post<PicturePreview>('/api/motifs/picture-preview', pictureForm({ studioId: s.studio.id, ...fields }, bytes))

async function rawGet(client: ApiClient, path: string) {
  const res = await fetch(inject('baseUrl') + path, { headers: { cookie: client.cookie } })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}

const storedFiles = () => new Set(existsSync(picturesDir) ? readdirSync(picturesDir) : [])
const studioMotifs = () => Motif.count({ where: { studioId: s.studio.id } })

/**
 * Asserts that a refused upload stored nothing: no motif row in this studio, and every
 * picture file that appeared meanwhile belongs to another studio's motif (other test files
 * upload through the same server at the same time; their rows may commit a moment later).
 */
async function expectNothingStored(before: { rows: number; files: Set<string> }) {
  expect(await studioMotifs()).toBe(before.rows)
  for (const file of storedFiles()) {
    if (before.files.has(file)) continue
    let owner: Motif | null = null
    for (let i = 0; i < 20 && !owner; i++) {
      owner = await Motif.findByPk(Number(file))
      if (!owner) await new Promise(r => setTimeout(r, 100))
    }
    expect(owner, `picture ${file} has no motif`).not.toBeNull()
    expect(owner!.studioId).not.toBe(s.studio.id)
  }
}
const snapshot = async () => ({ rows: await studioMotifs(), files: storedFiles() })

describe('from a picture to a motif', () => {
  it('a PNG converts to the expected chart and the original is served back byte-identical', async () => {
    const png = chartPicture(chartRows)
    const made = await upload(designer, { name: 'Drawn chart' }, png)
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    expect(made.body).toMatchObject({
      name: 'Drawn chart',
      width: 4,
      height: 3,
      rows: chartRows,
      published: false,
      picture: { url: `/api/motifs/${made.body.id}/picture` },
    })
    expect(made.body.floatReport).not.toBeNull()

    const back = await rawGet(designer, made.body.picture!.url)
    expect(back.status).toBe(200)
    expect(back.headers.get('content-type')).toBe('image/png')
    expect(back.headers.get('x-content-type-options')).toBe('nosniff')
    // Not kept in the browser's cache, where the next person on a shared tablet could open it.
    expect(back.headers.get('cache-control')).toBe('no-store')
    expect(back.bytes.equals(png)).toBe(true)
    expect(readFileSync(join(picturesDir, String(made.body.id))).equals(png)).toBe(true)

    // Same visibility as the motif: a draft's picture does not exist for knitters or strangers.
    expect((await rawGet(knitter, made.body.picture!.url)).status).toBe(404)
    expect((await rawGet(outsider, made.body.picture!.url)).status).toBe(404)
    await designer.patch(`/api/motifs/${made.body.id}`, { published: true })
    expect((await rawGet(knitter, made.body.picture!.url)).bytes.equals(png)).toBe(true)
  })

  it('a JPEG converts too (flat 16 px cells survive the compression)', async () => {
    const made = await upload(designer, {}, chartPicture(chartRows, 16, jpegOf), 'photo.jpg', 'image/jpeg')
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    expect(made.body.rows).toEqual(chartRows)
    expect((await rawGet(designer, made.body.picture!.url)).headers.get('content-type')).toBe('image/jpeg')
  })

  it.each([
    ['lossless (VP8L)', 'chart-lossless.webp'],
    ['lossy (VP8)', 'chart-lossy.webp'],
    ['lossy with transparency (VP8X)', 'chart-alpha.webp'],
  ])('a WebP picture converts: %s', async (_, name) => {
    const webp = fixture(name)
    const made = await upload(designer, {}, webp, name, 'image/webp')
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    expect(made.body.rows).toEqual(chartRows)
    const back = await rawGet(designer, made.body.picture!.url)
    expect(back.headers.get('content-type')).toBe('image/webp')
    expect(back.bytes.equals(webp)).toBe(true)
  })

  it('invert makes dark cells main colour; the threshold decides what is dark', async () => {
    const inverted = await upload(designer, { invert: true }, chartPicture(chartRows))
    expect(inverted.body.rows).toEqual(chartRows.map(r => r.replace(/x/g, 'o').replace(/\./g, 'x').replace(/o/g, '.')))
    const allLight = await upload(designer, { threshold: 0 }, chartPicture(chartRows, 10, (w, h, px) => pngOf(w, h, (x, y) => {
      const [r] = px(x, y)
      return r === 0 ? [60, 60, 60, 255] : [255, 255, 255, 255] // dark grey: above threshold 0
    })))
    expect(allLight.body.rows).toEqual(['....', '....', '....'])
  })

  it('deleting the motif removes its stored picture', async () => {
    const made = await upload(designer, {}, chartPicture(chartRows))
    expect(existsSync(join(picturesDir, String(made.body.id)))).toBe(true)
    expect((await designer.delete(`/api/motifs/${made.body.id}`)).status).toBe(204)
    expect(existsSync(join(picturesDir, String(made.body.id)))).toBe(false)
  })
})

describe('preview', () => {
  // Four grey levels side by side, one per stitch: 40, 100, 160, 220.
  const greys = [40, 100, 160, 220]
  const steps = pngOf(40, 10, x => [greys[Math.floor(x / 10)]!, greys[Math.floor(x / 10)]!, greys[Math.floor(x / 10)]!, 255])

  it('answers the chart, the threshold used and Otsu\'s value, and stores nothing', async () => {
    const before = await snapshot()
    const otsu = otsuThreshold(Array.from({ length: 256 }, (_, level) => (greys.includes(level) ? 1 : 0)))
    const auto = await preview({ width: 4, height: 1 }, steps)
    expect(auto.status, JSON.stringify(auto.body)).toBe(200)
    expect(auto.body).toEqual({ width: 4, height: 1, threshold: otsu, otsu, rows: [otsu >= 100 ? 'xx..' : 'x...'] })
    const asked = await preview({ width: 4, height: 1, threshold: 200 }, steps)
    expect(asked.body).toEqual({ width: 4, height: 1, threshold: 200, otsu, rows: ['xxx.'] })
    await expectNothingStored(before)
  })

  it('Otsu\'s value is the engine\'s own: a noisy picture gives imageToChart\'s chart', async () => {
    let seed = 7
    const random = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31
    const width = 53, height = 37
    const rgba = new Uint8Array(width * height * 4)
    for (let i = 0; i < rgba.length; i++) rgba[i] = i % 4 === 3 ? 128 + Math.floor(random() * 128) : Math.floor(random() * 256)
    const png = pngOf(width, height, (x, y) => Array.from(rgba.subarray((y * width + x) * 4, (y * width + x) * 4 + 4)) as [number, number, number, number])
    const res = await preview({ width: 9, height: 7 }, png)
    expect(res.status).toBe(200)
    expect(res.body.rows).toEqual(chartToRows(imageToChart(rgba, width, height, { width: 9, height: 7 })))
    expect(res.body.threshold).toBe(res.body.otsu)
  })
})

describe('refused pictures store nothing', () => {
  it('a knitter may not upload (403), before the file is even looked at', async () => {
    expect((await upload(knitter, {}, Buffer.from('not a picture'))).status).toBe(403)
    expect((await upload(outsider, {}, chartPicture(chartRows))).status).toBe(404)
  })

  it('a damaged PNG (cut short) → 422', async () => {
    const before = await snapshot()
    const png = chartPicture(chartRows)
    const res = await upload(designer, {}, png.subarray(0, Math.floor(png.length / 2)))
    expect(res.status).toBe(422)
    expect(res.body.message).toContain('could not be read')
    await expectNothingStored(before)
  })

  // A header that reads right (so the type and size pass) over damaged or missing picture data.
  const garbage = (n: number) => Buffer.from(Array.from({ length: n }, (_, i) => (i * 37 + 11) % 256))
  const jpeg = () => chartPicture(chartRows, 10, jpegOf)
  const headerOver = (bytes: Buffer, keep: number) => Buffer.concat([bytes.subarray(0, keep), garbage(bytes.length - keep)])
  it.each([
    ['a JPEG cut after its size', () => { const j = jpeg(); return j.subarray(0, j.indexOf(Buffer.from([0xFF, 0xC0])) + 12) }, 'jpg', 'image/jpeg'],
    ['a JPEG header over garbage', () => { const j = jpeg(); return headerOver(j, j.indexOf(Buffer.from([0xFF, 0xC0])) + 12) }, 'jpg', 'image/jpeg'],
    ['a lossy WebP cut short', () => fixture('chart-lossy.webp').subarray(0, 40), 'webp', 'image/webp'],
    ['a lossless WebP header over garbage', () => headerOver(fixture('chart-lossless.webp'), 25), 'webp', 'image/webp'],
    ['a WebP with transparency cut short', () => fixture('chart-alpha.webp').subarray(0, 34), 'webp', 'image/webp'],
    ['a PNG header over garbage', () => headerOver(chartPicture(chartRows), 33), 'png', 'image/png'],
  ])('%s → 422, nothing stored', async (_, bytes, ext, type) => {
    const before = await snapshot()
    const res = await upload(designer, {}, bytes(), `chart.${ext}`, type)
    expect(res.status, JSON.stringify(res.body)).toBe(422)
    expect(res.body.message).toContain('could not be read')
    await expectNothingStored(before)
  })

  it('a text file named .png and declared image/png → 415', async () => {
    const before = await snapshot()
    const res = await upload(designer, {}, Buffer.from('hello, I am only text\n'.repeat(20)), 'chart.png', 'image/png')
    expect(res.status).toBe(415)
    expect(res.body.message).toContain('PNG, JPEG or WebP')
    await expectNothingStored(before)
  })

  it('a file over 5 MB → 413 (from the route), and a body over 6 MB → 413 (before it is read)', async () => {
    const before = await snapshot()
    const big = Buffer.alloc(5 * 1024 * 1024 + 1024)
    chartPicture(chartRows).copy(big)
    const res = await upload(designer, {}, big)
    expect(res.status).toBe(413)
    expect(res.body.message).toContain('at most 5 MB')
    const huge = await upload(designer, {}, Buffer.alloc(7 * 1024 * 1024))
    expect(huge.status).toBe(413)
    await expectNothingStored(before)
  })

  it('a picture over 4096 × 4096 → 422 from its header, without decoding it', async () => {
    const before = await snapshot()
    // A real PNG whose header is rewritten to claim 100000 × 100000 pixels (CRC left stale:
    // the size is refused before anything reads further).
    const claim = Buffer.from(chartPicture(chartRows))
    claim.writeUInt32BE(100_000, 16)
    claim.writeUInt32BE(100_000, 20)
    const res = await upload(designer, {}, claim)
    expect(res.status).toBe(422)
    expect(res.body.message).toContain('100000 × 100000 pixels; at most 4096 × 4096')
    // And a real one, one pixel too wide.
    const wide = await upload(designer, {}, pngOf(4097, 1, () => [0, 0, 0, 255]))
    expect(wide.status).toBe(422)
    expect(wide.body.message).toContain('4097 × 1 pixels')
    await expectNothingStored(before)
  })

  // Decompression bombs (tests/support/pictures.ts): valid pictures a decoder would spend
  // seconds and hundreds of MB on, refused from the header alone.
  it.each([
    ['a 30-byte WebP declaring 4096 × 4096', () => webpBomb(4096, 4096), 'webp', '4096 × 4096 pixels, 16,777,216 in all'],
    ['an all-zero PNG one row over 4 megapixels', () => pngBomb(2000, 2001), 'png', '2000 × 2001 pixels, 4,002,000 in all'],
  ])('%s → 422 naming its size and the pixel cap, nothing stored', async (_, bomb, ext, size) => {
    const before = await snapshot()
    const res = await upload(designer, {}, bomb(), `bomb.${ext}`, `image/${ext}`)
    // Decoding would have made a motif (201: both are valid pictures) or said "could not be read".
    expect(res.status, JSON.stringify(res.body)).toBe(422)
    expect(res.body.message).toContain(size)
    expect(res.body.message).toContain('at most 4,000,000 (4 megapixels, 2000 × 2000 for example) are accepted')
    await expectNothingStored(before)
  })

  it.each([
    ['no file', {}, undefined, 'picture'],
    ['a chart too wide', { width: 201 }, 'png', 'width'],
    ['a threshold out of range', { threshold: 256 }, 'png', 'threshold'],
    ['no name', { name: '' }, 'png', 'name'],
  ])('%s → 400 naming the field', async (_, fields, file, words) => {
    const before = await snapshot()
    const res = await upload(designer, fields, file ? chartPicture(chartRows) : undefined)
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(words)
    await expectNothingStored(before)
  })

  it('a JSON body instead of a form → 400', async () => {
    const res = await designer.post('/api/motifs/from-picture', { studioId: s.studio.id, name: 'x', width: 4, height: 3 })
    expect(res.status).toBe(400)
    expect(res.body.message).toContain('multipart/form-data')
  })
})
