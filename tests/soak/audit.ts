import { QueryTypes, type Sequelize } from 'sequelize'
import type { RowEvent } from '../../offline'

// The end-of-soak check against the server's log and pieces table.

export interface Audit {
  recorded: number
  stored: number
  /** Stored rows no device recorded, or recorded once and stored as something else. */
  duplicates: number
  /** Recorded events missing from the log. */
  lost: number
  /** Pieces whose completedRows or version differ from a replay of their applied events. */
  piecesOff: number
  conflicts: number
}

interface StoredRow { id: string; piece_id: number; device_id: string; kind: string; from_rows: number; to_rows: number; version: number; outcome: string }

export async function auditSoak(db: Sequelize, journals: { deviceId: string; events: RowEvent[] }[], pieceIds: number[]): Promise<Audit> {
  const rows = await db.query<StoredRow>(
    'SELECT id, piece_id, device_id, kind, from_rows, to_rows, version, outcome FROM row_events WHERE piece_id IN (:pieceIds) ORDER BY seq',
    { replacements: { pieceIds }, type: QueryTypes.SELECT },
  )
  const recorded = new Map<string, RowEvent & { deviceId: string }>()
  for (const j of journals) for (const e of j.events) recorded.set(e.id, { ...e, deviceId: j.deviceId })
  let duplicates = 0
  const seen = new Set<string>()
  for (const r of rows) {
    const e = recorded.get(r.id)
    const same = e && !seen.has(r.id) && e.deviceId === r.device_id && e.pieceId === r.piece_id && e.kind === r.kind
      && e.from === r.from_rows && e.to === r.to_rows && e.version === r.version
    if (!same) duplicates += 1
    seen.add(r.id)
  }
  const lost = [...recorded.keys()].filter(id => !seen.has(id)).length

  // Replaying a piece's log: applied events build on versions 0, 1, 2, … in arrival order,
  // and the last one's `to` is the piece's place.
  const pieces = await db.query<{ id: number; completed_rows: number; version: number }>(
    'SELECT id, completed_rows, version FROM pieces WHERE id IN (:pieceIds)', { replacements: { pieceIds }, type: QueryTypes.SELECT },
  )
  let piecesOff = 0
  for (const p of pieces) {
    const applied = rows.filter(r => r.piece_id === p.id && r.outcome === 'applied')
    const chained = applied.every((r, i) => r.version === i)
    const place = applied.length ? applied[applied.length - 1]!.to_rows : 0
    if (!chained || p.version !== applied.length || p.completed_rows !== place) piecesOff += 1
  }
  return { recorded: recorded.size, stored: rows.length, duplicates, lost, piecesOff, conflicts: rows.filter(r => r.outcome === 'conflict').length }
}
