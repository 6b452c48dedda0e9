import type { clearPersonalCaches, createSyncer, deleteUserStore, forgetUserStoreUnlessQueued, openUserStore, FloatwiseDb, SyncState, Syncer } from '~~/offline'

/** The parts of `~~/service` that open and remove the store; passed in so this plugin imports none of it. */
export interface OfflineStoreCode {
  openUserStore: typeof openUserStore
  createSyncer: typeof createSyncer
  deleteUserStore: typeof deleteUserStore
  forgetUserStoreUnlessQueued: typeof forgetUserStoreUnlessQueued
  clearPersonalCaches: typeof clearPersonalCaches
}

const loadCode = (): Promise<OfflineStoreCode> => import('~~/offline')

// The offline store and its syncer, one per signed-in person on this device (two people
// sharing a tablet never see each other's queued rows). Client only: IndexedDB.
// Dexie and the syncer are not imported here, so they stay out of the entry chunk and no
// page waits for them before it paints: the knit view brings them in its own chunk and opens
// the store at once (useOfflineStore); every other page loads them once it has painted.
export default defineNuxtPlugin(() => {
  const state = ref<SyncState | null>(null)
  const reloadNeeded = ref(false)
  let current: { userId: number; db: FloatwiseDb; syncer: Syncer } | null = null

  function open(userId: number, code: OfflineStoreCode) {
    if (current?.userId === userId) return current
    close()
    const db = code.openUserStore(userId, {
      onVersionChange: (event) => {
        // Deleted (newVersion null): the person signed out, or their session ended, in another
        // tab. This tab starts again from the sign-in check rather than show their data on.
        if (event.newVersion === null) reloadNuxtApp({ path: '/login', force: true })
        // Another tab upgraded the store: this tab's copy of the app is old. Ask for a reload.
        else reloadNeeded.value = true
      },
    })
    const syncer = code.createSyncer({ db, onState: (s) => { state.value = s } })
    syncer.start()
    current = { userId, db, syncer }
    return current
  }

  function close() {
    current?.syncer.stop()
    current?.db.close()
    current = null
    state.value = null
  }

  /**
   * Everything this device keeps for a person who is no longer signed in: their store, cached
   * /api/ answers and pace. `keepQueued`: their session ended without a sign-out here, so a
   * store with steps not yet sent stays for their next sign-in (never dropped silently).
   */
  async function forgetPerson(userId: number, { keepQueued }: { keepQueued: boolean }) {
    if (current?.userId === userId) close()
    forgetKnitPace()
    const code = await loadCode()
    await code.clearPersonalCaches().catch(() => 0)
    if (keepQueued) await code.forgetUserStoreUnlessQueued(userId)
    else await code.deleteUserStore(userId)
  }

  /** Sign-out: the person's store goes, queued steps included (they were asked first). */
  const discard = (userId: number) => forgetPerson(userId, { keepQueued: false })

  // Rows kept on this device are sent from whichever page is open, not only from the knit view.
  const account = useAccountStore()
  let nuxtReady = false
  async function openWhenLoaded(userId: number) {
    const code = await loadCode()
    if (account.me?.user.id === userId) open(userId, code)
  }
  onNuxtReady(() => {
    nuxtReady = true
    if (account.me) void openWhenLoaded(account.me.user.id)
  })

  // Watched from the start, before the first page asks the server who is signed in, so a
  // session that ended elsewhere (401 from /api/me) is seen going from that person to no one.
  watch(() => account.me?.user.id, async (userId, previous) => {
    // After a sign-out here the store is already gone and this finds nothing to do.
    if (previous && previous !== userId) await forgetPerson(previous, { keepQueued: true }).catch(() => {})
    if (userId && nuxtReady) await openWhenLoaded(userId)
  })

  return { provide: { offline: { open, close, discard, state, reloadNeeded } } }
})
