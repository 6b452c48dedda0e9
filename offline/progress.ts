import { plainData, type FloatwiseDb } from './db'
import { isUnresolved } from './syncStore'
import type { CachedPiece, LocalProgress, PieceDetail, RowEvent, StepKind } from './types'

/** A step the knit view must not record; the message is written for the knitter. */
export class StepError extends Error {
  override name = 'StepError'
}

export interface StepInput {
  kind: StepKind
  to: number
  totalRows: number
}

/** Injectable clock and id source, so tests can pin times and ids. */
export interface ClientClock {
  now?: () => Date
  newId?: () => string
}

function stamp(clock: ClientClock) {
  return { at: (clock.now?.() ?? new Date()).toISOString(), id: clock.newId?.() ?? crypto.randomUUID() }
}

function checkStep(step: StepInput, from: number) {
  const { kind, to, totalRows } = step
  if (kind !== 'advance' && kind !== 'back' && kind !== 'jump') throw new StepError(`Unknown step "${String(kind)}".`)
  if (!Number.isInteger(totalRows) || totalRows < 0) throw new StepError(`This piece has no valid row count (${totalRows}).`)
  if (!Number.isInteger(to) || to < 0 || to > totalRows) throw new StepError(`Row ${to} is outside this piece (0 to ${totalRows} rows).`)
  if (kind === 'advance' && to <= from) throw new StepError(`Advancing must move forward from row ${from}, not to ${to}.`)
  if (kind === 'back' && to >= from) throw new StepError(`Going back must move below row ${from}, not to ${to}.`)
}

/**
 * The version a new step builds on. While a conflict waits for the knitter, the server takes
 * no step of this device on the piece except the knitter's jump, so a held step simply names
 * the server's version it saw; otherwise steps chain on the ones queued before them.
 */
function versionFor(current: LocalProgress) {
  return isUnresolved(current)
    ? { version: current.serverVersion, nextVersion: current.nextVersion }
    : { version: current.nextVersion, nextVersion: current.nextVersion + 1 }
}

/**
 * Writes the event to the outbox and the new local place in ONE transaction, so when this
 * resolves both are durable (the screen confirms only then) and a crash leaves neither.
 */
export async function recordStep(
  db: FloatwiseDb,
  pieceId: number,
  step: StepInput,
  clock: ClientClock = {},
): Promise<{ event: RowEvent; progress: LocalProgress }> {
  const input = plainData(step)
  return db.transaction('rw', db.progress, db.outbox, async () => {
    const current = await db.progress.get(pieceId)
    if (!current) throw new StepError(`Piece ${pieceId} is not on this device yet: open it once while online.`)
    checkStep(input, current.completedRows)
    const { id, at } = stamp(clock)
    const { version, nextVersion } = versionFor(current)
    const event: RowEvent = { id, pieceId, kind: input.kind, from: current.completedRows, to: input.to, version, at }
    await db.outbox.add({ ...event })
    const progress: LocalProgress = { ...current, completedRows: input.to, nextVersion, updatedAt: at }
    await db.progress.put(progress)
    return { event, progress }
  })
}

/**
 * The knitter's answer to a conflict: a `jump` to the chosen row. 'ours' is the device's
 * current place (it may have moved on since the conflict was seen), 'theirs' the server's.
 * The conflict stays (with `resolvingWith`) until the server confirms, so the choice shows
 * as pending rather than settled while offline.
 */
export async function resolveConflict(
  db: FloatwiseDb,
  pieceId: number,
  keep: 'ours' | 'theirs',
  clock: ClientClock = {},
): Promise<{ event: RowEvent; progress: LocalProgress }> {
  return db.transaction('rw', db.progress, db.outbox, async () => {
    const current = await db.progress.get(pieceId)
    if (!current?.conflict) throw new StepError(`Piece ${pieceId} has no conflict to resolve.`)
    const to = keep === 'ours' ? current.completedRows : current.conflict.theirs
    const { id, at } = stamp(clock)
    // Built on the server's current version; steps held during the conflict go first and are
    // logged as conflicts, so they do not count. A second choice before the server confirmed
    // the first chains on it like any step.
    const version = isUnresolved(current) ? current.serverVersion : current.nextVersion
    const event: RowEvent = { id, pieceId, kind: 'jump', from: current.completedRows, to, version, at }
    await db.outbox.add({ ...event })
    const progress: LocalProgress = { ...current, completedRows: to, nextVersion: version + 1, resolvingWith: id, updatedAt: at }
    await db.progress.put(progress)
    return { event, progress }
  })
}

/**
 * Caches a fetched piece and seeds progress from it. Unsynced local progress (events still
 * queued, or an open conflict) is never overwritten, and an older answer never wins.
 */
export async function savePiece(db: FloatwiseDb, detail: PieceDetail, clock: ClientClock = {}): Promise<LocalProgress> {
  const piece: CachedPiece = { ...plainData(detail), savedAt: stamp(clock).at }
  return db.transaction('rw', db.pieces, db.progress, db.outbox, async () => {
    await db.pieces.put(piece)
    const current = await db.progress.get(piece.id)
    const queued = await db.outbox.where('pieceId').equals(piece.id).count()
    const fromServer = { serverRows: piece.completedRows, serverVersion: piece.version, nextVersion: piece.version, updatedAt: piece.savedAt }
    let progress: LocalProgress
    if (!current) progress = { pieceId: piece.id, completedRows: piece.completedRows, conflict: null, resolvingWith: null, ...fromServer }
    else if (queued === 0 && piece.version >= current.serverVersion) {
      progress = { ...current, ...fromServer, completedRows: current.conflict ? current.completedRows : piece.completedRows }
    }
    else return current
    await db.progress.put(progress)
    return progress
  })
}

export interface PieceState {
  piece: CachedPiece | undefined
  progress: LocalProgress | undefined
  /** Events of this piece not yet accepted by the server. */
  pending: number
}

export async function readPieceState(db: FloatwiseDb, pieceId: number): Promise<PieceState> {
  return db.transaction('r', db.pieces, db.progress, db.outbox, async () => ({
    piece: await db.pieces.get(pieceId),
    progress: await db.progress.get(pieceId),
    pending: await db.outbox.where('pieceId').equals(pieceId).count(),
  }))
}
