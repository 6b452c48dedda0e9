// Projects, pieces and sync: the shapes the API answers with. Times are ISO strings (UTC)
// as they arrive in JSON. A piece's rows themselves are described in #shared/piece/types.

import type { PieceTimeline, SlotYarn } from '#shared/piece/types'

export const projectStatuses = ['planned', 'knitting', 'finished'] as const
export type ProjectStatus = typeof projectStatuses[number]

/** The yarn chosen for a slot, kept on the project (yarnId null when it is not from stock). */
export interface ProjectYarn extends SlotYarn { yarnId: number | null }

/** What the project keeps of how it was made, so later edits of a motif or plan never move a row. */
export interface ProjectPlanSnapshot {
  source: 'new-project-form' | 'demo' | 'fixture' | 'plan'
  motif: { id: number | null; name: string } | null
  /** The plan it was started from (source 'plan'), as it was named then. */
  plan?: { id: number; name: string }
  pieces: { name: string; timeline: PieceTimeline }[]
}

export interface ProjectSummary {
  id: number
  studioId: number
  name: string
  status: ProjectStatus
  knitter: { id: number; name: string }
  pieceCount: number
  piecesDone: number
  completedRows: number
  totalRows: number
  lastKnittedAt: string | null
  updatedAt: string
}

export interface ProjectPiece {
  id: number
  name: string
  position: number
  completedRows: number
  totalRows: number
  version: number
  lastKnittedAt: string | null
  finishedAt: string | null
}

export interface ProjectDetail extends ProjectSummary {
  machineId: number | null
  yarns: ProjectYarn[]
  notes: string
  startedAt: string | null
  finishedAt: string | null
  pieces: ProjectPiece[]
}

/** GET /api/pieces: the signed-in knitter's pieces, most recently knitted first. */
export interface KnitterPiece {
  id: number
  projectId: number
  projectName: string
  name: string
  position: number
  completedRows: number
  totalRows: number
  version: number
  lastKnittedAt: string | null
  finishedAt: string | null
}

/** GET /api/pieces/:id: a piece with everything the knit view needs to show it offline. */
export interface PieceDetail extends KnitterPiece {
  updatedAt: string
  timeline: PieceTimeline
  /** The next unfinished piece of the same project (after this one, else the first before it). */
  nextPieceId: number | null
}

export interface PieceProgress { completedRows: number; version: number; updatedAt: string }

/** Another device moved the piece on while this one built on an older place. */
export interface SyncConflict {
  /** The device whose step set the piece's current place. */
  deviceId: string | null
  /** The piece's current completed rows (the server's place). */
  theirs: number
  /** Where this device's conflicting step wanted to go. */
  ours: number
}

export interface SyncPieceState {
  id: number
  completedRows: number
  totalRows: number
  version: number
  updatedAt: string
  lastKnittedAt: string | null
  conflict: SyncConflict | null
}

export interface SyncAnswer {
  /** Stored (now or before): the device may drop these from its outbox. */
  accepted: string[]
  /** Not stored, with why (e.g. not your piece); the device should drop them too. */
  rejected: { id: string; reason: string }[]
  pieces: SyncPieceState[]
}
