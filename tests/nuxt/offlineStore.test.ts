import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import Dexie from 'dexie'
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb'
import { mockNuxtImport, mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { openUserStore, recordStep, savePiece } from '../../offline'
import { fakeSyncServer, pieceDetail, plainTimeline, type FakeSyncServer } from '../support/offline'

// The offline store follows whoever is signed in (its watch, started by plugins/offline.client.ts),
// and sign-out deletes the person's store; each test on a tablet of its own (fake IndexedDB)
// and with a person of its own, so nothing a test leaves running touches the next one's store.
const { reloads } = vi.hoisted(() => ({ reloads: [] as unknown[] }))
mockNuxtImport('reloadNuxtApp', () => (options: unknown) => { reloads.push(options) })

const personNumbered = (id: number) => ({
  user: { id, email: `knitter-${id}@example.test`, name: `Knitter ${id}` },
  studios: [{ id: 9, name: 'Saltmarsh', role: 'knitter' as const, personal: false }],
})
const sleeve = pieceDetail({ id: 7, name: 'Sleeve', projectName: 'Harbour jumper', totalRows: 20, timeline: plainTimeline('Welt', 20) })

let tablet: IDBFactory
/** What the app asked of the tablet's IndexedDB, in order: `open <name>`, `delete <name>`. */
let asked: string[]
let server: FakeSyncServer
/** How POST /api/sync goes: answered by the fake server, no network, or no answer at all. */
let network: 'up' | 'down' | 'hanging'
let syncCalls: number
const logouts: number[] = []

registerEndpoint('/api/auth/logout', { method: 'POST', handler: () => { logouts.push(1); return { ok: true } } })

beforeEach(() => {
  tablet = new IDBFactory()
  asked = []
  const { open, deleteDatabase } = tablet
  tablet.open = (name, version) => { asked.push(`open ${name}`); return open.call(tablet, name, version) }
  tablet.deleteDatabase = (name) => { asked.push(`delete ${name}`); return deleteDatabase.call(tablet, name) }
  Dexie.dependencies.indexedDB = tablet
  Dexie.dependencies.IDBKeyRange = IDBKeyRange
  vi.stubGlobal('indexedDB', tablet)
  server = fakeSyncServer({ 7: { completedRows: 0 } })
  network = 'up'
  syncCalls = 0
  const appFetch = globalThis.fetch
  vi.stubGlobal('fetch', (input: string | URL | Request, init?: RequestInit) => {
    if (String(input) !== '/api/sync') return appFetch(input, init)
    syncCalls += 1
    if (network === 'hanging') return new Promise(() => {})
    return network === 'up' ? server.fetch(input, init) : Promise.reject(new TypeError('Failed to fetch'))
  })
  reloads.length = 0
  logouts.length = 0
})

afterEach(() => {
  vi.useRealTimers()
  useOfflineStore().close()
  vi.unstubAllGlobals()
})

/** A store the person left on this tablet earlier, with `steps` row steps not yet sent. */
async function leftOnTablet(userId: number, steps: number) {
  const db = openUserStore(userId)
  await savePiece(db, sleeve)
  for (let i = 1; i <= steps; i++) await recordStep(db, 7, { kind: 'advance', to: 2 * i, totalRows: 20 })
  db.close()
}

/**
 * Lets IndexedDB's tasks run (setImmediate, real even under fake timers) until `done`, or for a
 * while; no clock moves. (expect.poll would move the fake clock between its tries.)
 */
async function settle(done = () => false) {
  for (let i = 0; i < 200 && !done(); i++) await new Promise(resolve => setImmediate(resolve))
}

const storesOnTablet = async () => (await tablet.databases()).map(d => d.name)

describe('the offline store', () => {
  it('opens for whoever signs in, on any page, and sends the steps it kept', async () => {
    await leftOnTablet(11, 2)
    const offline = useOfflineStore()
    useAccountStore().me = personNumbered(11)
    await expect.poll(() => offline.userId).toBe(11)
    await expect.poll(() => server.stored.size).toBe(2)
    await expect.poll(() => offline.state?.status).toBe('synced')
    expect(server.piece(7).completedRows).toBe(4)
  })

  it('closes when the session ends elsewhere and keeps a store with steps not yet sent, for the next sign-in', async () => {
    network = 'down'
    const offline = useOfflineStore()
    const account = useAccountStore()
    account.me = personNumbered(12)
    const { db } = await offline.open(12)
    await savePiece(db, sleeve)
    await recordStep(db, 7, { kind: 'advance', to: 2, totalRows: 20 })
    localStorage.setItem('fw-pace-7', '[]')

    const askedOfStore = () => asked.filter(a => a.endsWith(' floatwise-user-12'))
    expect(askedOfStore()).toEqual(['open floatwise-user-12'])
    account.reset() // what a 401 from /api/me does
    await expect.poll(() => offline.current).toBeNull()
    expect(localStorage.getItem('fw-pace-7')).toBeNull()
    // The store is opened once more to count what waits in it, and kept.
    await expect.poll(() => askedOfStore().length).toBe(2)
    expect(askedOfStore()).toEqual(['open floatwise-user-12', 'open floatwise-user-12'])
    expect(await storesOnTablet()).toEqual(['floatwise-user-12'])

    network = 'up'
    account.me = personNumbered(12) // signs in again on this tablet
    await expect.poll(() => server.stored.size).toBe(1)
    expect(server.piece(7).completedRows).toBe(2)
  })

  it('deletes the store of a session that ended elsewhere when nothing in it waits to be sent', async () => {
    const offline = useOfflineStore()
    const account = useAccountStore()
    account.me = personNumbered(13)
    await savePiece((await offline.open(13)).db, sleeve)
    expect(await storesOnTablet()).toEqual(['floatwise-user-13'])
    account.reset()
    await expect.poll(storesOnTablet).toEqual([])
  })
})

describe('useSignOut', () => {
  async function signOutButton() {
    let signOut!: ReturnType<typeof useSignOut>
    await mountSuspended(defineComponent({
      setup() {
        signOut = useSignOut()
        return () => h('p', signOut.unsynced.value ? `${signOut.unsynced.value.steps} steps` : '')
      },
    }))
    return signOut
  }

  it('sends queued steps first and, with nothing left, deletes the store and starts again at the sign-in page', async () => {
    await leftOnTablet(21, 1)
    useAccountStore().me = personNumbered(21)
    const signOut = await signOutButton()
    await signOut.signOut()
    expect(server.stored.size).toBe(1)
    expect(signOut.unsynced.value).toBeNull()
    expect(logouts).toHaveLength(1)
    expect(await storesOnTablet()).toEqual([])
    expect(useAccountStore().me).toBeNull()
    expect(reloads).toEqual([{ path: '/login', force: true }])
  })

  it('waits 10 s for a sync that does not answer, then asks; discarding deletes the store', async () => {
    await leftOnTablet(22, 1)
    network = 'hanging'
    useAccountStore().me = personNumbered(22)
    await expect.poll(() => syncCalls).toBe(1) // the store opened for them, and its step is on its way
    const signOut = await signOutButton()
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] }) // IndexedDB's own tasks (setImmediate) stay real
    let answered = false
    const signingOut = signOut.signOut().then(() => { answered = true })
    await settle(() => vi.getTimerCount() > 0) // the wait for that sync has begun
    await vi.advanceTimersByTimeAsync(9_999)
    await settle()
    expect(answered).toBe(false)
    expect(signOut.busy.value).toBe(true)
    await vi.advanceTimersByTimeAsync(1)
    await signingOut
    vi.useRealTimers()
    expect(signOut.unsynced.value).toEqual({ steps: 1, pieces: ['Sleeve · Harbour jumper'] })
    expect(signOut.busy.value).toBe(false)
    expect(await storesOnTablet()).toEqual(['floatwise-user-22'])
    expect(reloads).toEqual([])

    await signOut.discardAndSignOut()
    expect(await storesOnTablet()).toEqual([])
    expect(useAccountStore().me).toBeNull()
    expect(reloads).toEqual([{ path: '/login', force: true }])
  })
})
