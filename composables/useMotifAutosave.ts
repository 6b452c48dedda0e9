import { combineChartRows } from '#shared/engine'
import type { MotifDetail } from '#shared/types/motif'

export type MotifSaveState = 'saved' | 'saving' | 'unsaved' | 'offline' | 'error' | 'conflict'

interface Pending { rows?: true; name?: string; published?: boolean }

/**
 * Saves the motif a moment after each change (one PATCH for a burst of painting), says
 * whether it is saved, and tries again when the network returns. `rows()` is read at send
 * time, so a long drag costs one request.
 *
 * Each save names the version it was made from (`from`, then each answer's). When the motif
 * was changed elsewhere meanwhile the server saves nothing and answers 409 with its copy: the
 * state is 'conflict', `theirs` holds that copy, and nothing more is sent (changes made
 * meanwhile are kept) until the designer chooses: `keepMine`, `takeTheirs`, or `combined` then
 * `keepMine` with its rows.
 */
export function useMotifAutosave(
  id: number,
  rows: () => string[],
  options: { delayMs?: number; from?: MotifDetail; onSaved?: (motif: MotifDetail) => void } = {},
) {
  const delay = options.delayMs ?? 800
  const state = ref<MotifSaveState>('saved')
  const message = ref('')
  /** The server's copy this one was made from: its version (sent with each save) and chart. */
  let version = options.from?.version
  let baseRows = options.from?.rows
  const theirs = shallowRef<MotifDetail | null>(null)
  let pending: Pending = {}
  let timer: ReturnType<typeof setTimeout> | undefined
  let sending: Promise<void> | null = null
  const hasPending = () => Object.keys(pending).length > 0

  function queue(change: Pending, wait = delay) {
    pending = { ...pending, ...change }
    // Changed elsewhere: keep the change, send nothing until the designer has chosen.
    if (theirs.value) return
    state.value = navigator.onLine === false ? 'offline' : 'unsaved'
    clearTimeout(timer)
    timer = setTimeout(() => {
      void flush()
    }, wait)
  }

  async function flush(): Promise<void> {
    clearTimeout(timer)
    if (sending) {
      await sending
      if (!hasPending() || state.value === 'error') return
    }
    if (!hasPending() || theirs.value) return
    const taken = pending
    pending = {}
    const body = { ...taken, rows: taken.rows ? rows() : undefined, version }
    state.value = 'saving'
    sending = (async () => {
      try {
        const saved = await $fetch<MotifDetail>(`/api/motifs/${id}`, { method: 'PATCH', body })
        version = saved.version
        baseRows = saved.rows ?? baseRows
        options.onSaved?.(saved)
        state.value = hasPending() ? 'unsaved' : 'saved'
        message.value = ''
      }
      catch (error) {
        pending = { ...taken, ...pending }
        const status = (error as { statusCode?: number }).statusCode
        const current = changedElsewhereCopy<MotifDetail>(error)
        if (current) {
          theirs.value = current
          state.value = 'conflict'
          message.value = ''
        }
        else if (!status) {
          state.value = 'offline'
          // Try again now and then; the 'online' event below is quicker when the browser sends it.
          timer = setTimeout(() => {
            void flush()
          }, 10_000)
        }
        else {
          state.value = 'error'
          message.value = describeApiError(error).message
        }
      }
      finally {
        sending = null
      }
    })()
    await sending
    if (hasPending() && (state.value as MotifSaveState) === 'unsaved') queue({}, delay)
  }

  /** Overwrite their copy knowingly: this copy's chart and `fields`, sent now as made from theirs. */
  function keepMine(fields: Omit<Pending, 'rows'> = {}) {
    const current = theirs.value
    if (!current) return Promise.resolve()
    version = current.version
    baseRows = current.rows
    theirs.value = null
    pending = { ...pending, ...fields, rows: true }
    return flush()
  }

  /** Their copy becomes this one (the caller shows it); this copy's unsaved changes are dropped. */
  function takeTheirs(): MotifDetail | null {
    const current = theirs.value
    if (!current) return null
    version = current.version
    baseRows = current.rows
    theirs.value = null
    pending = {}
    clearTimeout(timer)
    state.value = 'saved'
    message.value = ''
    return current
  }

  /**
   * The stitches changed here since the copy this one was made from, on top of their chart;
   * null when the charts are not the same size (or there is no conflict).
   */
  function combined(mine: string[]) {
    return theirs.value && baseRows ? combineChartRows(baseRows, mine, theirs.value.rows) : null
  }
  /** Whether this copy changed the name or publishing since it was last saved. */
  const changedHere = (field: 'name' | 'published') => pending[field] !== undefined

  useEventListener(window, 'online', () => {
    if (hasPending()) void flush()
  })
  useEventListener(window, 'offline', () => {
    if (hasPending() && !theirs.value) state.value = 'offline'
  })
  // Leaving with changes not yet on the server: send them, and let the browser ask first.
  useEventListener(window, 'beforeunload', (event: BeforeUnloadEvent) => {
    if (state.value === 'saved') return
    void flush()
    event.preventDefault()
  })
  onBeforeUnmount(() => {
    if (hasPending()) void flush()
  })

  const words = computed(
    () =>
      ({
        saved: 'Saved',
        saving: 'Saving…',
        unsaved: 'Not saved yet',
        offline: 'Not saved: offline. Saves when the connection returns',
        error: `Not saved: ${message.value}`,
        conflict: 'Not saved: changed elsewhere. Choose which copy to keep',
      })[state.value],
  )

  return { state, message, words, theirs, queue, flush, keepMine, takeTheirs, combined, changedHere }
}
