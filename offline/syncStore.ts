import { readMeta, writeMeta, type FloatwiseDb } from './db'
import type { LocalProgress, OutboxEntry, SyncResponse } from './types'

export type SyncStatus = 'synced' | 'offline' | 'pending' | 'conflict'

/**
 * Why the last attempt failed. 'network' (no answer) and 'server' (5xx, malformed answer)
 * are retried with backoff; 'bad-request' (a 4xx: a bug in the batch) is kept and retried
 * slowly; 'signed-out' (401) waits for the knitter; 'storage' is IndexedDB failing.
 */
export interface SyncFailure {
  kind: 'network' | 'server' | 'bad-request' | 'signed-out' | 'storage'
  status?: number
  message: string
  at: string
  /** How long the server asked us to wait (its Retry-After), in ms. */
  retryAfterMs?: number
}

export interface SyncState {
  status: SyncStatus
  /** Events on this device not yet accepted by the server. */
  pending: number
  /** Pieces whose conflict waits for the knitter's choice. */
  conflicts: number
  lastError: SyncFailure | null
  lastSyncAt: string | null
  /** Milliseconds until the next automatic attempt after a failure, else null. */
  retryInMs: number | null
}

/** A conflict the knitter has not answered yet; its piece's events are held back. */
export function isUnresolved(progress: LocalProgress) {
  return progress.conflict !== null && progress.resolvingWith === null
}

export async function heldPieceIds(db: FloatwiseDb): Promise<Set<number>> {
  const rows = await db.progress.filter(isUnresolved).toArray()
  return new Set(rows.map(p => p.pieceId))
}

/** Queued events the syncer may send now (those of held pieces wait). */
export async function countSendable(db: FloatwiseDb): Promise<number> {
  const held = await heldPieceIds(db)
  return db.outbox.filter(e => !held.has(e.pieceId)).count()
}

/**
 * Applies one answer of `POST /api/sync` in one transaction: accepted and rejected events
 * leave the outbox, and each answered piece takes the server's place unless this device is
 * ahead (events still queued) or has an open conflict (the knitter chooses; no silent overwrite).
 */
export async function applySyncAnswer(db: FloatwiseDb, answer: SyncResponse, at: string, sent: OutboxEntry[] = []): Promise<void> {
  const done = [...answer.accepted, ...(answer.rejected ?? []).map(r => r.id)]
  // Deleting by primary key is far cheaper than an `anyOf` walk over the id index.
  const seqById = new Map(sent.map(e => [e.id, e.seq!]))
  const bySeq = done.flatMap(id => seqById.has(id) ? [seqById.get(id)!] : [])
  const byId = done.filter(id => !seqById.has(id))
  await db.transaction('rw', db.progress, db.outbox, db.meta, async () => {
    if (bySeq.length) await db.outbox.bulkDelete(bySeq)
    if (byId.length) await db.outbox.where('id').anyOf(byId).delete()
    for (const piece of answer.pieces) {
      const current = await db.progress.get(piece.id)
      // Answers to concurrent requests can land out of order; an older one never wins.
      if (current && piece.version < current.serverVersion) continue
      const queued = await db.outbox.where('pieceId').equals(piece.id).count()
      let conflict = current?.conflict ?? null
      let resolvingWith = current?.resolvingWith ?? null
      const choiceQueued = resolvingWith !== null && await db.outbox.where('id').equals(resolvingWith).count() > 0
      if (piece.conflict) {
        conflict = piece.conflict
        // Still reported while the knitter's jump is on its way (held steps went first);
        // reported after the jump landed, it is a new conflict: the other device moved again.
        if (!choiceQueued) resolvingWith = null
      }
      else if (resolvingWith !== null && !choiceQueued) {
        conflict = null
        resolvingWith = null
      }
      const unresolved = conflict !== null && resolvingWith === null
      // Local place and the version chain are kept while this device is ahead (events queued)
      // or a conflict is open (the knitter chooses: no silent overwrite either way).
      const keepLocal = current !== undefined && (conflict !== null || queued > 0)
      const resetChain = current === undefined || queued === 0 || unresolved
      await db.progress.put({
        pieceId: piece.id,
        completedRows: keepLocal ? current.completedRows : piece.completedRows,
        serverRows: piece.completedRows,
        serverVersion: piece.version,
        nextVersion: resetChain ? piece.version : current.nextVersion,
        conflict,
        resolvingWith,
        updatedAt: at,
      })
    }
    if (answer.rejected?.length) await writeMeta(db, 'lastRejected', { at, rejected: answer.rejected })
    await writeMeta(db, 'lastSyncAt', at)
  })
}

export async function readSyncState(db: FloatwiseDb, online: boolean | undefined, retryInMs: number | null): Promise<SyncState> {
  return db.transaction('r', db.progress, db.outbox, db.meta, async () => {
    const pending = await db.outbox.count()
    const conflicts = await db.progress.filter(isUnresolved).count()
    const lastError = (await readMeta<SyncFailure>(db, 'lastError')) ?? null
    const lastSyncAt = (await readMeta<string>(db, 'lastSyncAt')) ?? null
    // The rule, in order: an open conflict needs the knitter most; then no network; then work queued.
    const status: SyncStatus = conflicts > 0
      ? 'conflict'
      : lastError?.kind === 'network' || online === false
        ? 'offline'
        : pending > 0 ? 'pending' : 'synced'
    return { status, pending, conflicts, lastError, lastSyncAt, retryInMs }
  })
}
