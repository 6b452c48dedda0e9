import { retryAfterMs } from './backoff'
import type { SyncFailure } from './syncStore'
import type { SyncRequest, SyncResponse } from './types'

export type SyncAnswer = { ok: true; answer: SyncResponse } | { ok: false; error: Omit<SyncFailure, 'at'> }

function isSyncResponse(body: unknown): body is SyncResponse {
  const b = body as SyncResponse | null
  return !!b && Array.isArray(b.accepted) && Array.isArray(b.pieces) && (b.rejected === undefined || Array.isArray(b.rejected))
}

/**
 * One `POST /api/sync`, with every way it can go wrong turned into a failure kind the syncer
 * acts on (the cookie session rides along: same origin).
 */
export async function postSync(fetchFn: typeof globalThis.fetch, baseUrl: string, body: SyncRequest): Promise<SyncAnswer> {
  let res: Response
  try {
    res = await fetchFn(`${baseUrl}/api/sync`, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { 'content-type': 'application/json', 'accept': 'application/json' },
      body: JSON.stringify(body),
    })
  }
  catch (e) {
    return { ok: false, error: { kind: 'network', message: e instanceof Error ? e.message : String(e) } }
  }
  const text = await res.text().catch(() => '')
  if (res.status === 401) return { ok: false, error: { kind: 'signed-out', status: 401, message: 'Signed out: sign in again to sync.' } }
  if (!res.ok) {
    const kind = res.status >= 500 || res.status === 429 ? 'server' : 'bad-request'
    const wait = retryAfterMs(res.headers.get('retry-after'))
    return { ok: false, error: { kind, status: res.status, message: text.slice(0, 500) || res.statusText, ...(wait === null ? {} : { retryAfterMs: wait }) } }
  }
  let parsed: unknown
  try { parsed = JSON.parse(text) }
  catch { /* handled below */ }
  if (!isSyncResponse(parsed)) return { ok: false, error: { kind: 'server', status: res.status, message: 'The sync answer was not understood.' } }
  return { ok: true, answer: parsed }
}
