import type { FetchError } from 'ofetch'

interface ApiErrorBody { message?: string; statusMessage?: string; data?: { issues?: { path: string[]; message: string }[] } }

/**
 * Turns a failed $fetch into words for the screen: the server's message (which names
 * the field), and per-field messages from zod issues so each can sit next to its input.
 */
export function describeApiError(error: unknown): { message: string; fields: Record<string, string> } {
  const fetchError = error as FetchError<ApiErrorBody>
  const body = fetchError?.data
  const fields: Record<string, string> = {}
  for (const issue of body?.data?.issues ?? []) {
    const key = issue.path.join('.')
    if (key && !fields[key]) fields[key] = issue.message
  }
  if (fetchError?.statusCode === 429) {
    return { message: body?.message ?? 'Too many attempts; wait a little and try again.', fields }
  }
  if (!fetchError?.statusCode) return { message: 'No connection to Floatwise right now. Check the network and try again.', fields }
  if (fetchError.statusCode >= 500) return { message: 'Something went wrong on our side. Try again in a moment.', fields }
  return { message: body?.message ?? fetchError.statusMessage ?? 'That did not work.', fields }
}

/**
 * The copy a 409 "changed elsewhere" answer carries (`data.current`: the motif or plan as it is
 * now, after someone else's save), or undefined for any other failure.
 */
export function changedElsewhereCopy<T>(error: unknown): T | undefined {
  const fetchError = error as FetchError<{ data?: { current?: T } }>
  return fetchError?.statusCode === 409 ? fetchError.data?.data?.current ?? undefined : undefined
}
