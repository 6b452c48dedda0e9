// Plain data shapes the client keeps in IndexedDB and exchanges with `POST /api/sync`.
// They mirror the server contract field for field so a row event is sent exactly as stored.

// The server's shapes are the contract: one definition in shared/, used on both sides.
import type { PieceDetail, SyncConflict } from '#shared/types/knit'

export type { PieceDetail, SyncConflict }

export type StepKind = 'advance' | 'back' | 'jump'

/** One tap at the machine. `id` is made on the device, so a replayed batch is harmless. */
export interface RowEvent {
  id: string
  pieceId: number
  kind: StepKind
  /** Completed rows before and after the step. */
  from: number
  to: number
  /** The piece version this step builds on (see `nextVersion` in progress.ts). */
  version: number
  /** ISO device time. */
  at: string
}

/** A queued event; `seq` is auto-incremented so the outbox drains in device order. */
export interface OutboxEntry extends RowEvent {
  seq?: number
}

export interface CachedPiece extends PieceDetail {
  savedAt: string
}

export interface LocalProgress {
  pieceId: number
  /** The device's place: what the knit view shows. */
  completedRows: number
  /** The last place and version the server reported. */
  serverRows: number
  serverVersion: number
  /**
   * The version the next live step builds on: the server's version plus one per step queued
   * since, as the server applies them in order. Kept rather than counted from the outbox,
   * because steps queued during a conflict will be logged as conflicts and move nothing.
   */
  nextVersion: number
  conflict: SyncConflict | null
  /** Id of the `jump` that resolves `conflict`, until the server confirms it. */
  resolvingWith: string | null
  updatedAt: string
}

export interface MetaEntry {
  key: string
  value: unknown
}

export interface SyncRequest {
  deviceId: string
  events: RowEvent[]
  pieceIds?: number[]
}

export interface SyncPieceAnswer {
  id: number
  completedRows: number
  version: number
  conflict: SyncConflict | null
}

export interface SyncResponse {
  accepted: string[]
  pieces: SyncPieceAnswer[]
  rejected?: { id: string; reason: string }[]
}
