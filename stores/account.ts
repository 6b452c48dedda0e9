import { defineStore, acceptHMRUpdate } from 'pinia'
import type { StudioSummary } from '~~/shared/types/studio'

interface Me { user: { id: number; email: string; name: string }; studios: StudioSummary[] }

/** Who is signed in, their studios, and which studio the screens are looking at. */
export const useAccountStore = defineStore('account', () => {
  const me = ref<Me | null>(null)
  const chosenStudioId = useLocalStorage<number | null>('fw-studio', null)

  const studios = computed(() => me.value?.studios ?? [])
  const currentStudio = computed(() =>
    studios.value.find(s => s.id === chosenStudioId.value)
    // A shared studio is more useful to land in than the personal one.
    ?? studios.value.find(s => !s.personal)
    ?? studios.value[0]
    ?? null)

  async function refresh() {
    try { me.value = await $fetch<Me>('/api/me') }
    catch { me.value = null }
    return me.value
  }

  function chooseStudio(id: number) { chosenStudioId.value = id }

  function forget() { me.value = null }

  return { me, studios, currentStudio, refresh, chooseStudio, forget }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useAccountStore, import.meta.hot))
