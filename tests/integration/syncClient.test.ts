import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import {
  createSyncer,
  getDeviceId,
  openFloatwiseDb,
  readPieceState,
  recordStep,
  resolveConflict,
  savePiece,
  type FloatwiseDb,
  type PieceDetail,
} from '../../offline'
import { Piece, RowEvent } from '../../server/db/models'
import { apiClient, type ApiClient } from '../support/api'
import { startExtraAppServer } from '../support/extraServer'
import { closeTestDb, fixturePassword, makeProject, makeStudio } from '../support/db'

// The client's store and syncer against the built server and MariaDB: each simulated tablet
// is its own fake IndexedDB and its own sign-in, exactly as two browsers would be.

let s: Awaited<ReturnType<typeof makeStudio>>
beforeAll(async () => {
  s = await makeStudio()
})
afterAll(closeTestDb)

let dbCounter = 0

interface Tablet {
  db: FloatwiseDb
  client: ApiClient
  syncer: ReturnType<typeof createSyncer>
  requests: number
  /** Events in each sync request, in order. */
  batchSizes: number[]
  /** Called before each sync request is forwarded; may throw to play a lost network. */
  beforeRequest?: (n: number) => void | Promise<void>
  /** Called with each answer before the syncer sees it; may throw to play a lost answer. */
  afterResponse?: (n: number) => void | Promise<void>
}

async function tablet(baseUrl = inject('baseUrl')): Promise<Tablet> {
  const client = apiClient(baseUrl)
  const signIn = await client.post('/api/auth/login', { email: s.knitter.email, password: fixturePassword })
  expect(signIn.status).toBe(200)
  const db = openFloatwiseDb(`sync-client-${++dbCounter}`, { indexedDB: new IDBFactory(), IDBKeyRange })
  const t = { db, client, requests: 0, batchSizes: [] } as unknown as Tablet
  // Node's fetch keeps no cookies: add the session the way the browser would.
  const fetchWithSession = async (input: string | URL | Request, init: RequestInit = {}) => {
    const n = ++t.requests
    t.batchSizes.push((JSON.parse(String(init.body)) as { events: unknown[] }).events.length)
    await t.beforeRequest?.(n)
    const res = await fetch(input, {
      ...init,
      headers: { ...(init.headers as Record<string, string>), 'cookie': client.cookie, 'x-forwarded-for': client.address },
    })
    await t.afterResponse?.(n)
    return res
  }
  t.syncer = createSyncer({ db, baseUrl, fetch: fetchWithSession as typeof fetch })
  return t
}

async function openPiece(t: Tablet, pieceId: number) {
  const res = await t.client.get<PieceDetail>(`/api/pieces/${pieceId}`)
  expect(res.status).toBe(200)
  await savePiece(t.db, res.body)
  return res.body
}

async function step(t: Tablet, pieceId: number, kind: 'advance' | 'back' | 'jump', to: number) {
  const { piece } = await readPieceState(t.db, pieceId)
  return (await recordStep(t.db, pieceId, { kind, to, totalRows: piece!.totalRows })).event.id
}

const log = (pieceId: number) => RowEvent.findAll({ where: { pieceId }, order: [['seq', 'ASC']] })

async function freshPiece(chartRows = 8) {
  const { pieces } = await makeProject({ studioId: s.studio.id, knitterId: s.knitter.id, pieces: ['Back'], shape: { chartRows } })
  return pieces[0]!.id
}

describe('two tablets, one piece', () => {
  it('replays idempotently, applies in order, and shows then resolves a conflict', async () => {
    const pieceId = await freshPiece()
    const a = await tablet()
    const b = await tablet()
    await openPiece(a, pieceId)
    await openPiece(b, pieceId)

    // Tablet A: three rows; the first answer is lost after the server applied it.
    const made = [await step(a, pieceId, 'advance', 1), await step(a, pieceId, 'advance', 2), await step(a, pieceId, 'advance', 3)]
    a.afterResponse = (n) => {
      if (n === 1) throw new TypeError('fetch failed')
    }
    expect(await a.syncer.flush()).toMatchObject({ ok: false, error: { kind: 'network' } })
    expect((await readPieceState(a.db, pieceId)).pending).toBe(3)
    expect(await a.syncer.flush()).toMatchObject({ ok: true, accepted: 3 })
    let rows = await log(pieceId)
    expect(rows.map(r => r.id)).toEqual(made)
    expect(rows.map(r => [r.fromRows, r.toRows, r.version, r.outcome])).toEqual([[0, 1, 0, 'applied'], [1, 2, 1, 'applied'], [2, 3, 2, 'applied']])
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 3, version: 3 })

    // Tablet B hears of it, then both knit offline: B to row 7, A to row 5.
    expect((await b.syncer.refresh([pieceId])).ok).toBe(true)
    expect((await readPieceState(b.db, pieceId)).progress).toMatchObject({ completedRows: 3, serverVersion: 3 })
    for (const row of [4, 5, 6, 7]) await step(b, pieceId, 'advance', row)
    for (const row of [4, 5]) await step(a, pieceId, 'advance', row)
    expect((await b.syncer.flush()).ok).toBe(true)
    expect((await a.syncer.flush()).ok).toBe(true)

    // A sees the conflict; nothing was overwritten on either side.
    const bId = await getDeviceId(b.db)
    expect((await readPieceState(a.db, pieceId)).progress).toMatchObject({ completedRows: 5, serverRows: 7, conflict: { deviceId: bId, theirs: 7, ours: 5 } })
    expect((await a.syncer.state()).status).toBe('conflict')
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 7, version: 7 })
    rows = await log(pieceId)
    expect(rows.slice(-2).map(r => [r.toRows, r.outcome])).toEqual([[4, 'conflict'], [5, 'conflict']])

    // The knitter keeps A's place; B then hears of it.
    const { event } = await resolveConflict(a.db, pieceId, 'ours')
    expect(event).toMatchObject({ kind: 'jump', from: 5, to: 5, version: 7 })
    expect((await a.syncer.flush()).ok).toBe(true)
    expect((await readPieceState(a.db, pieceId)).progress).toMatchObject({ completedRows: 5, conflict: null, resolvingWith: null })
    expect((await a.syncer.state()).status).toBe('synced')
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 5, version: 8 })
    expect((await b.syncer.refresh([pieceId])).ok).toBe(true)
    expect((await readPieceState(b.db, pieceId)).progress).toMatchObject({ completedRows: 5, conflict: null })
    // Both histories stay in the log: 3 + 4 applied, 2 conflicts, 1 jump.
    expect((await log(pieceId)).map(r => r.outcome).filter(o => o === 'applied')).toHaveLength(8)
  })
})

describe('a long offline session', () => {
  it('drains 5,000 queued events in batches of at most 500', async () => {
    const pieceId = await freshPiece(5000)
    const a = await tablet()
    await openPiece(a, pieceId)
    for (let row = 1; row <= 5000; row++) await step(a, pieceId, 'advance', row)
    const started = performance.now()
    const result = await a.syncer.flush()
    const seconds = (performance.now() - started) / 1000
    console.log(`sync client: drained 5000 events in ${result.batches} requests, ${seconds.toFixed(1)} s, ${Math.round(5000 / seconds)} events/s`)
    expect(result).toMatchObject({ ok: true, accepted: 5000, batches: 10 })
    expect(a.batchSizes).toEqual(Array.from({ length: 10 }, () => 500))
    const rows = await log(pieceId)
    expect(rows).toHaveLength(5000)
    expect(rows.every((r, i) => r.toRows === i + 1 && r.outcome === 'applied')).toBe(true)
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 5000, version: 5000 })
    expect((await readPieceState(a.db, pieceId)).progress).toMatchObject({ completedRows: 5000, serverVersion: 5000 })
  }, 180_000)
})

describe('the server stops mid-sync', () => {
  let server: Awaited<ReturnType<typeof startExtraAppServer>>
  beforeAll(async () => {
    server = await startExtraAppServer()
  })
  afterAll(() => server?.close())

  it('fails the flush, then a flush after the restart stores every event exactly once', async () => {
    const pieceId = await freshPiece(2000)
    const a = await tablet(server.baseUrl)
    await openPiece(a, pieceId)
    const made: string[] = []
    for (let row = 1; row <= 2000; row++) made.push(await step(a, pieceId, 'advance', row))
    for (let row = 1999; row >= 1990; row--) made.push(await step(a, pieceId, 'back', row))

    // While the third batch is on its way, the server is stopped (and started again).
    let restarting: Promise<void> | undefined
    a.beforeRequest = (n) => {
      if (n === 3) restarting = server.restart()
    }
    const failed = await a.syncer.flush()
    expect(failed.ok).toBe(false)
    expect(['network', 'server']).toContain(failed.error?.kind)
    expect((await readPieceState(a.db, pieceId)).pending).toBeGreaterThan(0)
    await restarting

    a.beforeRequest = undefined
    expect((await a.syncer.flush()).ok).toBe(true)
    const rows = await log(pieceId)
    expect(rows.map(r => r.id)).toEqual(made)
    expect(rows.every(r => r.outcome === 'applied')).toBe(true)
    const { progress, pending } = await readPieceState(a.db, pieceId)
    expect(pending).toBe(0)
    expect(progress?.completedRows).toBe(1990)
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 1990, version: 2010 })
  }, 120_000)
})

describe('steps the server does not take as they stand', () => {
  it('a step stamped by a clock before 2020 is refused with a 400 naming at, and stays queued', async () => {
    const pieceId = await freshPiece()
    const a = await tablet()
    await openPiece(a, pieceId)
    const { piece } = await readPieceState(a.db, pieceId)
    await recordStep(a.db, pieceId, { kind: 'advance', to: 1, totalRows: piece!.totalRows }, { now: () => new Date('2019-06-01T12:00:00Z') })
    const result = await a.syncer.flush()
    expect(result).toMatchObject({ ok: false, error: { kind: 'bad-request', status: 400 } })
    expect(result.error?.message).toContain('events.0.at: ')
    expect((await readPieceState(a.db, pieceId)).pending).toBe(1) // kept for a retry, not dropped
    expect(await log(pieceId)).toHaveLength(0)
  })

  it('a step whose from is not the server\'s place comes back as a conflict: the device keeps its row and the knitter chooses', async () => {
    const pieceId = await freshPiece()
    const a = await tablet()
    await openPiece(a, pieceId)
    // A device whose place went wrong (row 5) while the server, at the same version, is at row 0.
    await a.db.progress.update(pieceId, { completedRows: 5 })
    await step(a, pieceId, 'advance', 6)
    expect(await a.syncer.flush()).toMatchObject({ ok: true, accepted: 1 })
    expect((await readPieceState(a.db, pieceId))).toMatchObject({ pending: 0, progress: { completedRows: 6, serverRows: 0, conflict: { theirs: 0, ours: 6 } } })
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 0, version: 0 })

    await resolveConflict(a.db, pieceId, 'ours')
    expect((await a.syncer.flush()).ok).toBe(true)
    expect(await Piece.findByPk(pieceId)).toMatchObject({ completedRows: 6, version: 1 })
    expect((await log(pieceId)).map(r => [r.kind, r.fromRows, r.toRows, r.outcome])).toEqual([['advance', 5, 6, 'conflict'], ['jump', 6, 6, 'applied']])
  })
})
