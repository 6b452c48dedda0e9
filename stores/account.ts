import { defineStore, acceptHMRUpdate } from 'pinia'
import type { StudioSummary } from '~~/shared/types/studio'

interface Me { user: { id: number; email: string; name: string }; studios: StudioSummary[] }

/** Who is signed in, their studios, and which studio the screens are looking at. */
export const useAccountStore = defineStore('account', () => {
  // Kept on the device so a tablet that is offline still knows who is knitting; the server
  // checks the session again on every request.
  const me = useLocalStorage<Me | null>('fw-me', null, { serializer: { read: v => (v ? JSON.parse(v) : null), write: v => JSON.stringify(v) } })
  const chosenStudioId = useLocalStorage<number | null>('fw-studio', null)

  const studios = computed(() => me.value?.studios ?? [])
  const currentStudio = computed(() =>
    studios.value.find(s => s.id === chosenStudioId.value)
    // A shared studio is more useful to land in than the personal one.
    ?? studios.value.find(s => !s.personal)
    ?? studios.value[0]
    ?? null)

  /** Asks the server who is signed in; with no answer at all (offline) the kept one stands. */
  async function refresh() {
    try { me.value = await $fetch<Me>('/api/me') }
    catch (error) {
      if ((error as { statusCode?: number }).statusCode) me.value = null
    }
    return me.value
  }

  function chooseStudio(id: number) { chosenStudioId.value = id }

  function forget() { me.value = null }

  return { me, studios, currentStudio, refresh, chooseStudio, forget }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useAccountStore, import.meta.hot))
