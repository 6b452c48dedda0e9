// A piece as the knitter follows it at the machine: the yarn slots and the sections of its
// timeline, frozen when the project is made, and the kinds of row event that move it.

import type { ShapedRow } from '#shared/engine'

/** A yarn slot letter: 'A' is the main colour, then 'B', 'C' … */
export type YarnSlot = string

/** Each slot is shown with a symbol as well as its colour (never colour alone), in slot order. */
export const slotSymbols = ['●', '▲', '■', '◆', '★', '✚'] as const

export interface SlotYarn { slot: YarnSlot; name: string; hex: string; symbol: string }

export type PieceSection
  = | { kind: 'plain'; label: string; rows: number; yarn: YarnSlot; note?: string }
    | {
      kind: 'motif'
      label: string
      motifName: string
      /** chartToRows format ('.' main, 'x' contrast); rows[0] is the first row knitted. */
      chart: string[]
      chartRows: number
      main: YarnSlot
      contrast: YarnSlot
      note?: string
    }

/**
 * A shaped piece as frozen in a timeline: the engine's rows (shapePiece) for the size knitted.
 * With a shape, `needles` is the cast-on and the sections give the fabric rows from the cast-on
 * up; the machine rows follow `rows` (the left of the neck knits the same fabric rows again).
 */
export interface TimelineShape {
  /** The size knitted, as the plan names it. */
  size: string
  kind: 'body' | 'sleeve'
  castOn: number
  rows: ShapedRow[]
  /** Stitches left on the needles after the last row (a straight top). */
  leftOnNeedles: number
}

/**
 * The machine's punch card, frozen with the timeline when the machine patterns from one and
 * knits both yarns in one pass (one card row a row): what the knit view needs to say which card
 * row should be at the reader.
 */
export interface TimelineCard {
  /** Holes across (the machine's patterning width). */
  width: number
  /** The shortest loop; a card is whole chart repeats covering it (punchCard). */
  minRows: number
  /** Rows the reader reads ahead of the row being knitted. */
  readerOffset: number
}

/** Everything needed to compile and show one piece's rows; frozen when the project is made. */
export interface PieceTimeline {
  technique: 'together' | 'colour-by-colour'
  passesPerColour: number
  needles: number
  sections: PieceSection[]
  yarns: SlotYarn[]
  /** Absent for a rectangle (the needles stay `needles` on every row). */
  shape?: TimelineShape
  /** Absent when the machine has no card (or none was named). */
  card?: TimelineCard
}

export const rowEventKinds = ['advance', 'back', 'jump'] as const
export type RowEventKind = typeof rowEventKinds[number]
export type RowEventOutcome = 'applied' | 'conflict' | 'rejected'
