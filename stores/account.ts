import { defineStore, acceptHMRUpdate } from 'pinia'
import { roleAtLeast, type StudioRole, type StudioSummary } from '#shared/types/studio'

interface Me { user: { id: number; email: string; name: string }; studios: StudioSummary[] }

/** Who is signed in, their studios, and which studio the screens are looking at. */
export const useAccountStore = defineStore('account', () => {
  // Kept on the device so a tablet that is offline still knows who is knitting; the server
  // checks the session again on every request.
  const me = useLocalStorage<Me | null>('fw-me', null, { serializer: { read: v => (v ? JSON.parse(v) : null), write: v => JSON.stringify(v) } })
  const chosenStudioId = useLocalStorage<number | null>('fw-studio', null)
  // A sign-out made offline: the session cookie is out of the app's reach (httpOnly), so the
  // server is told as soon as it answers, before anyone is taken for signed in again.
  const signOutOwed = useLocalStorage<boolean>('fw-sign-out-owed', false)

  const studios = computed(() => me.value?.studios ?? [])
  const currentStudio = computed(() =>
    studios.value.find(s => s.id === chosenStudioId.value)
    // A shared studio is more useful to land in than the personal one.
    ?? studios.value.find(s => !s.personal)
    ?? studios.value[0]
    ?? null)
  /** The caller's role in the current studio (null: no studio). */
  const role = computed(() => currentStudio.value?.role ?? null)

  /**
   * Whether the person has at least `least` in the current studio, or in `studioId` (a motif
   * opened from a link may be another studio's). Only what the screens offer: the server decides.
   */
  function can(least: StudioRole, studioId?: number) {
    const inStudio = studioId === undefined ? role.value : studios.value.find(s => s.id === studioId)?.role
    return roleAtLeast(inStudio, least)
  }

  async function sendOwedSignOut() {
    try {
      await $fetch('/api/auth/logout', { method: 'POST' })
      signOutOwed.value = false
    }
    catch { /* still no answer: the next check tries again */ }
    return !signOutOwed.value
  }

  /**
   * Asks the server who is signed in. Only a 401 means no one: with no answer at all
   * (offline) or a server error (a 503 while its database restarts) the kept one stands.
   */
  async function refresh() {
    if (signOutOwed.value && !(await sendOwedSignOut())) {
      me.value = null
      return null
    }
    try { me.value = await $fetch<Me>('/api/me') }
    catch (error) {
      if ((error as { statusCode?: number }).statusCode === 401) reset()
    }
    return me.value
  }

  /** Right after the server made a session (sign-in, invitation): an owed sign-out is void, the new cookie replaced the old one. */
  function afterSignIn() {
    signOutOwed.value = false
    return refresh()
  }

  function chooseStudio(id: number) { chosenStudioId.value = id }

  /** Sign-out on this device: nothing of the person stays in the store or in localStorage. */
  function reset(options: { serverStillSignedIn?: boolean } = {}) {
    if (options.serverStillSignedIn) signOutOwed.value = true
    me.value = null
    chosenStudioId.value = null
  }

  return { me, studios, currentStudio, role, can, refresh, afterSignIn, chooseStudio, reset }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useAccountStore, import.meta.hot))
