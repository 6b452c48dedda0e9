import { createSyncer, openFloatwiseDb, type FloatwiseDb, type SyncState, type Syncer } from '~~/service'

// The offline store and its syncer, one per signed-in person on this device (two people
// sharing a tablet never see each other's queued rows). Client only: IndexedDB.
export default defineNuxtPlugin(() => {
  const state = ref<SyncState | null>(null)
  const reloadNeeded = ref(false)
  let current: { userId: number; db: FloatwiseDb; syncer: Syncer } | null = null

  function open(userId: number) {
    if (current?.userId === userId) return current
    close()
    const db = openFloatwiseDb(`floatwise-user-${userId}`, {
      // Another tab upgraded the store: this tab's copy of the app is old. Ask for a reload.
      onVersionChange: () => { reloadNeeded.value = true },
    })
    const syncer = createSyncer({ db, onState: (s) => { state.value = s } })
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

  return { provide: { offline: { open, close, state, reloadNeeded } } }
})
