import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import type { ProjectStatus } from '#shared/types/knit'
import type { RowEventKind, RowEventOutcome } from '#shared/piece/types'

// The SQL of POST /api/sync. The route runs for every tap on every tablet, so it skips model
// instances: plain parameterised statements, one round trip each, inside the caller's transaction.

export interface KnittablePiece { id: number; projectId: number; totalRows: number }

export interface LockedPiece {
  totalRows: number
  completedRows: number
  version: number
  lastDeviceId: string | null
  lastKnittedAt: Date | null
  finishedAt: Date | null
  updatedAt: Date
}

export interface NewRowEvent {
  id: string
  pieceId: number
  userId: number
  deviceId: string
  kind: RowEventKind
  fromRows: number
  toRows: number
  version: number
  at: Date
  receivedAt: Date
  outcome: RowEventOutcome
}

/** Who sent a stored event, to tell a replay from an id reused for another piece. */
export interface StoredEventOwner { id: string; userId: number; pieceId: number }

export interface LatestOfDevice { outcome: RowEventOutcome; toRows: number }

const select = <T extends object>(db: Sequelize, sql: string, replacements: unknown[], transaction?: Transaction) =>
  db.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction })

/** Of `ids`, the pieces this person knits: their own project, in a studio they belong to. */
export function knittablePieces(db: Sequelize, userId: number, ids: number[]) {
  return select<KnittablePiece>(db, `
    SELECT p.id, p.project_id AS projectId, p.total_rows AS totalRows
    FROM pieces p
    JOIN projects pr ON pr.id = p.project_id AND pr.knitter_id = ?
    JOIN memberships m ON m.studio_id = pr.studio_id AND m.user_id = ?
    WHERE p.id IN (?)`, [userId, userId, ids])
}

export async function lockProjectStatus(db: Sequelize, projectId: number, transaction: Transaction) {
  const [row] = await select<{ status: ProjectStatus }>(db, 'SELECT status FROM projects WHERE id = ? FOR UPDATE', [projectId], transaction)
  return row?.status
}

export async function lockPiece(db: Sequelize, pieceId: number, transaction: Transaction) {
  const [row] = await select<LockedPiece>(db, `
    SELECT total_rows AS totalRows, completed_rows AS completedRows, version, last_device_id AS lastDeviceId,
      last_knitted_at AS lastKnittedAt, finished_at AS finishedAt, updated_at AS updatedAt
    FROM pieces WHERE id = ? FOR UPDATE`, [pieceId], transaction)
  return row
}

/**
 * In one round trip: which of `ids` are stored already (and whose they are), and this device's
 * latest event on the piece.
 */
export async function storedAndLatest(db: Sequelize, ids: string[], pieceId: number, deviceId: string, transaction?: Transaction) {
  const rows = await select<{ id: string | null; userId: number | null; pieceId: number | null; outcome: RowEventOutcome | null; toRows: number | null }>(db, `
    SELECT id, user_id AS userId, piece_id AS pieceId, NULL AS outcome, NULL AS toRows FROM row_events WHERE id IN (?)
    UNION ALL
    (SELECT NULL, NULL, NULL, outcome, to_rows FROM row_events WHERE piece_id = ? AND device_id = ? ORDER BY seq DESC LIMIT 1)`,
  [ids.length ? ids : [''], pieceId, deviceId], transaction)
  const stored = new Map<string, StoredEventOwner>()
  let latest: LatestOfDevice | undefined
  for (const r of rows) {
    if (r.id !== null) stored.set(r.id, { id: r.id, userId: r.userId!, pieceId: r.pieceId! })
    else latest = { outcome: r.outcome!, toRows: r.toRows! }
  }
  return { stored, latest }
}

export async function insertRowEvents(db: Sequelize, rows: NewRowEvent[], transaction: Transaction) {
  if (!rows.length) return
  await db.query(
    `INSERT INTO row_events (id, piece_id, user_id, device_id, kind, from_rows, to_rows, version, at, received_at, outcome) VALUES ${rows.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)').join(', ')}`,
    {
      replacements: rows.flatMap(r => [r.id, r.pieceId, r.userId, r.deviceId, r.kind, r.fromRows, r.toRows, r.version, r.at, r.receivedAt, r.outcome]),
      type: QueryTypes.INSERT,
      transaction,
    },
  )
}

export async function updatePiecePlace(db: Sequelize, pieceId: number, piece: LockedPiece, transaction: Transaction) {
  await db.query('UPDATE pieces SET completed_rows = ?, version = ?, last_device_id = ?, last_knitted_at = ?, finished_at = ?, updated_at = ? WHERE id = ?', {
    replacements: [piece.completedRows, piece.version, piece.lastDeviceId, piece.lastKnittedAt, piece.finishedAt, piece.updatedAt, pieceId],
    type: QueryTypes.UPDATE,
    transaction,
  })
}

export async function countOtherOpenPieces(db: Sequelize, projectId: number, pieceId: number, transaction: Transaction) {
  const [row] = await select<{ n: number }>(
    db,
    'SELECT COUNT(*) AS n FROM pieces WHERE project_id = ? AND id <> ? AND finished_at IS NULL',
    [projectId, pieceId],
    transaction,
  )
  return Number(row?.n ?? 0)
}

/** Only the columns given change (and `updated_at`). */
export async function updateProject(
  db: Sequelize,
  projectId: number,
  change: { status: ProjectStatus; startedAt?: Date; finishedAt?: Date | null },
  now: Date,
  transaction: Transaction,
) {
  const columns: [string, unknown][] = [
    ['status', change.status],
    ['updated_at', now],
  ]
  if (change.startedAt !== undefined) columns.push(['started_at', change.startedAt])
  if (change.finishedAt !== undefined) columns.push(['finished_at', change.finishedAt])
  await db.query(`UPDATE projects SET ${columns.map(([c]) => `${c} = ?`).join(', ')} WHERE id = ?`, {
    replacements: [...columns.map(([, v]) => v), projectId],
    type: QueryTypes.UPDATE,
    transaction,
  })
}

/** Pieces and this device's latest event on each, for pieces asked about without events. */
export function pieceStates(db: Sequelize, ids: number[], deviceId: string) {
  return select<LockedPiece & { id: number; latestOutcome: RowEventOutcome | null; latestToRows: number | null }>(db, `
    SELECT p.id, p.total_rows AS totalRows, p.completed_rows AS completedRows, p.version, p.last_device_id AS lastDeviceId,
      p.last_knitted_at AS lastKnittedAt, p.finished_at AS finishedAt, p.updated_at AS updatedAt,
      e.outcome AS latestOutcome, e.to_rows AS latestToRows
    FROM pieces p
    LEFT JOIN row_events e ON e.seq = (SELECT MAX(seq) FROM row_events WHERE piece_id = p.id AND device_id = ?)
    WHERE p.id IN (?)`, [deviceId, ids])
}
