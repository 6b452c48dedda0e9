// The rule that moves a piece by one row event: the server's sync applies it, and the tests'
// stand-in server applies the very same function.
//
// An event moves the piece only when it builds on the piece's current version and, unless it
// is a jump, starts from the piece's place at that version. Once a device is in conflict on a
// piece (its latest event there was a conflict), only a jump (the knitter's choice of place)
// moves it again: its other offline steps were built on a place that lost. Anything else is
// kept in the log as a conflict and the piece stays where it is.

import type { RowEventKind } from './types'

/** Where a piece stands: its completed rows and how many events have moved it. */
export interface PiecePlace { completedRows: number; version: number }

export interface RowEventStep { kind: RowEventKind; from: number; to: number; version: number }

export function applyRowEvent(place: PiecePlace, event: RowEventStep, deviceInConflict: boolean): { outcome: 'applied' | 'conflict'; place: PiecePlace } {
  // A jump's `from` is the device's own place (the knitter's choice may leave it); a step's
  // must be the place its version stands for, or it was taken from a row the piece is not at.
  const buildsOnPlace = event.kind === 'jump' || event.from === place.completedRows
  const applies = event.version === place.version && buildsOnPlace && (!deviceInConflict || event.kind === 'jump')
  if (!applies) return { outcome: 'conflict', place }
  return { outcome: 'applied', place: { completedRows: event.to, version: place.version + 1 } }
}
