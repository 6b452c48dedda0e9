import type { UnsyncedSummary } from '~~/offline'

/** How long sign-out waits for queued steps to go before it asks instead. */
const syncWaitMs = 10_000

/**
 * Signing out of a shared tablet. Queued steps are sent first; steps that cannot be sent
 * (offline, or the session already ended) are lost only after the person says so. Then their
 * offline store, cached /api/ answers and kept details go, and the app starts again at the
 * sign-in page, so the next person finds nothing of them, not even in memory.
 */
export function useSignOut() {
  const offline = useOfflineStore()
  const account = useAccountStore()
  /** Set while the warning asks what to do with steps not yet sent. */
  const unsynced = ref<UnsyncedSummary | null>(null)
  const busy = ref(false)

  async function stepsLeftAfterSync(userId: number): Promise<UnsyncedSummary> {
    const { syncer } = await offline.open(userId)
    await Promise.race([syncer.flush(), new Promise(resolve => setTimeout(resolve, syncWaitMs))])
    return offline.unsynced(userId)
  }

  async function leave(userId: number | undefined) {
    let serverStillSignedIn = false
    try { await $fetch('/api/auth/logout', { method: 'POST' }) }
    catch { serverStillSignedIn = true } // offline: the account store sends it when the server answers
    if (userId) await offline.discard(userId)
    account.reset({ serverStillSignedIn })
    reloadNuxtApp({ path: '/login', force: true })
  }

  // `busy` stays on once leaving: the page is reloading to the sign-in page.
  async function signOut() {
    if (busy.value) return
    busy.value = true
    try {
      const userId = account.me?.user.id
      const left = userId ? await stepsLeftAfterSync(userId) : null
      if (left && left.steps > 0) {
        unsynced.value = left
        busy.value = false
      }
      else await leave(userId)
    }
    catch (error) {
      busy.value = false
      throw error
    }
  }

  async function discardAndSignOut() {
    unsynced.value = null
    busy.value = true
    await leave(account.me?.user.id).catch((error) => {
      busy.value = false
      throw error
    })
  }

  function stay() { unsynced.value = null }

  return { signOut, discardAndSignOut, stay, unsynced, busy }
}
