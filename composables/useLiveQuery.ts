import { liveQuery } from 'dexie'

/**
 * A Dexie live query as a ref, on the database `source` gives (the signed-in person's store,
 * once it is open): re-runs when the tables it read change (in this tab or another), and
 * unsubscribes when that database goes or changes (back to `initial`, so nothing of a person
 * who left stays on screen) and when the calling scope is disposed.
 */
export function useLiveQuery<D, T>(source: () => D | null | undefined, query: (db: D) => Promise<T> | T, initial: T) {
  const value = shallowRef<T>(initial)
  const error = shallowRef<unknown>(null)
  watch(source, (db, _previous, onCleanup) => {
    value.value = initial
    error.value = null
    if (!db) return
    const subscription = liveQuery(() => query(db)).subscribe({
      next: (v) => { value.value = v },
      error: (e) => { error.value = e },
    })
    onCleanup(() => subscription.unsubscribe())
  }, { immediate: true })
  return { value, error }
}
