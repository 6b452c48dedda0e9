import { UniqueConstraintError, type Transaction } from 'sequelize'
import { applyRowEvent } from '#shared/piece/rowEvent'
import type { ProjectStatus, SyncAnswer, SyncPieceState } from '#shared/types/knit'
import type { RowEventInput, SyncBody } from '#shared/validation/sync'
import {
  countOtherOpenPieces, insertRowEvents, knittablePieces, lockPiece, lockProjectStatus, pieceStates, storedAndLatest,
  updatePiecePlace, updateProject, type KnittablePiece, type LatestOfDevice, type LockedPiece, type NewRowEvent, type StoredEventOwner,
} from '../db/syncQueries'

// POST /api/sync: a device's row events, applied in order, each exactly once.
//
// Whether an event moves the piece is applyRowEvent's rule (#shared/piece/rowEvent); an event
// that does not is kept in the log as a 'conflict' and the piece stays where it is. A refused
// step is logged, not sent back as rejected: the device drops rejected events, and this one is
// a tap the knitter made.

type Outcome = 'applied' | 'conflict' | 'replay' | 'foreign'

/** What a run of events leaves behind: their outcomes and the piece's state at the commit. */
interface RunResult { outcomes: Outcome[]; state: SyncPieceState }

export async function syncDevice(userId: number, body: SyncBody): Promise<SyncAnswer> {
  const { deviceId, events } = body
  const asked = [...new Set([...events.map(e => e.pieceId), ...(body.pieceIds ?? [])])]
  const pieces = new Map(asked.length ? (await knittablePieces(useDb(), userId, asked)).map(p => [p.id, p]) : [])
  // Bounds are checked for the whole batch before anything is stored.
  events.forEach((e, i) => {
    const piece = pieces.get(e.pieceId)
    if (!piece) return
    for (const key of ['from', 'to'] as const) {
      if (e[key] > piece.totalRows) throw fieldError(`events.${i}.${key}`, `must be at most ${piece.totalRows} (the rows of piece ${piece.id})`)
    }
  })
  const answer: SyncAnswer = { accepted: [], rejected: [], pieces: [] }
  // The state each piece was left in by its last run (the run held the piece's lock).
  const states = new Map<number, SyncPieceState>()
  // Consecutive events of one piece are stored in one transaction (a device drains its outbox
  // in order, so a batch is mostly runs of the same piece): one lock and one commit per run.
  for (let i = 0; i < events.length;) {
    const piece = pieces.get(events[i]!.pieceId)
    let j = i + 1
    while (j < events.length && events[j]!.pieceId === events[i]!.pieceId) j++
    const run = events.slice(i, j)
    i = j
    if (!piece) {
      for (const e of run) answer.rejected.push({ id: e.id, reason: 'not a piece you are knitting' })
      continue
    }
    const { outcomes, state } = await storeRowEvents(userId, deviceId, piece, run)
    run.forEach((e, k) => {
      if (outcomes[k] === 'foreign') answer.rejected.push({ id: e.id, reason: 'this event id belongs to another event' })
      else answer.accepted.push(e.id)
    })
    states.set(piece.id, state) // a later run of the same piece replaces it in place
  }
  const onlyAsked = (body.pieceIds ?? []).filter(id => pieces.has(id) && !states.has(id))
  if (onlyAsked.length) {
    const rows = new Map((await pieceStates(useDb(), onlyAsked, deviceId)).map(r => [r.id, r]))
    for (const id of onlyAsked) {
      const row = rows.get(id)
      if (row) states.set(id, pieceState(id, row, row.latestOutcome ? { outcome: row.latestOutcome, toRows: row.latestToRows! } : undefined))
    }
  }
  answer.pieces = [...states.values()]
  return answer
}

/**
 * A run of one piece's events in one transaction: the project, then the piece, locked (always
 * in that order), then each event decided in device order exactly as if it came alone.
 */
async function storeRowEvents(userId: number, deviceId: string, target: KnittablePiece, events: RowEventInput[]): Promise<RunResult> {
  const db = useDb()
  try {
    let justFinished = false
    const result = await db.transaction(async (transaction): Promise<RunResult> => {
      // Locking the project first serialises every step of its pieces, so the reads below see
      // the latest committed state (finishing the last piece is seen by exactly one step).
      const status = (await lockProjectStatus(db, target.projectId, transaction))!
      const piece = (await lockPiece(db, target.id, transaction))!
      const { stored, latest } = await storedAndLatest(db, events.map(e => e.id), target.id, deviceId, transaction)
      let last = latest
      let moved: { to: number; at: Date } | null = null
      let place = piece.completedRows
      const rows: NewRowEvent[] = []
      const seen = new Set<string>()
      const now = new Date()
      const outcomes = events.map((e): Outcome => {
        const existing = stored.get(e.id)
        if (existing) return sameEvent(existing, userId, e) ? 'replay' : 'foreign'
        if (seen.has(e.id)) return 'replay' // the same new event twice in one batch
        seen.add(e.id)
        const decision = applyRowEvent({ completedRows: place, version: piece.version }, e, last?.outcome === 'conflict')
        const outcome = decision.outcome
        rows.push({
          id: e.id, pieceId: target.id, userId, deviceId, kind: e.kind, fromRows: e.from, toRows: e.to, version: e.version,
          at: new Date(e.at), receivedAt: now, outcome,
        })
        last = { outcome, toRows: e.to }
        if (outcome === 'conflict') return 'conflict'
        piece.version = decision.place.version
        place = decision.place.completedRows
        moved = { to: e.to, at: now }
        return 'applied'
      })
      await insertRowEvents(db, rows, transaction)
      const step = moved as { to: number; at: Date } | null
      if (step) justFinished = await movePiece(target, status, piece, step.to, deviceId, step.at, transaction)
      return { outcomes, state: pieceState(target.id, piece, last) }
    })
    // After the commit, so a mail never announces a finish that was rolled back.
    if (justFinished) await mailProjectFinished(target.projectId)
    return result
  }
  catch (error) {
    if (!(error instanceof UniqueConstraintError)) throw error
    // Two requests carrying the same new event: the second insert loses on the primary key.
    // Decide that run again one event at a time, now that the other request's rows are visible.
    if (events.length === 1) {
      const { stored, latest } = await storedAndLatest(db, [events[0]!.id], target.id, deviceId)
      const existing = stored.get(events[0]!.id)
      const piece = (await pieceStates(db, [target.id], deviceId))[0]!
      return { outcomes: [existing && sameEvent(existing, userId, events[0]!) ? 'replay' : 'foreign'], state: pieceState(target.id, piece, latest) }
    }
    const outcomes: Outcome[] = []
    let state: SyncPieceState | undefined
    for (const e of events) {
      const one = await storeRowEvents(userId, deviceId, target, [e])
      outcomes.push(...one.outcomes)
      state = one.state
    }
    return { outcomes, state: state! }
  }
}

function sameEvent(stored: StoredEventOwner, userId: number, e: RowEventInput) {
  return stored.userId === userId && stored.pieceId === e.pieceId
}

/**
 * The piece's new place (its version was already counted up per applied event), and the project's
 * status. True when this step finished the project.
 */
async function movePiece(
  target: KnittablePiece,
  status: ProjectStatus,
  piece: LockedPiece,
  to: number,
  deviceId: string,
  now: Date,
  transaction: Transaction,
): Promise<boolean> {
  const db = useDb()
  const done = to >= piece.totalRows
  piece.completedRows = to
  piece.lastDeviceId = deviceId
  piece.lastKnittedAt = now
  piece.finishedAt = done ? (piece.finishedAt ?? now) : null
  piece.updatedAt = now
  await updatePiecePlace(db, target.id, piece, transaction)

  const change: Parameters<typeof updateProject>[2] = { status }
  if (status === 'planned') Object.assign(change, { status: 'knitting', startedAt: now })
  const othersOpen = done ? await countOtherOpenPieces(db, target.projectId, target.id, transaction) : 1
  let finished = false
  if (othersOpen === 0 && change.status !== 'finished') {
    Object.assign(change, { status: 'finished', finishedAt: now })
    finished = true
  }
  else if (othersOpen > 0 && change.status === 'finished') {
    // A finished piece was taken back (unravelled rows): the project is being knitted again.
    Object.assign(change, { status: 'knitting', finishedAt: null })
  }
  if (change.status !== status) await updateProject(db, target.projectId, change, now, transaction)
  return finished
}

/** The piece's authoritative place, and whether this device's latest step on it is a standing conflict. */
function pieceState(id: number, piece: LockedPiece, latest: LatestOfDevice | undefined): SyncPieceState {
  return {
    id,
    completedRows: piece.completedRows,
    totalRows: piece.totalRows,
    version: piece.version,
    updatedAt: piece.updatedAt.toISOString(),
    lastKnittedAt: piece.lastKnittedAt ? piece.lastKnittedAt.toISOString() : null,
    conflict: latest?.outcome === 'conflict'
      ? { deviceId: piece.lastDeviceId, theirs: piece.completedRows, ours: latest.toRows }
      : null,
  }
}
