import { liveQuery } from 'dexie'

/**
 * A Dexie live query as a ref: re-runs when the tables it read change (in this tab or
 * another), and unsubscribes when the calling scope is disposed.
 */
export function useLiveQuery<T>(query: () => Promise<T> | T, initial: T) {
  const value = shallowRef<T>(initial)
  const error = shallowRef<unknown>(null)
  const subscription = liveQuery(query).subscribe({
    next: (v) => { value.value = v },
    error: (e) => { error.value = e },
  })
  onScopeDispose(() => subscription.unsubscribe())
  return { value, error }
}
