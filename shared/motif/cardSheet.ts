// Where a punch card goes on paper, in millimetres: the card's outer size, each hole's centre,
// how a long card is split over sheets, and a 10 cm ruler to check the printer kept the scale.
//
// Sheet layout (one SVG per sheet, 1 unit = 1 mm): a label column each side for row numbers,
// then the card: `edgeMm` of card beyond the outer holes at each side and one row pitch beyond
// the first and last rows (the cut line). Card row 0 (the first row knitted) is at the bottom
// of the first sheet; a long card goes on upward, sheet after sheet, and where two sheets meet
// each shows the same join line so they can be laid edge to edge.

export type CardPaper = 'A4' | 'Letter'

/** Paper in mm (ISO 216 A4; US Letter is 8.5 × 11 in). */
export const PAPER_MM: Record<CardPaper, { width: number; height: number }> = {
  A4: { width: 210, height: 297 },
  Letter: { width: 215.9, height: 279.4 },
}

/** The page margin set with `@page`, in mm. */
export const SHEET_MARGIN_MM = 10
/** Room on each sheet for the heading, the ruler and the safety note, in mm. */
export const SHEET_RESERVED_MM = 75
/** The row-number column each side of the card, in mm. */
export const LABEL_MM = 9

export interface CardSheetInput {
  /** Needles across and rows down the card. */
  width: number
  rows: number
  holePitchMm: number
  rowPitchMm: number
  paper: CardPaper
  /** Card beyond the hole area (which ends half a pitch past the outer holes), each side, in mm. */
  edgeMm?: number
}

export interface CardSheetPart {
  /** 1-based sheet number. */
  index: number
  /** Card rows on this sheet, 0-based, `fromRow` ≤ r < `toRow`. */
  fromRow: number
  toRow: number
  /** The SVG's size in mm. */
  widthMm: number
  heightMm: number
  /** The card's top and bottom edge: a cut line at the card's ends, a join line between sheets. */
  topY: number
  bottomY: number
  cutTop: boolean
  cutBottom: boolean
}

export interface CardSheetLayout {
  /** The card's outer size across, and its left edge in every sheet's SVG. */
  cardWidthMm: number
  cardLeftMm: number
  /** The whole card's outer length, all sheets together. */
  cardLengthMm: number
  edgeMm: number
  holePitchMm: number
  rowPitchMm: number
  rowsPerSheet: number
  sheets: CardSheetPart[]
}

const PAD_MM = 3

/** Rows that fit on one sheet of `paper` at `rowPitchMm` (at least one). */
export function rowsPerSheet(paper: CardPaper, rowPitchMm: number): number {
  const room = PAPER_MM[paper].height - 2 * SHEET_MARGIN_MM - SHEET_RESERVED_MM - 2 * PAD_MM - 2 * rowPitchMm
  return Math.max(1, Math.floor(room / rowPitchMm + 1e-9))
}

export function cardSheetLayout(input: CardSheetInput): CardSheetLayout {
  const { width, rows, holePitchMm, rowPitchMm, paper } = input
  const edgeMm = input.edgeMm ?? 6
  const cardWidthMm = width * holePitchMm + 2 * edgeMm
  const perSheet = rowsPerSheet(paper, rowPitchMm)
  const count = Math.max(1, Math.ceil(rows / perSheet))
  const sheets: CardSheetPart[] = []
  for (let i = 0; i < count; i++) {
    const fromRow = i * perSheet
    const toRow = Math.min(rows, fromRow + perSheet)
    const cutTop = i === count - 1
    const cutBottom = i === 0
    const topY = PAD_MM
    const rowsTop = topY + (cutTop ? rowPitchMm : 0)
    const bottomY = rowsTop + (toRow - fromRow) * rowPitchMm + (cutBottom ? rowPitchMm : 0)
    sheets.push({ index: i + 1, fromRow, toRow, widthMm: cardWidthMm + 2 * LABEL_MM, heightMm: bottomY + PAD_MM, topY, bottomY, cutTop, cutBottom })
  }
  const cardLengthMm = (rows + 2) * rowPitchMm
  return { cardWidthMm, cardLeftMm: LABEL_MM, cardLengthMm, edgeMm, holePitchMm, rowPitchMm, rowsPerSheet: perSheet, sheets }
}

/** The centre of printed column `col` (0 = left as printed), card row `row`, on its sheet, in mm. */
export function holeCentre(layout: CardSheetLayout, sheet: CardSheetPart, col: number, row: number) {
  const x = layout.cardLeftMm + layout.edgeMm + (col + 0.5) * layout.holePitchMm
  const rowsTop = sheet.topY + (sheet.cutTop ? layout.rowPitchMm : 0)
  const y = rowsTop + (sheet.toRow - 1 - row + 0.5) * layout.rowPitchMm
  return { x, y }
}

export interface RulerTick {
  x: number
  /** Tick length in mm: long at each cm, middle at each 5 mm, short at each mm. */
  length: number
  /** The cm number under a long tick. */
  label?: string
}

/** A ruler `lengthMm` long (10 cm unless told), a tick each mm, from x = 0. */
export function rulerTicks(lengthMm = 100): RulerTick[] {
  const ticks: RulerTick[] = []
  for (let mm = 0; mm <= lengthMm; mm++) {
    if (mm % 10 === 0) ticks.push({ x: mm, length: 5, label: String(mm / 10) })
    else ticks.push({ x: mm, length: mm % 5 === 0 ? 3.5 : 2 })
  }
  return ticks
}
