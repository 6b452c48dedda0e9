import { acceptHMRUpdate, defineStore } from 'pinia'
import type { FloatwiseDb, Syncer, SyncState, UnsyncedSummary } from '~~/offline'

// The code of ~~/offline (Dexie, the outbox, the syncer) is loaded on first use, never imported
// here: this store starts with the app (plugins/offline.client.ts), so an import would put
// Dexie in the entry chunk and every page would wait for it before it paints. The knit view
// brings it in its own chunk and opens the store at once; every other page loads it once it
// has painted and opens the store for whoever is signed in.
type OfflineCode = typeof import('~~/offline')
const loadCode = (): Promise<OfflineCode> => import('~~/offline')

/** One person's store on this device, and the syncer sending its queued steps. */
export interface OpenOfflineStore {
  readonly userId: number
  readonly db: FloatwiseDb
  readonly syncer: Syncer
}

/**
 * The signed-in person's offline store: their Dexie database and its syncer, one person at a
 * time (two people sharing a tablet never see each other's queued rows), the sync state the
 * screens show, and whether another tab changed the store under this one. Client only.
 */
export const useOfflineStore = defineStore('offline', () => {
  const account = useAccountStore()
  // Shallow: a Dexie database and a syncer are not data for Vue to make deeply reactive.
  const opened = shallowRef<OpenOfflineStore | null>(null)
  /** The syncer's last report for the open store; null while none is open. */
  const state = ref<SyncState | null>(null)
  /** Another tab upgraded the store: this tab's copy of the app is old (AppUpdatePrompt asks for a reload). */
  const reloadNeeded = ref(false)

  const current = computed(() => opened.value)
  const userId = computed(() => opened.value?.userId ?? null)
  const db = computed(() => opened.value?.db ?? null)
  const syncer = computed(() => opened.value?.syncer ?? null)

  function onVersionChange(event: IDBVersionChangeEvent) {
    // Deleted (newVersion null): the person signed out, or their session ended, in another
    // tab. This tab starts again from the sign-in check rather than show their data on.
    if (event.newVersion === null) reloadNuxtApp({ path: '/login', force: true })
    else reloadNeeded.value = true
  }

  function openWith(code: OfflineCode, id: number): OpenOfflineStore {
    if (opened.value?.userId === id) return opened.value
    close()
    const db = code.openUserStore(id, { onVersionChange })
    const syncer: Syncer = code.createSyncer({
      db,
      // A report of a store closed meanwhile (a run was still finishing) is not this person's.
      onState: (s) => { if (opened.value?.syncer === syncer) state.value = s },
    })
    opened.value = { userId: id, db, syncer }
    syncer.start()
    return opened.value
  }

  /** Opens the person's store and starts its syncer; the store already open for them is reused. */
  async function open(id: number): Promise<OpenOfflineStore> {
    return openWith(await loadCode(), id)
  }

  function close() {
    opened.value?.syncer.stop()
    opened.value?.db.close()
    opened.value = null
    state.value = null
  }

  /** Steps still queued in the person's store, and the pieces they belong to (the sign-out warning). */
  async function unsynced(id: number): Promise<UnsyncedSummary> {
    const code = await loadCode()
    return code.summariseUnsynced(openWith(code, id).db)
  }

  /**
   * Everything this device keeps for a person who is no longer signed in: their store, cached
   * /api/ answers and pace. `keepQueued`: their session ended without a sign-out here, so a
   * store with steps not yet sent stays for their next sign-in (never dropped silently).
   */
  async function forgetPerson(id: number, { keepQueued }: { keepQueued: boolean }) {
    if (opened.value?.userId === id) close()
    forgetKnitPace()
    const code = await loadCode()
    await code.clearPersonalCaches().catch(() => 0)
    if (keepQueued) await code.forgetUserStoreUnlessQueued(id)
    else await code.deleteUserStore(id)
  }

  /** Sign-out: the person's store goes, queued steps included (they were asked first). */
  const discard = (id: number) => forgetPerson(id, { keepQueued: false })

  // The watch belongs to the store, not to whoever calls `start` (a component would end it).
  const scope = getCurrentScope()!
  let started = false

  /**
   * Follows the signed-in person: opens their store (so rows kept on this device are sent from
   * whichever page is open, not only from the knit view) and forgets the one who left. Called
   * once, by plugins/offline.client.ts, before the first page asks the server who is signed in,
   * so a session that ended elsewhere (401 from /api/me) is seen going from that person to no one.
   */
  function start() {
    if (started) return
    started = true
    let nuxtReady = false
    async function openIfStillSignedIn(id: number) {
      const code = await loadCode()
      if (account.me?.user.id === id) openWith(code, id)
    }
    // Other pages load the store's code only once they have painted.
    onNuxtReady(() => {
      nuxtReady = true
      if (account.me) void openIfStillSignedIn(account.me.user.id)
    })
    scope.run(() => {
      watch(() => account.me?.user.id, async (id, previous) => {
        // After a sign-out here the store is already gone and this finds nothing to do.
        if (previous && previous !== id) await forgetPerson(previous, { keepQueued: true }).catch(() => {})
        if (id && nuxtReady) await openIfStillSignedIn(id)
      })
    })
  }

  return { state, reloadNeeded, current, userId, db, syncer, open, close, unsynced, discard, start }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useOfflineStore, import.meta.hot))
