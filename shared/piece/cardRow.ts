// Which punch card row belongs at the reader, row by row, in a motif section.
//
// Model (declared; common practice, the machine's manual has the last word):
// - The card for a section is its chart on a card (punchCard): whole chart repeats covering the
//   machine's shortest card, `loopRows` rows, going round as a loop. Card row k (0-based)
//   carries chart row k mod chart height, so any card row carrying the right chart row works;
//   the knitter locks the card at the start of each stretch of the section (the start of the
//   section; in a shaped piece also where the other side of the neck starts) at the first card
//   row carrying the chart row knitted there, and it moves on one row a row (both yarns in one
//   pass). At a section's start that is card row 1.
// - A reader that reads `readerOffset` rows ahead holds, while row k is knitted, card row
//   k + readerOffset (round the loop): that is the row to see at the reader, and the row to
//   lock the card at before the stretch's first row.

import type { CompiledPlan } from '#shared/engine'
import type { PieceTimeline, TimelineCard } from '#shared/piece/types'

export interface CardRowAt {
  /** 1-based card row being knitted, and the card row that should be at the reader now. */
  knitting: number
  atReader: number
  /** Rows in the card's loop. */
  loopRows: number
  /** On a stretch's first row: lock the card with this row at the reader before knitting it. */
  lockRow: number | null
}

/** The card's loop for a chart of `chartWidth` × `chartHeight`, or null when the repeat does not go into the card's width. */
export function cardLoopRows(card: NonNullable<PieceTimeline['card']>, chartWidth: number, chartHeight: number): number | null {
  if (chartWidth < 1 || chartHeight < 1 || card.width % chartWidth !== 0) return null
  return Math.ceil(card.minRows / chartHeight) * chartHeight
}

/** The card row at machine row `index` (0-based) of a compiled timeline; null on a plain row or without a card. */
export function cardRowAt(timeline: PieceTimeline, compiled: CompiledPlan, index: number): CardRowAt | null {
  const card = timeline.card
  const row = compiled.rows[index]
  if (!card || !row || row.chartRow === null) return null
  const section = timeline.sections[row.section]
  if (section?.kind !== 'motif') return null
  const loopRows = cardLoopRows(card, Array.from(section.chart[0] ?? '').length, section.chart.length)
  if (loopRows === null) return null
  // The stretch began rowInSection rows back, on the card row carrying its first chart row.
  const startChartRow = compiled.rows[index - row.rowInSection]?.chartRow ?? 0
  const knitting = (startChartRow + row.rowInSection) % loopRows
  const atReader = (knitting + card.readerOffset) % loopRows
  return { knitting: knitting + 1, atReader: atReader + 1, loopRows, lockRow: row.rowInSection === 0 ? atReader + 1 : null }
}

/**
 * What a timeline keeps of a machine's card: nothing for a machine without one, or when the
 * colours are fed one by one (the card row would not move on one row a row).
 */
export function timelineCard(
  machine: { patterningWidth: number; card: { minRows: number; readerOffset: number } | null } | null | undefined,
  technique: PieceTimeline['technique'],
): TimelineCard | undefined {
  if (!machine?.card || technique !== 'together') return undefined
  return { width: machine.patterningWidth, minRows: machine.card.minRows, readerOffset: machine.card.readerOffset }
}
