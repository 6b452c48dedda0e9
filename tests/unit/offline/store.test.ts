import { describe, expect, it } from 'vitest'
import { reactive } from 'vue'
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import { getDeviceId, openFloatwiseDb, readPieceState, recordStep, savePiece, StepError } from '../../../offline'
import { deviceWithPiece, freshDb, pieceDetail, plainTimeline } from '../../support/offline'

describe('the database', () => {
  it('makes the device id once and keeps it across reopening', async () => {
    const factory = new IDBFactory()
    const first = openFloatwiseDb('device-id', { indexedDB: factory, IDBKeyRange })
    const [a, b] = await Promise.all([getDeviceId(first), getDeviceId(first)])
    expect(a).toBe(b)
    expect(a).toMatch(/^[\w-]{8,64}$/)
    first.close()
    const again = openFloatwiseDb('device-id', { indexedDB: factory, IDBKeyRange })
    expect(await getDeviceId(again)).toBe(a)
  })

  it('closes itself and calls back when another tab opens a newer version', async () => {
    const factory = new IDBFactory()
    const seen: number[] = []
    const db = openFloatwiseDb('upgrade', { indexedDB: factory, IDBKeyRange, onVersionChange: e => seen.push(e.newVersion ?? 0) })
    await db.open()
    // A newer build in another tab: Dexie stores version(n) as n * 10.
    const newer = await new Promise<IDBDatabase>((resolve, reject) => {
      const req = factory.open('upgrade', 20)
      req.onsuccess = () => resolve(req.result)
      req.onerror = () => reject(req.error)
      req.onblocked = () => reject(new Error('blocked: the old tab kept its connection open'))
    })
    expect(seen).toEqual([20])
    expect(db.isOpen()).toBe(false)
    newer.close()
  })

  it('stores plain copies of Vue reactive values', async () => {
    const db = freshDb()
    const detail = reactive(pieceDetail({ timeline: plainTimeline('Yoke', 40) }))
    await savePiece(db, detail)
    const { piece } = await readPieceState(db, 1)
    expect(piece?.timeline).toEqual(plainTimeline('Yoke', 40))
  })
})

describe('recordStep', () => {
  it('queues the event and moves the local place, numbering versions across queued steps', async () => {
    const db = await deviceWithPiece({ completedRows: 4, version: 7 })
    const a = await recordStep(db, 1, { kind: 'advance', to: 5, totalRows: 120 })
    const b = await recordStep(db, 1, { kind: 'advance', to: 6, totalRows: 120 })
    const c = await recordStep(db, 1, { kind: 'back', to: 5, totalRows: 120 })
    const d = await recordStep(db, 1, { kind: 'jump', to: 60, totalRows: 120 })
    expect([a, b, c, d].map(s => [s.event.from, s.event.to, s.event.version])).toEqual([[4, 5, 7], [5, 6, 8], [6, 5, 9], [5, 60, 10]])
    const outbox = await db.outbox.orderBy('seq').toArray()
    expect(outbox.map(e => e.id)).toEqual([a, b, c, d].map(s => s.event.id))
    expect(new Set(outbox.map(e => e.id)).size).toBe(4)
    const state = await readPieceState(db, 1)
    expect(state.progress).toMatchObject({ completedRows: 60, serverRows: 4, serverVersion: 7 })
    expect(state.pending).toBe(4)
  })

  it('counts only the same piece\'s queued events in the version', async () => {
    const db = await deviceWithPiece({ id: 1, version: 3 })
    await savePiece(db, pieceDetail({ id: 2, version: 11 }))
    await recordStep(db, 1, { kind: 'advance', to: 1, totalRows: 120 })
    const other = await recordStep(db, 2, { kind: 'advance', to: 1, totalRows: 120 })
    expect(other.event.version).toBe(11)
  })

  it.each([
    ['the progress write fails', 'progress'],
    ['the outbox write fails', 'outbox'],
  ] as const)('writes neither event nor place when %s inside the transaction', async (_, table) => {
    const db = await deviceWithPiece({ completedRows: 10, version: 2 })
    const fail = () => { throw new Error('disk full') }
    db[table].hook('creating', fail)
    db[table].hook('updating', fail)
    await expect(recordStep(db, 1, { kind: 'advance', to: 11, totalRows: 120 })).rejects.toThrow('disk full')
    db[table].hook('creating').unsubscribe(fail)
    db[table].hook('updating').unsubscribe(fail)
    const state = await readPieceState(db, 1)
    expect(state.pending).toBe(0)
    expect(state.progress?.completedRows).toBe(10)
  })

  it.each([
    [{ kind: 'advance', to: 10 }, /forward/],
    [{ kind: 'advance', to: 9 }, /forward/],
    [{ kind: 'back', to: 11 }, /below/],
    [{ kind: 'jump', to: 121 }, /outside/],
    [{ kind: 'jump', to: -1 }, /outside/],
    [{ kind: 'jump', to: 2.5 }, /outside/],
    [{ kind: 'skip', to: 12 }, /Unknown step/],
  ] as const)('refuses %o with a clear message', async (step, message) => {
    const db = await deviceWithPiece({ completedRows: 10 })
    const error = await recordStep(db, 1, { ...step, totalRows: 120 } as never).catch(e => e)
    expect(error).toBeInstanceOf(StepError)
    expect(error.message).toMatch(message)
    expect((await readPieceState(db, 1)).pending).toBe(0)
  })

  it('refuses a piece that was never opened on this device', async () => {
    await expect(recordStep(freshDb(), 5, { kind: 'advance', to: 1, totalRows: 10 })).rejects.toThrow(/not on this device/)
  })
})

describe('savePiece', () => {
  it('seeds progress from the server when there is none', async () => {
    const db = freshDb()
    await savePiece(db, pieceDetail({ completedRows: 33, version: 9 }))
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 33, serverRows: 33, serverVersion: 9, conflict: null })
  })

  it('takes a newer server place when nothing is queued', async () => {
    const db = await deviceWithPiece({ completedRows: 3, version: 1 })
    await savePiece(db, pieceDetail({ completedRows: 50, version: 12 }))
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 50, serverVersion: 12 })
  })

  it('never overwrites unsynced local progress', async () => {
    const db = await deviceWithPiece({ completedRows: 3, version: 1 })
    await recordStep(db, 1, { kind: 'advance', to: 4, totalRows: 120 })
    await savePiece(db, pieceDetail({ completedRows: 80, version: 5, name: 'Back (renamed)' }))
    const state = await readPieceState(db, 1)
    expect(state.progress).toMatchObject({ completedRows: 4, serverRows: 3, serverVersion: 1 })
    expect(state.piece?.name).toBe('Back (renamed)')
    expect(state.pending).toBe(1)
  })

  it('ignores an answer older than what it has seen', async () => {
    const db = await deviceWithPiece({ completedRows: 30, version: 6 })
    await savePiece(db, pieceDetail({ completedRows: 10, version: 2 }))
    expect((await readPieceState(db, 1)).progress).toMatchObject({ completedRows: 30, serverVersion: 6 })
  })
})
