import { Op, UniqueConstraintError, type CreationAttributes, type Transaction } from 'sequelize'
import type { SyncAnswer, SyncPieceState } from '../../shared/types/knit'
import type { RowEventInput, SyncBody } from '../../shared/validation/knit'
import { Piece, Project, RowEvent } from '../db/models'

// POST /api/sync: a device's row events, applied in order, each exactly once.
//
// An event moves a piece only when it builds on the piece's current version; otherwise it is
// kept in the log as a 'conflict' and the piece stays where it is. Once a device is in
// conflict on a piece, only a 'jump' (the knitter's choice of place) on the current version
// moves it again: the device's other offline steps were built on a place that lost, and
// their version numbers can coincide with the server's without meaning the same rows.

type Outcome = 'applied' | 'conflict' | 'replay' | 'foreign'

interface KnittablePiece { id: number; projectId: number; totalRows: number }

/** Of `ids`, the pieces this person knits (their own project, in a studio they belong to). */
async function knittablePieces(userId: number, ids: number[]): Promise<Map<number, KnittablePiece>> {
  if (!ids.length) return new Map()
  const studios = [...(await rolesByStudio(userId)).keys()]
  const rows = await Piece.findAll({
    where: { id: ids },
    attributes: ['id', 'projectId', 'totalRows'],
    include: [{ model: Project, as: 'project', attributes: [], where: { knitterId: userId, studioId: studios } }],
  })
  return new Map(rows.map(p => [p.id, { id: p.id, projectId: p.projectId, totalRows: p.totalRows }]))
}

export async function syncDevice(userId: number, body: SyncBody): Promise<SyncAnswer> {
  const { deviceId, events } = body
  const pieces = await knittablePieces(userId, [...new Set([...events.map(e => e.pieceId), ...(body.pieceIds ?? [])])])
  // Bounds are checked for the whole batch before anything is stored.
  events.forEach((e, i) => {
    const piece = pieces.get(e.pieceId)
    if (!piece) return
    for (const key of ['from', 'to'] as const) {
      if (e[key] > piece.totalRows) throw fieldError(`events.${i}.${key}`, `must be at most ${piece.totalRows} (the rows of piece ${piece.id})`)
    }
  })
  const answer: SyncAnswer = { accepted: [], rejected: [], pieces: [] }
  const touched = new Set<number>()
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
    const outcomes = await storeRowEvents(userId, deviceId, piece, run)
    run.forEach((e, k) => {
      if (outcomes[k] === 'foreign') answer.rejected.push({ id: e.id, reason: 'this event id belongs to another event' })
      else answer.accepted.push(e.id)
    })
    touched.add(piece.id)
  }
  for (const id of body.pieceIds ?? []) if (pieces.has(id)) touched.add(id)
  for (const id of touched) answer.pieces.push(await pieceState(id, deviceId))
  return answer
}

/**
 * A run of one piece's events in one transaction: the project, then the piece, locked (always
 * in that order), then each event decided in device order exactly as if it came alone.
 */
async function storeRowEvents(userId: number, deviceId: string, target: KnittablePiece, events: RowEventInput[]): Promise<Outcome[]> {
  try {
    let justFinished = false
    const outcomes = await useDb().transaction(async (transaction) => {
      // Locking the project first serialises every step of its pieces, so the reads below see
      // the latest committed state (finishing the last piece is seen by exactly one step).
      const project = await Project.findByPk(target.projectId, { lock: transaction.LOCK.UPDATE, transaction, attributes: ['id', 'status', 'startedAt', 'finishedAt'] })
      const piece = await Piece.findByPk(target.id, { lock: transaction.LOCK.UPDATE, transaction, attributes: { exclude: ['timeline'] } })
      const known = new Map((await RowEvent.findAll({ where: { id: events.map(e => e.id) }, transaction })).map(r => [r.id, r]))
      const previous = await RowEvent.findOne({ where: { pieceId: piece!.id, deviceId }, order: [['seq', 'DESC']], attributes: ['outcome'], transaction })
      let lastOutcome = previous?.outcome
      let moved: { to: number; at: Date } | null = null
      const rows: CreationAttributes<RowEvent>[] = []
      const seen = new Set<string>()
      const outcomes = events.map((e): Outcome => {
        const existing = known.get(e.id)
        if (existing) return sameEvent(existing, userId, e) ? 'replay' : 'foreign'
        if (seen.has(e.id)) return 'replay' // the same new event twice in one batch
        seen.add(e.id)
        const applies = e.version === piece!.version && (lastOutcome !== 'conflict' || e.kind === 'jump')
        const now = new Date()
        rows.push({
          id: e.id, pieceId: piece!.id, userId, deviceId, kind: e.kind, fromRows: e.from, toRows: e.to, version: e.version,
          at: new Date(e.at), receivedAt: now, outcome: applies ? 'applied' : 'conflict',
        })
        lastOutcome = applies ? 'applied' : 'conflict'
        if (!applies) return 'conflict'
        piece!.version += 1
        moved = { to: e.to, at: now }
        return 'applied'
      })
      if (rows.length) await RowEvent.bulkCreate(rows, { transaction })
      const last = moved as { to: number; at: Date } | null
      if (last) justFinished = await movePiece(project!, piece!, last.to, deviceId, last.at, transaction)
      return outcomes
    })
    // After the commit, so a mail never announces a finish that was rolled back.
    if (justFinished) await mailProjectFinished(target.projectId)
    return outcomes
  }
  catch (error) {
    // Two requests carrying the same new event: the second insert loses on the primary key.
    // Decide that run again one event at a time, now that the other request's rows are visible.
    if (!(error instanceof UniqueConstraintError) || events.length === 1) {
      if (!(error instanceof UniqueConstraintError)) throw error
      const existing = await RowEvent.findByPk(events[0]!.id)
      return [existing && sameEvent(existing, userId, events[0]!) ? 'replay' : 'foreign']
    }
    const outcomes: Outcome[] = []
    for (const e of events) outcomes.push(...await storeRowEvents(userId, deviceId, target, [e]))
    return outcomes
  }
}

function sameEvent(stored: RowEvent, userId: number, e: RowEventInput) {
  return stored.userId === userId && stored.pieceId === e.pieceId
}

/**
 * The piece's new place (its version was already counted up per applied event), and the project's
 * status. True when this step finished the project.
 */
async function movePiece(project: Project, piece: Piece, to: number, deviceId: string, now: Date, transaction: Transaction): Promise<boolean> {
  const done = to >= piece.totalRows
  piece.completedRows = to
  piece.lastDeviceId = deviceId
  piece.lastKnittedAt = now
  piece.finishedAt = done ? (piece.finishedAt ?? now) : null
  await piece.save({ transaction })

  if (project.status === 'planned') {
    project.status = 'knitting'
    project.startedAt = now
  }
  const othersOpen = done
    ? await Piece.count({ where: { projectId: project.id, id: { [Op.ne]: piece.id }, finishedAt: null }, transaction })
    : 1
  let finished = false
  if (othersOpen === 0 && project.status !== 'finished') {
    project.status = 'finished'
    project.finishedAt = now
    finished = true
  }
  else if (othersOpen > 0 && project.status === 'finished') {
    // A finished piece was taken back (unravelled rows): the project is being knitted again.
    project.status = 'knitting'
    project.finishedAt = null
  }
  if (project.changed()) await project.save({ transaction })
  return finished
}

/** The piece's authoritative place, and whether this device's latest step on it is a standing conflict. */
async function pieceState(pieceId: number, deviceId: string): Promise<SyncPieceState> {
  const piece = (await Piece.findByPk(pieceId, { attributes: { exclude: ['timeline'] } }))!
  const latest = await RowEvent.findOne({ where: { pieceId, deviceId }, order: [['seq', 'DESC']], attributes: ['outcome', 'toRows'] })
  return {
    id: piece.id,
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
