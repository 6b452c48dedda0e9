import type { createSyncer, openFloatwiseDb, FloatwiseDb, SyncState, Syncer } from '~~/service'

/** The parts of `~~/service` that open the store; passed in so this plugin imports none of it. */
export interface OfflineStoreCode {
  openFloatwiseDb: typeof openFloatwiseDb
  createSyncer: typeof createSyncer
}

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
    const db = code.openFloatwiseDb(`floatwise-user-${userId}`, {
      // Another tab upgraded the store: this tab's copy of the app is old. Ask for a reload.
      onVersionChange: () => { reloadNeeded.value = true },
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

  // Rows kept on this device are sent from whichever page is open, not only from the knit view.
  onNuxtReady(() => {
    const account = useAccountStore()
    watch(() => account.me?.user.id, async (userId) => {
      if (!userId) return close()
      const code = await import('~~/service')
      if (account.me?.user.id === userId) open(userId, code)
    }, { immediate: true })
  })

  return { provide: { offline: { open, close, state, reloadNeeded } } }
})
