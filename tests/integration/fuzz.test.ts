import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { apiClient, signedIn, type ApiResponse } from '../support/api'
import { closeTestDb, fixturePassword, makeProject, makeStock, makeStudio } from '../support/db'
import { brokenBody, hostileQueryValue, hostileSegment, hostileValue, limitChanges, pathsOf, withChanges, withValueAt } from '../support/fuzzValues'
import { chartPicture } from '../support/pictures'
import { apiRoutes, clientFor, roleMatrix, spareSession, type Call, type Fixture } from '../support/routeCalls'
import { storedRows } from '../support/storedRows'
import { Machine, Plan, Swatch } from '../../server/db/models'

// Every route of the role matrix, called by the studio's owner with generated bodies, path
// parameters and queries: never a 5xx, a refusal is a 4xx whose message names the problem,
// and a refused write leaves both studios' rows exactly as they were.
// FLOATWISE_FUZZ_RUNS raises the number of generated cases per route for a deeper run.
const runs = Number(process.env.FLOATWISE_FUZZ_RUNS ?? 12)
const seed = Number(process.env.FLOATWISE_FUZZ_SEED ?? Date.now() % 2 ** 31)

/** Routes that read no body: anything sent is ignored, so a 2xx is right. */
const ignoresBody = (route: string) => route === 'POST /api/auth/logout' || route.startsWith('DELETE ')

/** For each route with path parameters: the id of a row of that kind in another studio. */
type Foreign = Awaited<ReturnType<typeof foreignStock>>
const foreignParams: Record<string, (g: Foreign) => Record<string, number | string>> = {
  '/api/motifs/[id]': g => ({ id: g.motif.id }),
  '/api/machines/[id]': g => ({ id: g.machine.id }),
  '/api/yarns/[id]': g => ({ id: g.main.id }),
  '/api/swatches/[id]': g => ({ id: g.swatch.id }),
  '/api/plans/[id]': g => ({ id: g.plan.id }),
  '/api/projects/[id]': g => ({ id: g.project.id }),
  '/api/pieces/[id]': g => ({ id: g.piece.id }),
  '/api/studios/[studioId]': g => ({ studioId: g.studioId }),
  // A token is no studio's id: another studio's pending invitation is just a valid link.
  '/api/invitations/[token]': () => ({}),
  // Another person's device: one's own sessions only.
  '/api/me/sessions/[id]': g => ({ id: g.session.id }),
}

/** Body fields that name a row, and which row of the other studio to put there. */
const foreignBodyIds: Record<string, (g: Foreign) => number> = {
  studioId: g => g.studioId,
  motifId: g => g.motif.id,
  yarnId: g => g.main.id,
  mainYarnId: g => g.main.id,
  contrastYarnId: g => g.contrast.id,
  machineId: g => g.machine.id,
  swatchId: g => g.swatch.id,
  pieceId: g => g.piece.id,
  pieceIds: g => g.piece.id,
}

async function foreignStock(f: Fixture) {
  const studioId = f.elsewhere.id
  const stock = await makeStock(studioId)
  const machine = await Machine.create({ studioId, name: 'Foreign machine', needlePitchMm: 4.5, needles: 200, patterningWidth: 24 })
  const swatch = await Swatch.create({
    studioId,
    machineId: null,
    mainYarnId: null,
    contrastYarnId: null,
    stitches: 30,
    rows: 40,
    width: 10,
    height: 10,
    unit: 'cm',
    grams: 6,
  })
  const plan = await Plan.create({
    studioId,
    name: 'Foreign plan',
    machineId: null,
    swatchId: null,
    yarns: [],
    published: true,
    createdBy: null,
    updatedBy: null,
  })
  const { project, pieces } = await makeProject({ studioId, knitterId: f.outsider.id, pieces: ['Back'] })
  const session = await spareSession(f.outsider)
  return { studioId, ...stock, machine, swatch, plan, project, piece: pieces[0]!, session }
}

let f: Fixture
let g: Foreign
let ownerCookie = ''
let studioIds: number[] = []
beforeAll(async () => {
  f = await makeStudio()
  g = await foreignStock(f)
  studioIds = [f.studio.id, f.elsewhere.id]
  ownerCookie = (await signedIn(f.owner.email, fixturePassword)).cookie
})
afterAll(closeTestDb)

/** A fresh client with the owner's cookie, so a sign-out or sign-in in one case changes no other. */
function asOwner() {
  const client = apiClient()
  client.cookie = ownerCookie
  return client
}

/** A 4xx a person can act on: a message of several words naming the problem, no internals. */
function expectClearRefusal(res: ApiResponse, what: string) {
  expect(res.status, what).toBeGreaterThanOrEqual(400)
  expect(res.status, what).toBeLessThan(500)
  const message: unknown = res.body?.message
  expect(typeof message, `${what}: ${JSON.stringify(res.body)}`).toBe('string')
  expect((message as string).split(/\s+/).length, `${what}: "${message}" is not a sentence`).toBeGreaterThanOrEqual(2)
  expect(JSON.stringify(res.body), what).not.toMatch(/"stack"|\.(m?js|ts):\d+|Sequelize|SqlError|ER_[A-Z_]{4,}|Internal Server Error/)
}

/** Sends one call as the owner; a refusal must be clear and, for a write, store nothing. */
async function probe(call: Call, headers: Record<string, string> = {}, what = `${call.method} ${call.path}`) {
  const write = call.method !== 'GET'
  // A row that ends sessions runs on a session (or as a person) of its own: see Row.ends.
  const row = roleMatrix.find(r => r.ends && routeMatches(r.route, call))
  const client = row ? (await clientFor(f, 'owner', row, asOwner)).client : asOwner()
  const before = write ? await storedRows(studioIds) : undefined
  const res = await client.request(call.method, call.path, call.body, headers)
  expect(res.status, `${what} → ${res.status} ${JSON.stringify(res.body)}`).toBeLessThan(500)
  if (res.status >= 400) {
    expectClearRefusal(res, what)
    if (write) expect(await storedRows(studioIds), `${what} was refused but changed rows`).toEqual(before)
  }
  return res
}

/** Whether a concrete call is one of a route's (its `[name]` segments match any segment). */
function routeMatches(route: string, call: Call) {
  const [method, pattern] = route.split(' ') as [string, string]
  const parts = call.path.split('?')[0]!.split('/')
  const want = pattern.split('/')
  return method === call.method && parts.length === want.length && want.every((w, i) => w.startsWith('[') || w === parts[i])
}

const fuzz = (property: fc.IAsyncProperty<[unknown]> | fc.IAsyncProperty<[string]>, numRuns = runs) =>
  fc.assert(property as fc.IAsyncProperty<unknown[]>, { numRuns, seed, endOnFailure: true })

const jsonRoutes = roleMatrix.filter(r => !r.route.startsWith('GET ') && !r.route.includes('picture'))
const formRoutes = roleMatrix.filter(r => r.route.includes('picture') && !r.route.startsWith('GET '))
const paramRoutes = roleMatrix.filter(r => r.route.includes('['))
const getRoutes = roleMatrix.filter(r => r.route.startsWith('GET '))
const writeRoutes = roleMatrix.filter(r => !r.route.startsWith('GET '))

/** The path's segments at the route's `[name]` places: { name: index }. */
function paramPlaces(route: string) {
  const places: Record<string, number> = {}
  route.split(' ')[1]!.split('/').forEach((s, i) => { if (s.startsWith('[')) places[s.slice(1, -1)] = i })
  return places
}
function withParam(path: string, index: number, segment: string) {
  const [pathname, query] = path.split('?')
  const parts = pathname!.split('/')
  parts[index] = segment
  return parts.join('/') + (query ? `?${query}` : '')
}

describe('generated bodies', () => {
  it.each(jsonRoutes.map(r => [r.route, r]))('%s: a broken JSON body is never a 5xx', async (_, row) => {
    const valid = await row.call(f, 'owner')
    await fuzz(fc.asyncProperty(brokenBody(valid.body), async (body) => {
      await probe({ ...valid, body: body === undefined ? {} : body })
    }))
  })

  // Values that pass validation but sit at a limit: what the server derives from them must fit too.
  // Each case gets a fresh valid call (a new address, an unused invitation, a new piece), so the
  // server gets as far as deriving names and dates from what it was sent.
  it.each(jsonRoutes.map(r => [r.route, r]))('%s: a body with values at their limits is never a 5xx', async (_, row) => {
    const shape = await row.call(f, 'owner')
    await fuzz(fc.asyncProperty(limitChanges(shape.body), async (changes) => {
      const valid = await row.call(f, 'owner')
      await probe({ ...valid, body: withChanges(valid.body, changes) })
    }) as unknown as fc.IAsyncProperty<[unknown]>)
  }, Math.max(30_000, runs * 2_000)) // a fresh call can hash a password (accepting an invitation)

  it.each(formRoutes.map(r => [r.route, r]))('%s: a broken form is never a 5xx', async (_, row) => {
    const valid = await row.call(f, 'owner')
    const fields = Object.fromEntries([...(valid.body as FormData).entries()].filter(([, v]) => typeof v === 'string')) as Record<string, string>
    const png = chartPicture(['x.', '.x'])
    const pictures = fc.oneof(
      fc.constant(undefined),
      fc.uint8Array({ maxLength: 300 }),
      fc.nat({ max: png.length - 1 }).map(n => png.subarray(0, n)),
      fc.uint8Array({ minLength: 1, maxLength: 300 }).map(junk => Buffer.concat([png.subarray(0, 33), junk])),
    )
    const field = fc.constantFrom(...Object.keys(fields))
    const form = fc.record({
      field,
      value: fc.oneof(
        hostileValue.map(v => (typeof v === 'string' ? v : (JSON.stringify(v) ?? ''))),
        hostileQueryValue,
      ),
      picture: fc.oneof(fc.constant(png), pictures),
    })
    await fuzz(fc.asyncProperty(form, async ({ field: name, value, picture }) => {
      const body = new FormData()
      for (const [k, v] of Object.entries({ ...fields, [name]: value })) body.append(k, v)
      if (picture) body.append('picture', new Blob([new Uint8Array(picture)], { type: 'image/png' }), 'picture.png')
      await probe({ ...valid, body })
    }) as unknown as fc.IAsyncProperty<[unknown]>)
  })
})

describe('generated path parameters and queries', () => {
  it.each(paramRoutes.map(r => [r.route, r]))('%s: a bad path parameter is a 400 or 404', async (_, row) => {
    const valid = await row.call(f, 'owner')
    const places = Object.values(paramPlaces(row.route))
    await fuzz(fc.asyncProperty(fc.tuple(fc.constantFrom(...places), hostileSegment), async ([index, segment]) => {
      const res = await probe({ ...valid, path: withParam(valid.path, index, segment) })
      expect([400, 404, 405], `${segment} → ${res.status}`).toContain(res.status)
    }) as unknown as fc.IAsyncProperty<[unknown]>)
  })

  it.each(getRoutes.map(r => [r.route, r]))('%s: a generated query is never a 5xx', async (_, row) => {
    const valid = await row.call(f, 'owner')
    const [pathname, query = ''] = valid.path.split('?')
    const pairs = [...new URLSearchParams(query).entries()]
    const keys = ['studioId', 'page', 'pageSize', 'sort', 'format', 'q', 'published', ...pairs.map(([k]) => k)]
    const change = fc.record({ key: fc.constantFrom(...keys), value: hostileQueryValue, twice: fc.boolean() })
    await fuzz(fc.asyncProperty(change, async ({ key, value, twice }) => {
      const rest = pairs.filter(([k]) => k !== key || twice).map(([k, v]) => `${k}=${encodeURIComponent(v)}`)
      await probe({ method: 'GET', path: `${pathname}?${[...rest, `${key}=${value}`].join('&')}` })
    }) as unknown as fc.IAsyncProperty<[unknown]>, Math.ceil(runs / 2))
  })
})

describe('hostile raw bodies', () => {
  const json = { 'content-type': 'application/json' }
  const hostile: [string, string | Uint8Array, Record<string, string>][] = [
    ['10,000 nested arrays', '['.repeat(10_000) + ']'.repeat(10_000), json],
    ['10,000 nested objects', '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_000), json],
    ['100,000 unclosed brackets', '['.repeat(100_000), json],
    ['bytes that are not UTF-8', Buffer.from([0x7B, 0x22, 0x6E, 0x61, 0x6D, 0x65, 0x22, 0x3A, 0x22, 0xFF, 0xFE, 0xC3, 0x28, 0x22, 0x7D]), json],
    ['broken JSON', '{"name": "Unfinished', json],
    ['JSON sent as text/plain', '{"name":"Plain text"}', { 'content-type': 'text/plain' }],
    ['XML', '<motif><name>x</name></motif>', { 'content-type': 'application/xml' }],
    ['a urlencoded form', 'name=Form&studioId=1', { 'content-type': 'application/x-www-form-urlencoded' }],
    ['multipart without a boundary', '--x\r\n\r\n', { 'content-type': 'multipart/form-data' }],
  ]
  const cases = writeRoutes.filter(r => !ignoresBody(r.route)).flatMap(r => hostile.map(([name, body, headers]) => [r.route, name, r, body, headers] as const))

  it.each(cases)('%s: %s → a clear 4xx, nothing stored', async (_, name, row, body, headers) => {
    const valid = await row.call(f, 'owner')
    const res = await probe({ ...valid, body }, headers, `${valid.method} ${valid.path} with ${name}`)
    expectClearRefusal(res, name)
  })

  it.each(writeRoutes.map(r => [r.route, r]))('%s: a body over the limit → 413 before it is read', async (_, row) => {
    const valid = await row.call(f, 'owner')
    const limit = row.route.includes('picture') ? 6 : 1
    const res = await probe({ ...valid, body: `{"name":"${'x'.repeat(limit * 1024 * 1024 + 10)}"}` }, json)
    expect(res.status).toBe(413)
  })

  it.each(['/api/motifs/import', '/api/motifs/from-picture'])('%s: an oversized body streamed without a length is refused too', async (path) => {
    const before = await storedRows(studioIds)
    const chunk = new Uint8Array(64 * 1024).fill(0x78)
    let sent = 0
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent++ < 120) controller.enqueue(chunk) // 7.5 MB in all, over either limit
        else controller.close()
      },
    })
    const res = await fetch(inject('baseUrl') + path, {
      method: 'POST', body: stream, duplex: 'half',
      headers: { 'cookie': ownerCookie, 'content-type': 'application/json' },
    } as RequestInit).then(async r => ({ status: r.status, body: await r.json().catch(() => null), headers: r.headers }))
    expect([411, 413]).toContain(res.status)
    expectClearRefusal(res, path)
    expect(await storedRows(studioIds)).toEqual(before)
  })
})

describe('ids of another studio', () => {
  const bodyCases = jsonRoutes.flatMap(r => [r])
  it.each(bodyCases.map(r => [r.route, r]))('%s: a body naming another studio\'s rows is refused and stores nothing', async (_, row) => {
    const valid = await row.call(f, 'owner')
    const idPaths = pathsOf(valid.body).filter((p) => {
      const key = typeof p[p.length - 1] === 'number' ? p[p.length - 2] : p[p.length - 1]
      return typeof key === 'string' && key in foreignBodyIds && typeof p.reduce((v: any, k) => v?.[k], valid.body) === 'number'
    })
    for (const path of idPaths) {
      const key = (typeof path[path.length - 1] === 'number' ? path[path.length - 2] : path[path.length - 1]) as string
      const body = withValueAt(valid.body, path, foreignBodyIds[key]!(g))
      const res = await probe({ ...valid, body }, {}, `${row.route} with ${path.join('.')} of another studio`)
      if (row.route === 'POST /api/sync') expect(res.body.rejected?.length, JSON.stringify(res.body)).toBeGreaterThan(0)
      else expectClearRefusal(res, path.join('.'))
    }
  })

  it.each(paramRoutes.map(r => [r.route, r]))('%s: another studio\'s row in the path → 404', async (_, row) => {
    const prefix = Object.keys(foreignParams).find(p => row.route.split(' ')[1]!.startsWith(p))!
    const swap = foreignParams[prefix]!(g)
    if (Object.keys(swap).length === 0) return
    const valid = await row.call(f, 'owner')
    let path = valid.path
    for (const [name, index] of Object.entries(paramPlaces(row.route))) {
      if (swap[name] !== undefined) path = withParam(path, index, String(swap[name]))
    }
    const res = await probe({ ...valid, path })
    expect(res.status, JSON.stringify(res.body)).toBe(404)
  })

  it('every route with a path parameter knows which foreign row to try', () => {
    const missing = apiRoutes().filter(r => r.includes('[') && !Object.keys(foreignParams).some(p => r.split(' ')[1]!.startsWith(p)))
    expect(missing).toEqual([])
    // The fuzz walks the role matrix; it covers the same routes the server has.
    expect(roleMatrix.map(r => r.route).sort()).toEqual(apiRoutes().sort())
  })
})
