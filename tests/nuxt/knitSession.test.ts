import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h, nextTick } from 'vue'
import Dexie, { liveQuery } from 'dexie'
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { openUserStore, recordStep, savePiece, type FloatwiseDb } from '../../offline'
import { fakeSyncServer, pieceDetail, plainTimeline, type FakeSyncServer } from '../support/offline'

// The knit loop as the knit page runs it: useKnitSession on the signed-in person's store
// (stores/offline.ts, the real Dexie code on fake IndexedDB, a fresh tablet per test), its real
// syncer talking to a fake POST /api/sync that keeps the server's rule (tests/support/offline.ts).
const person = {
  user: { id: 5, email: 'tamsin@example.test', name: 'Tamsin Roe' },
  studios: [{ id: 9, name: 'Saltmarsh', role: 'knitter' as const, personal: false }],
}
const sleeve = pieceDetail({ id: 7, name: 'Sleeve', projectName: 'Harbour jumper', totalRows: 20, timeline: plainTimeline('Welt', 20) })

let server: FakeSyncServer
let online: boolean
let mounted: { unmount: () => void } | null

registerEndpoint('/api/pieces/7', (event) => {
  if (!online) {
    event.node.res.statusCode = 503
    return { statusCode: 503, message: 'No connection' }
  }
  const { completedRows, version } = server.piece(7)
  return { ...sleeve, completedRows, version }
})

beforeEach(() => {
  const tablet = new IDBFactory()
  // Dexie reads its IndexedDB when a database is made, so each test's store is on its own tablet.
  Dexie.dependencies.indexedDB = tablet
  Dexie.dependencies.IDBKeyRange = IDBKeyRange
  vi.stubGlobal('indexedDB', tablet)
  server = fakeSyncServer({ 7: { completedRows: 0 } })
  online = true
  // The syncer calls the global fetch; the app's $fetch keeps the test environment's own.
  const appFetch = globalThis.fetch
  vi.stubGlobal('fetch', (input: string | URL | Request, init?: RequestInit) => {
    if (String(input) !== '/api/sync') return appFetch(input, init)
    return online ? server.fetch(input, init) : Promise.reject(new TypeError('Failed to fetch'))
  })
  localStorage.clear()
  localStorage.setItem('fw-knit-sound', 'false')
  useAccountStore().me = person
})

afterEach(() => {
  mounted?.unmount()
  mounted = null
  useOfflineStore().close()
  vi.unstubAllGlobals()
})

/** The knit page's part in it: useKnitSession in a component's setup. */
async function openKnitView(pieceId = 7) {
  let knit!: ReturnType<typeof useKnitSession>
  const wrapper = await mountSuspended(defineComponent({
    setup() {
      knit = useKnitSession(pieceId)
      return () => h('p', `${knit.completedRows.value} rows`)
    },
  }))
  mounted = wrapper
  return { knit, wrapper }
}

/** The piece as an earlier visit (online) left it on the tablet. */
async function keptOnTablet() {
  const kept = openUserStore(person.user.id)
  await savePiece(kept, sleeve)
  kept.close()
}

const openStore = () => useOfflineStore().current!
const queued = async (db: FloatwiseDb) => (await db.outbox.orderBy('seq').toArray()).map(e => [e.kind, e.from, e.to, e.version])

describe('useKnitSession', () => {
  it('opens a piece kept on the tablet while offline, queues each step in order, and drains them when the network returns', async () => {
    await keptOnTablet()
    online = false
    const { knit, wrapper } = await openKnitView()
    await knit.load()
    expect(knit.loadError.value).toBe('') // the kept copy will do
    await expect.poll(() => knit.piece.value?.name).toBe('Sleeve')
    expect(knit.position.value).toMatchObject({ completedRows: 0, totalRows: 20 })

    await knit.advance() // a row pair: 0 → 2
    await knit.advance() // 2 → 4
    await knit.undo() // 4 → 2
    expect(knit.stepError.value).toBe('')
    expect(knit.completedRows.value).toBe(2)
    await nextTick()
    expect(wrapper.text()).toBe('2 rows')
    const { db } = openStore()
    expect(await queued(db)).toEqual([['advance', 0, 2, 0], ['advance', 2, 4, 1], ['back', 4, 2, 2]])
    await expect.poll(() => knit.pending.value).toBe(3)
    await expect.poll(() => knit.syncState.value?.status).toBe('offline')
    expect(server.stored.size).toBe(0)

    online = true
    window.dispatchEvent(new Event('online'))
    await expect.poll(() => server.stored.size).toBe(3)
    expect([...server.stored.values()].map(e => [e.kind, e.to, e.outcome])).toEqual([
      ['advance', 2, 'applied'],
      ['advance', 4, 'applied'],
      ['back', 2, 'applied'],
    ])
    expect(server.piece(7)).toMatchObject({ completedRows: 2, version: 3 })
    await expect.poll(() => knit.pending.value).toBe(0)
    await expect.poll(() => knit.syncState.value?.status).toBe('synced')
    expect(await db.outbox.count()).toBe(0)
    expect(knit.progress.value).toMatchObject({ completedRows: 2, serverRows: 2, serverVersion: 3 })
  })

  it('fetches the piece when online, keeps it on the tablet, and sends a step at once', async () => {
    server.moveElsewhere(7, 6) // knitted on another tablet before this one opened it
    const { knit } = await openKnitView()
    await knit.load()
    await expect.poll(() => knit.completedRows.value).toBe(6)
    expect(await openStore().db.pieces.get(7)).toMatchObject({ name: 'Sleeve', completedRows: 6, version: 1 })

    await knit.advance()
    expect(knit.completedRows.value).toBe(8)
    await expect.poll(() => server.piece(7).completedRows).toBe(8)
    expect([...server.stored.values()].map(e => [e.from, e.to, e.version, e.outcome])).toEqual([[6, 8, 1, 'applied']])
    await expect.poll(() => knit.pending.value).toBe(0)
    await expect.poll(() => knit.syncState.value?.status).toBe('synced')
  })

  it('refuses a step past the end with a sentence for the knitter and queues nothing', async () => {
    await keptOnTablet()
    const { knit } = await openKnitView()
    await expect.poll(() => knit.piece.value?.name).toBe('Sleeve')
    await knit.jump(20)
    expect(knit.completedRows.value).toBe(20)
    await knit.jump(21)
    expect(knit.stepError.value).toBe('Row 21 is outside this piece (0 to 20 rows).')
    expect(knit.completedRows.value).toBe(20)
    expect(await queued(openStore().db)).toEqual([['jump', 0, 20, 0]])
  })

  it('shows a conflict with another tablet and sends the knitter’s choice', async () => {
    await keptOnTablet()
    online = false
    const { knit } = await openKnitView()
    await expect.poll(() => knit.piece.value?.name).toBe('Sleeve')
    await knit.advance() // 0 → 2 here, offline
    server.moveElsewhere(7, 10, 'tablet-b') // and 10 on the other tablet meanwhile
    online = true
    window.dispatchEvent(new Event('online'))
    await expect.poll(() => knit.progress.value?.conflict).toEqual({ deviceId: 'tablet-b', theirs: 10, ours: 2 })
    await expect.poll(() => knit.syncState.value?.status).toBe('conflict')
    expect(server.piece(7).completedRows).toBe(10) // nothing overwritten

    await knit.resolve('theirs')
    await expect.poll(() => knit.progress.value?.conflict ?? null).toBeNull()
    expect(server.piece(7)).toMatchObject({ completedRows: 10, version: 2 })
    expect(knit.completedRows.value).toBe(10)
    await expect.poll(() => knit.syncState.value?.status).toBe('synced')
  })

  it('ends its live queries with the page; the store stays open for the syncer', async () => {
    await keptOnTablet()
    const { knit, wrapper } = await openKnitView()
    await expect.poll(() => knit.piece.value?.name).toBe('Sleeve')
    wrapper.unmount()
    mounted = null

    const { db } = openStore()
    expect(db.isOpen()).toBe(true)
    await recordStep(db, 7, { kind: 'jump', to: 12, totalRows: 20 })
    // A live query subscribed now sees the step; the page's, subscribed earlier, would have seen it first.
    await new Promise<void>((resolve) => {
      const subscription = liveQuery(() => db.progress.get(7)).subscribe((p) => {
        if (p?.completedRows !== 12) return
        subscription.unsubscribe()
        resolve()
      })
    })
    await new Promise(resolve => setTimeout(resolve, 0))
    expect(knit.completedRows.value).toBe(0)
    expect(knit.pending.value).toBe(0)
  })

  it('shows nothing of the person once their store closes (signed out, or their session ended)', async () => {
    await keptOnTablet()
    const { knit } = await openKnitView()
    await expect.poll(() => knit.piece.value?.name).toBe('Sleeve')
    useOfflineStore().close()
    await nextTick()
    expect(knit.piece.value).toBeUndefined()
    expect(knit.progress.value).toBeUndefined()
    expect(knit.position.value).toBeNull()
  })
})
