import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { backoffDelay, createSyncer, retryAfterMs, readPieceState, recordStep, resolveConflict, type FloatwiseDb, type SyncState } from '../../../offline'
import { deviceWithPiece, fakeSyncServer, type FakeSyncServer } from '../../support/offline'

async function advance(db: FloatwiseDb, count: number, totalRows = 10_000) {
  const ids: string[] = []
  let row = (await readPieceState(db, 1)).progress!.completedRows
  for (let i = 0; i < count; i++) {
    const { event } = await recordStep(db, 1, { kind: 'advance', to: ++row, totalRows })
    ids.push(event.id)
  }
  return ids
}

function syncerFor(db: FloatwiseDb, server: FakeSyncServer, states: SyncState[] = []) {
  return createSyncer({ db, fetch: server.fetch, random: () => 1, onState: s => states.push(s) })
}

const sentIds = (server: FakeSyncServer) => server.requests.flatMap(r => r.events.map(e => e.id))

/**
 * Lets IndexedDB's tasks run until `done` (or for 500 turns): fake-indexeddb schedules them with
 * setImmediate, which the fake timers below leave real, so this waits on no clock.
 */
async function settle(done: () => boolean) {
  for (let i = 0; i < 500 && !done(); i++) await new Promise(resolve => setImmediate(resolve))
}

describe('flush', () => {
  it('drains 5,000 queued events in device order, in batches of at most 500', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    const ids = await advance(db, 5000)
    const result = await syncerFor(db, server).flush()
    expect(result).toMatchObject({ ok: true, accepted: 5000, batches: 10 })
    expect(server.requests.every(r => r.events.length <= 500)).toBe(true)
    expect(sentIds(server)).toEqual(ids)
    expect(server.piece()).toMatchObject({ completedRows: 5000, version: 5000 })
    expect(await readPieceState(db, 1)).toMatchObject({ pending: 0, progress: { completedRows: 5000, serverRows: 5000, serverVersion: 5000 } })
  }, 60_000)

  it('resumes where a failure stopped it, with the rest still queued in order', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    const ids = await advance(db, 1200)
    const syncer = createSyncer({ db, fetch: server.fetch, batchSize: 500, random: () => 1 })
    server.failures.push('ok', 'network') // first batch lands, second fails
    const failed = await syncer.flush()
    expect(failed).toMatchObject({ ok: false, accepted: 500, error: { kind: 'network' } })
    expect((await db.outbox.orderBy('seq').toArray()).map(e => e.id)).toEqual(ids.slice(500))
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 1200, serverRows: 500 })
    const resumed = await syncer.flush()
    expect(resumed).toMatchObject({ ok: true, accepted: 700 })
    expect([...server.stored.keys()]).toEqual(ids)
    expect(server.piece().completedRows).toBe(1200)
  }, 60_000)

  it('replays a batch whose answer was lost: the server keeps each event once', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    const ids = await advance(db, 30)
    const syncer = syncerFor(db, server)
    server.failures.push('lost-answer')
    expect((await syncer.flush()).ok).toBe(false)
    expect((await readPieceState(db, 1)).pending).toBe(30)
    expect((await syncer.flush()).ok).toBe(true)
    expect(sentIds(server)).toEqual([...ids, ...ids])
    expect(server.stored.size).toBe(30)
    expect([...server.stored.values()].every(e => e.outcome === 'applied')).toBe(true)
    expect(server.piece()).toMatchObject({ completedRows: 30, version: 30 })
    expect((await readPieceState(db, 1)).progress?.completedRows).toBe(30)
  })

  it('shares one run between concurrent calls', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 3)
    const syncer = syncerFor(db, server)
    const [a, b] = [syncer.flush(), syncer.flush()]
    expect(a).toBe(b)
    await a
    expect(server.requests).toHaveLength(1)
  })

  it('drops rejected events and takes the server\'s place', async () => {
    const db = await deviceWithPiece()
    await deviceWithPiece()
    const server = fakeSyncServer({ 2: { completedRows: 0 } }) // piece 1 is unknown there
    await advance(db, 2)
    const result = await syncerFor(db, server).flush()
    expect(result).toMatchObject({ ok: true, rejected: 2 })
    expect((await readPieceState(db, 1)).pending).toBe(0)
  })
})

describe('failures', () => {
  // The syncer's clock and timers are fake here: waits are exact and a retry comes when the
  // test moves the clock, not after real time.
  beforeEach(() => { vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'Date'] }) })
  afterEach(() => { vi.useRealTimers() })

  it('stops on 401 and keeps the events, with no automatic retry', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 2)
    const states: SyncState[] = []
    const syncer = syncerFor(db, server, states)
    server.failures.push(401)
    expect(await syncer.flush()).toMatchObject({ ok: false, error: { kind: 'signed-out', status: 401 } })
    expect(server.requests).toHaveLength(1)
    expect(states.at(-1)).toMatchObject({ status: 'pending', pending: 2, retryInMs: null, lastError: { kind: 'signed-out' } })
  })

  it('keeps a batch the server calls bad and retries it only at the slowest pace', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 2)
    const syncer = syncerFor(db, server)
    server.failures.push(400)
    expect(await syncer.flush()).toMatchObject({ ok: false, error: { kind: 'bad-request', status: 400 } })
    expect((await readPieceState(db, 1)).pending).toBe(2)
    expect((await syncer.state()).retryInMs).toBe(60_000)
  })

  it('backs off 1 s, 2 s, 4 s … after network and 5xx failures and resets on success', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 1)
    const syncer = syncerFor(db, server)
    const waits: number[] = []
    for (const failure of ['network', 500, 'network', 503] as const) {
      server.failures.push(failure)
      await syncer.flush()
      waits.push((await syncer.state()).retryInMs!)
    }
    expect(waits).toEqual([1000, 2000, 4000, 8000])
    expect((await syncer.flush()).ok).toBe(true)
    expect(await syncer.state()).toMatchObject({ retryInMs: null, lastError: null, status: 'synced' })
  })

  // `start` begins a run at once; a flush called meanwhile shares it, so awaiting that flush
  // waits for the run, its report and the timer it sets. Runs a timer begins are awaited with
  // `settle`: a flush there would send by itself.
  it('retries by itself once started, when the backoff is over and not before (no window in node: timers only)', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 2)
    const states: SyncState[] = []
    const syncer = createSyncer({ db, fetch: server.fetch, random: () => 0, onState: s => states.push(s) }) // first wait 500 ms
    server.failures.push('network')
    syncer.start()
    await syncer.flush()
    expect(states).toMatchObject([{ status: 'offline', retryInMs: 500 }])
    await vi.advanceTimersByTimeAsync(499)
    await settle(() => server.requests.length > 1)
    expect(server.requests).toHaveLength(1)
    await vi.advanceTimersByTimeAsync(1)
    await settle(() => states.length === 2)
    expect(server.requests).toHaveLength(2)
    expect(states.map(s => s.status)).toEqual(['offline', 'synced'])
    syncer.stop()
  })

  it('stops retrying when stopped', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 1)
    const syncer = createSyncer({ db, fetch: server.fetch, random: () => 0 })
    server.failures.push('network')
    syncer.start()
    await syncer.flush()
    expect(server.requests).toHaveLength(1)
    syncer.stop()
    await vi.advanceTimersByTimeAsync(60_000) // past the longest backoff
    await settle(() => server.requests.length > 1)
    expect(server.requests).toHaveLength(1)
  })

  it('sends steps left queued that no one nudged 15 s after its last report (a step from another tab)', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    const syncer = createSyncer({ db, fetch: server.fetch, random: () => 0 })
    syncer.start()
    await syncer.flush() // nothing queued yet
    await advance(db, 1) // another tab's step: this syncer is not told
    await syncer.refresh([1]) // its report sees the step queued and sets the timer
    await vi.advanceTimersByTimeAsync(14_999)
    await settle(() => server.stored.size > 0)
    expect(server.stored.size).toBe(0)
    await vi.advanceTimersByTimeAsync(1)
    await settle(() => server.stored.size > 0)
    expect(server.stored.size).toBe(1)
    syncer.stop()
  })

  it('waits at least as long as a 503\'s Retry-After, and never past the 60 s cap', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    await advance(db, 1)
    const syncer = syncerFor(db, server)
    server.setRetryAfter('20') // first backoff would be 1 s
    server.failures.push(503)
    await syncer.flush()
    expect((await syncer.state()).retryInMs).toBe(20_000)
    server.setRetryAfter('3600')
    server.failures.push(503)
    await syncer.flush()
    expect((await syncer.state()).retryInMs).toBe(60_000)
    expect((await syncer.state()).pending).toBe(1) // the row is still queued
    expect((await syncer.flush()).ok).toBe(true)
  })

  it('reads Retry-After as seconds or as an HTTP date (RFC 9110 §10.2.3)', () => {
    const now = Date.parse('Wed, 02 Dec 2026 05:00:00 GMT')
    expect(retryAfterMs('5', now)).toBe(5000)
    expect(retryAfterMs('Wed, 02 Dec 2026 05:00:30 GMT', now)).toBe(30_000)
    expect(retryAfterMs('Wed, 02 Dec 2026 04:59:00 GMT', now)).toBe(0)
    expect(retryAfterMs('soon', now)).toBeNull()
    expect(retryAfterMs(null, now)).toBeNull()
  })

  it('jitters each wait within its upper half and caps it at 60 s', () => {
    expect([1, 2, 3, 7, 8, 50].map(n => backoffDelay(n, () => 1))).toEqual([1000, 2000, 4000, 60_000, 60_000, 60_000])
    expect([1, 2, 7].map(n => backoffDelay(n, () => 0))).toEqual([500, 1000, 30_000])
    expect(backoffDelay(0)).toBe(0)
  })

  it('reports the state: offline after a network failure, then pending, then synced', async () => {
    const db = await deviceWithPiece()
    const server = fakeSyncServer()
    const states: SyncState[] = []
    const syncer = syncerFor(db, server, states)
    expect((await syncer.state()).status).toBe('synced')
    await advance(db, 1)
    expect((await syncer.state()).status).toBe('pending')
    server.failures.push('network')
    await syncer.flush()
    server.failures.push(500)
    await syncer.flush()
    await syncer.flush()
    expect(states.map(s => s.status)).toEqual(['offline', 'pending', 'synced'])
  })
})

describe('conflicts', () => {
  async function conflicted() {
    const server = fakeSyncServer({ 1: { completedRows: 10, version: 4 } })
    const db = await deviceWithPiece({ completedRows: 10, version: 4 })
    server.moveElsewhere(1, 25, 'tablet-b') // the other device moved on: version 5
    await advance(db, 3) // this device, offline, built on version 4
    const states: SyncState[] = []
    const syncer = syncerFor(db, server, states)
    expect((await syncer.flush()).ok).toBe(true)
    return { server, db, syncer, states }
  }

  it('shows the conflict and keeps the device\'s place instead of overwriting either', async () => {
    const { server, db, states } = await conflicted()
    expect(states.at(-1)).toMatchObject({ status: 'conflict', conflicts: 1, pending: 0 })
    expect((await readPieceState(db, 1)).progress).toMatchObject({
      completedRows: 13, serverRows: 25, serverVersion: 5,
      conflict: { deviceId: 'tablet-b', theirs: 25, ours: 13 },
    })
    expect(server.piece().completedRows).toBe(25)
    expect([...server.stored.values()].map(e => e.outcome)).toEqual(['conflict', 'conflict', 'conflict'])
  })

  it.each([['theirs', 25], ['ours', 13]] as const)('resolves by a jump to %s built on the server\'s version', async (keep, row) => {
    const { server, db, syncer, states } = await conflicted()
    const { event } = await resolveConflict(db, 1, keep)
    expect(event).toMatchObject({ kind: 'jump', from: 13, to: row, version: 5 })
    expect((await syncer.state()).status).toBe('pending')
    await syncer.flush()
    expect(server.piece()).toMatchObject({ completedRows: row, version: 6 })
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: row, conflict: null, resolvingWith: null })
    expect(states.at(-1)?.status).toBe('synced')
  })

  it('holds steps made before the knitter chooses, then sends them ahead of the choice', async () => {
    const { server, db, syncer } = await conflicted()
    await advance(db, 2) // knitting on from 13 while the conflict is open
    await syncer.flush()
    expect(server.piece().completedRows).toBe(25) // nothing sent: no silent overwrite
    expect((await readPieceState(db, 1)).pending).toBe(2)
    const { event } = await resolveConflict(db, 1, 'ours')
    expect(event).toMatchObject({ from: 15, to: 15, version: 5 })
    // Knitting on after the choice chains on it, before the server has confirmed anything.
    const after = await recordStep(db, 1, { kind: 'advance', to: 16, totalRows: 120 })
    expect(after.event.version).toBe(6)
    await syncer.flush()
    // The held steps are logged as conflicts (both histories stay); the choice moves the piece.
    expect([...server.stored.values()].map(e => e.outcome)).toEqual(['conflict', 'conflict', 'conflict', 'conflict', 'conflict', 'applied', 'applied'])
    expect(server.piece()).toMatchObject({ completedRows: 16, version: 7 })
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 16, conflict: null, resolvingWith: null })
  })

  it('shows a fresh conflict when the other device moved again before the choice landed', async () => {
    const { server, db, syncer } = await conflicted()
    await resolveConflict(db, 1, 'ours')
    server.moveElsewhere(1, 30, 'tablet-b')
    await syncer.flush()
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 13, conflict: { theirs: 30, ours: 13 }, resolvingWith: null })
    await resolveConflict(db, 1, 'theirs')
    await syncer.flush()
    expect(server.piece().completedRows).toBe(30)
    expect((await syncer.state()).status).toBe('synced')
  })
})

describe('refresh', () => {
  it('pulls the place a piece reached on another device', async () => {
    const db = await deviceWithPiece({ completedRows: 2, version: 2 })
    const server = fakeSyncServer({ 1: { completedRows: 2, version: 2 } })
    server.moveElsewhere(1, 40)
    const result = await syncerFor(db, server).refresh([1])
    expect(result.ok).toBe(true)
    expect(server.requests[0]).toMatchObject({ events: [], pieceIds: [1] })
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 40, serverVersion: 3 })
  })
})
