import { clearPersonalCaches, createSyncer, deleteUserStore, forgetUserStoreUnlessQueued, openUserStore } from '~~/offline'

/** The signed-in person's offline store and syncer (opened on first use). */
export function useOfflineStore() {
  const { $offline } = useNuxtApp()
  const account = useAccountStore()
  const userId = account.me?.user.id
  if (!userId) throw new Error('The offline store needs a signed-in person')
  const code = { openUserStore, createSyncer, deleteUserStore, forgetUserStoreUnlessQueued, clearPersonalCaches }
  return { ...$offline.open(userId, code), state: $offline.state, reloadNeeded: $offline.reloadNeeded }
}
