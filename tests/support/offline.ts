import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import { applyRowEvent } from '#shared/piece/rowEvent'
import { openFloatwiseDb, savePiece, type FloatwiseDb, type OpenOptions } from '../../offline'
import type { PieceDetail, RowEvent, SyncConflict, SyncRequest, SyncResponse } from '../../offline/types'

let dbCounter = 0

/** A database of its own (own IDBFactory and name): one simulated device per call. */
export function freshDb(options: OpenOptions = {}): FloatwiseDb {
  return openFloatwiseDb(`floatwise-test-${++dbCounter}`, { indexedDB: new IDBFactory(), IDBKeyRange, ...options })
}

/** The store keeps the timeline as it is; a plain piece is enough for these tests. */
export function plainTimeline(label: string, rows: number): PieceDetail['timeline'] {
  return {
    technique: 'together',
    passesPerColour: 1,
    needles: 60,
    sections: [{ kind: 'plain', label, rows, yarn: 'A' }],
    yarns: [{ slot: 'A', name: 'Cream', hex: '#efe6d2', symbol: '●' }],
  }
}

export function pieceDetail(overrides: Partial<PieceDetail> = {}): PieceDetail {
  return {
    id: 1, projectId: 10, projectName: 'Yoke jumper', name: 'Back', position: 1,
    completedRows: 0, totalRows: 120, version: 0,
    updatedAt: '2025-01-01T00:00:00.000Z', lastKnittedAt: null,
    timeline: plainTimeline('Welt', 120), nextPieceId: 2, finishedAt: null,
    ...overrides,
  }
}

export async function deviceWithPiece(detail: Partial<PieceDetail> = {}) {
  const db = freshDb()
  await savePiece(db, pieceDetail(detail))
  return db
}

/** What the next request does: answer normally, or fail in one of the ways the network can. */
export type FakeFailure = 'network' | 'lost-answer' | 401 | 400 | 500 | 503

interface StoredEvent extends RowEvent { deviceId: string; outcome: 'applied' | 'conflict' }

/**
 * A stand-in for `fetch` that answers `POST /api/sync` as server/utils/sync.ts does: each
 * event id is stored once (a replay is accepted and changes nothing), and whether an event
 * moves the piece is the server's own rule, applyRowEvent; anything else is logged as a
 * conflict. A device's conflict stands while its latest event on the piece is one.
 */
export function fakeSyncServer(initial: Record<number, { completedRows: number; version?: number }> = { 1: { completedRows: 0 } }) {
  const pieces = new Map(
    Object.entries(initial).map(([id, p]) => [Number(id), { completedRows: p.completedRows, version: p.version ?? 0, lastDevice: 'seed' }]),
  )
  const stored = new Map<string, StoredEvent>()
  const requests: SyncRequest[] = []
  const failures: (FakeFailure | 'ok')[] = []
  const latest = new Map<string, StoredEvent>() // `${deviceId}/${pieceId}`
  /** Retry-After sent with a 503 (none by default). */
  let retryAfter: string | null = null

  function answer(body: SyncRequest): SyncResponse {
    const accepted: string[] = []
    const rejected: { id: string; reason: string }[] = []
    const touched = new Set<number>(body.pieceIds ?? [])
    for (const e of body.events) {
      const piece = pieces.get(e.pieceId)
      if (!piece) {
        rejected.push({ id: e.id, reason: 'unknown piece' })
        continue
      }
      touched.add(e.pieceId)
      if (!stored.has(e.id)) {
        const key = `${body.deviceId}/${e.pieceId}`
        const step = applyRowEvent(piece, e, latest.get(key)?.outcome === 'conflict')
        if (step.outcome === 'applied') Object.assign(piece, step.place, { lastDevice: body.deviceId })
        const event: StoredEvent = { ...e, deviceId: body.deviceId, outcome: step.outcome }
        stored.set(e.id, event)
        latest.set(key, event)
      }
      accepted.push(e.id)
    }
    const answered = [...touched].filter(id => pieces.has(id)).map((id) => {
      const p = pieces.get(id)!
      const mine = latest.get(`${body.deviceId}/${id}`)
      const conflict: SyncConflict | null = mine?.outcome === 'conflict' ? { deviceId: p.lastDevice, theirs: p.completedRows, ours: mine.to } : null
      return { id, completedRows: p.completedRows, version: p.version, conflict }
    })
    return { accepted, pieces: answered, ...(rejected.length ? { rejected } : {}) }
  }

  const fetch = async (url: string | URL | Request, init?: RequestInit): Promise<Response> => {
    if (String(url) !== '/api/sync' || init?.method !== 'POST') return new Response('not found', { status: 404 })
    const body = JSON.parse(String(init.body)) as SyncRequest
    requests.push(body)
    const failure = failures.shift()
    if (failure === 'network') throw new TypeError('fetch failed')
    if (typeof failure === 'number')
      return Response.json({ message: `status ${failure}` }, { status: failure, headers: failure === 503 && retryAfter ? { 'retry-after': retryAfter } : {} })
    const result = answer(body)
    if (failure === 'lost-answer') throw new TypeError('fetch failed') // applied, but the answer never arrived
    return Response.json(result)
  }

  return {
    fetch: fetch as typeof globalThis.fetch,
    pieces, stored, requests, failures,
    setRetryAfter(value: string | null) { retryAfter = value },
    piece: (id = 1) => pieces.get(id)!,
    /** Moves a piece as another device would. */
    moveElsewhere(id: number, to: number, deviceId = 'other-device') {
      const p = pieces.get(id)!
      Object.assign(p, { completedRows: to, version: p.version + 1, lastDevice: deviceId })
    },
  }
}

export type FakeSyncServer = ReturnType<typeof fakeSyncServer>
