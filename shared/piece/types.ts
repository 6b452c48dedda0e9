// A piece as the knitter follows it at the machine: the yarn slots and the sections of its
// timeline, frozen when the project is made, and the kinds of row event that move it.

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

/** Everything needed to compile and show one piece's rows; frozen when the project is made. */
export interface PieceTimeline {
  technique: 'together' | 'colour-by-colour'
  passesPerColour: number
  needles: number
  sections: PieceSection[]
  yarns: SlotYarn[]
}

export const rowEventKinds = ['advance', 'back', 'jump'] as const
export type RowEventKind = typeof rowEventKinds[number]
export type RowEventOutcome = 'applied' | 'conflict' | 'rejected'
