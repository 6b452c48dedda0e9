import { backoffCapMs, backoffDelay } from './backoff'
import { getDeviceId, readMeta, writeMeta, type FloatwiseDb } from './db'
import { applySyncAnswer, countSendable, heldPieceIds, readSyncState, type SyncFailure, type SyncState } from './syncStore'
import { postSync } from './syncHttp'
import type { OutboxEntry, RowEvent, SyncRequest } from './types'

export interface SyncerOptions {
  db: FloatwiseDb
  fetch?: typeof globalThis.fetch
  baseUrl?: string
  /** The server takes at most 500 events per request. */
  batchSize?: number
  now?: () => Date
  onState?: (state: SyncState) => void
  /** Jitter source for backoff (tests pin it). */
  random?: () => number
}

export interface SyncResult {
  ok: boolean
  accepted: number
  rejected: number
  batches: number
  error: SyncFailure | null
}

function toEvent({ id, pieceId, kind, from, to, version, at }: OutboxEntry): RowEvent {
  return { id, pieceId, kind, from, to, version, at }
}

export function createSyncer(options: SyncerOptions) {
  const { db, baseUrl = '', batchSize = 500, onState, random = Math.random } = options
  const fetchFn = options.fetch ?? ((...args: Parameters<typeof fetch>) => globalThis.fetch(...args))
  const now = options.now ?? (() => new Date())
  let running: Promise<SyncResult> | null = null
  let again = false
  let failures = 0
  let retryAt: number | null = null
  let started = false
  let timer: ReturnType<typeof setTimeout> | undefined
  const online = () => (typeof navigator !== 'undefined' && navigator.onLine === false ? false : undefined)

  const post = (body: SyncRequest) => postSync(fetchFn, baseUrl, body)

  async function drain(): Promise<SyncResult> {
    const result: SyncResult = { ok: true, accepted: 0, rejected: 0, batches: 0, error: null }
    const deviceId = await getDeviceId(db)
    for (;;) {
      // Pieces with an unanswered conflict wait: sending their steps would build on the other
      // device's place and overwrite it silently. Everything else drains in device order.
      const held = await heldPieceIds(db)
      const batch = await db.outbox.orderBy('seq').filter(e => !held.has(e.pieceId)).limit(batchSize).toArray()
      if (batch.length === 0) return result
      const answer = await post({ deviceId, events: batch.map(toEvent) })
      if (!answer.ok) return { ...result, ok: false, error: { ...answer.error, at: now().toISOString() } }
      await applySyncAnswer(db, answer.answer, now().toISOString(), batch)
      const moved = answer.answer.accepted.length + (answer.answer.rejected?.length ?? 0)
      result.batches += 1
      result.accepted += answer.answer.accepted.length
      result.rejected += answer.answer.rejected?.length ?? 0
      // An answer that takes nothing would make this loop spin on the same batch.
      if (moved === 0)
        return { ...result, ok: false, error: { kind: 'server', message: `The server took none of ${batch.length} events.`, at: now().toISOString() } }
    }
  }

  /** Records the outcome: backoff and the last error live across reloads in `meta`. */
  async function settle(result: SyncResult) {
    const error = result.error
    if (!error) {
      failures = 0
      retryAt = null
    }
    else if (error.kind === 'signed-out') retryAt = null // waits for sign-in, not for a timer
    else {
      failures += 1
      // A 4xx will fail the same way again: keep the events, retry only at the slowest pace.
      // A server that says how long to wait (a 503 while its database restarts) is not asked sooner.
      retryAt = Date.now() + (error.kind === 'bad-request' ? backoffCapMs : Math.max(backoffDelay(failures, random), error.retryAfterMs ?? 0))
    }
    await writeMeta(db, 'lastError', error)
  }

  async function run(): Promise<SyncResult> {
    let result: SyncResult
    try {
      do {
        again = false
        try { result = await drain() }
        catch (e) {
          result = {
            ok: false,
            accepted: 0,
            rejected: 0,
            batches: 0,
            error: { kind: 'storage', message: e instanceof Error ? e.message : String(e), at: now().toISOString() },
          }
        }
      } while (again && result.ok)
      await settle(result).catch(() => {})
    }
    finally {
      running = null
    }
    await publish()
    return result
  }

  /** Sends every queued event; calls made while a run is going share that run. */
  function flush(): Promise<SyncResult> {
    if (running) {
      again = true
      return running
    }
    running = run()
    return running
  }

  /** Pulls the server's place of pieces (e.g. one knitted on another device meanwhile). */
  async function refresh(pieceIds: number[]): Promise<SyncResult> {
    const outcome = (error: SyncFailure | null): SyncResult => ({ ok: !error, accepted: 0, rejected: 0, batches: error ? 0 : 1, error })
    // Never rejects: callers fire it and forget (`void syncer.refresh(…)`).
    try {
      const answer = await post({ deviceId: await getDeviceId(db), events: [], pieceIds })
      const at = now().toISOString()
      // A refresh tells about the network too, but leaves the flush's backoff alone.
      if (!answer.ok) {
        const error = { ...answer.error, at }
        await writeMeta(db, 'lastError', error)
        return outcome(error)
      }
      await applySyncAnswer(db, answer.answer, at)
      if ((await readMeta<SyncFailure>(db, 'lastError'))?.kind === 'network') await writeMeta(db, 'lastError', null)
      return outcome(null)
    }
    catch (e) {
      return outcome({ kind: 'storage', message: e instanceof Error ? e.message : String(e), at: now().toISOString() })
    }
    finally {
      await publish()
    }
  }

  async function state(): Promise<SyncState> {
    return readSyncState(db, online(), retryAt === null ? null : Math.max(0, retryAt - Date.now()))
  }

  async function publish() {
    const current = await state().catch(() => null)
    if (current) onState?.(current)
    const sendable = started && current ? await countSendable(db).catch(() => 0) : 0
    schedule(current, sendable)
  }

  /**
   * A timer only while there is a reason: a retry after a failure, or events left queued
   * (recorded in another tab, or while a run was finishing) that no one nudged.
   */
  function schedule(current: SyncState | null, sendable: number) {
    clearTimeout(timer)
    timer = undefined
    if (!started || !current || current.lastError?.kind === 'signed-out') return
    const wait = retryAt !== null ? Math.max(0, retryAt - Date.now()) : sendable > 0 ? 15_000 : null
    if (wait === null) return
    timer = setTimeout(() => void flush(), wait)
    ;(timer as { unref?: () => void }).unref?.()
  }

  /** After a step: send now unless a backoff wait is running (its timer will send). */
  function nudge(): Promise<SyncResult | null> {
    if (retryAt !== null && retryAt > Date.now()) return publish().then(() => null)
    return flush()
  }

  const onOnline = () => {
    retryAt = null
    void flush()
  }
  const onOffline = () => void publish()
  const onVisible = () => {
    if (typeof document === 'undefined' || document.visibilityState === 'visible') void nudge()
  }

  function start() {
    if (started) return
    started = true
    if (typeof window !== 'undefined') {
      window.addEventListener('online', onOnline)
      window.addEventListener('offline', onOffline)
      window.addEventListener('pageshow', onVisible)
      document.addEventListener('visibilitychange', onVisible)
    }
    void nudge()
  }

  function stop() {
    started = false
    clearTimeout(timer)
    timer = undefined
    if (typeof window !== 'undefined') {
      window.removeEventListener('online', onOnline)
      window.removeEventListener('offline', onOffline)
      window.removeEventListener('pageshow', onVisible)
      document.removeEventListener('visibilitychange', onVisible)
    }
  }

  return { flush, refresh, nudge, state, start, stop }
}

export type Syncer = ReturnType<typeof createSyncer>
