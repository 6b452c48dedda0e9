import type { MotifDetail } from '#shared/types/motif'

export type MotifSaveState = 'saved' | 'saving' | 'unsaved' | 'offline' | 'error'

interface Pending { rows?: true; name?: string; published?: boolean }

/**
 * Saves the motif a moment after each change (one PATCH for a burst of painting), says
 * whether it is saved, and tries again when the network returns. `rows()` is read at send
 * time, so a long drag costs one request.
 */
export function useMotifAutosave(id: number, rows: () => string[], options: { delayMs?: number; onSaved?: (motif: MotifDetail) => void } = {}) {
  const delay = options.delayMs ?? 800
  const state = ref<MotifSaveState>('saved')
  const message = ref('')
  let pending: Pending = {}
  let timer: ReturnType<typeof setTimeout> | undefined
  let sending: Promise<void> | null = null
  const hasPending = () => Object.keys(pending).length > 0

  function queue(change: Pending, wait = delay) {
    pending = { ...pending, ...change }
    state.value = navigator.onLine === false ? 'offline' : 'unsaved'
    clearTimeout(timer)
    timer = setTimeout(() => { void flush() }, wait)
  }

  async function flush(): Promise<void> {
    clearTimeout(timer)
    if (sending) { await sending; if (!hasPending() || state.value === 'error') return }
    if (!hasPending()) return
    const taken = pending
    pending = {}
    const body = { ...taken, rows: taken.rows ? rows() : undefined }
    state.value = 'saving'
    sending = (async () => {
      try {
        const saved = await $fetch<MotifDetail>(`/api/motifs/${id}`, { method: 'PATCH', body })
        options.onSaved?.(saved)
        state.value = hasPending() ? 'unsaved' : 'saved'
        message.value = ''
      }
      catch (error) {
        pending = { ...taken, ...pending }
        const status = (error as { statusCode?: number }).statusCode
        if (!status) {
          state.value = 'offline'
          // Try again now and then; the 'online' event below is quicker when the browser sends it.
          timer = setTimeout(() => { void flush() }, 10_000)
        }
        else {
          state.value = 'error'
          message.value = describeApiError(error).message
        }
      }
      finally { sending = null }
    })()
    await sending
    if (hasPending() && (state.value as MotifSaveState) === 'unsaved') queue({}, delay)
  }

  useEventListener(window, 'online', () => { if (hasPending()) void flush() })
  useEventListener(window, 'offline', () => { if (hasPending()) state.value = 'offline' })
  // Leaving with changes not yet on the server: send them, and let the browser ask first.
  useEventListener(window, 'beforeunload', (event: BeforeUnloadEvent) => {
    if (state.value === 'saved') return
    void flush()
    event.preventDefault()
  })
  onBeforeUnmount(() => { if (hasPending()) void flush() })

  const words = computed(() => ({
    saved: 'Saved',
    saving: 'Saving…',
    unsaved: 'Not saved yet',
    offline: 'Not saved: offline. Saves when the connection returns',
    error: `Not saved: ${message.value}`,
  })[state.value])

  return { state, message, words, queue, flush }
}
