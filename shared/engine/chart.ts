// The chart model and its text codec.
//
// Rows and columns in error messages (and in KnittingInputError.row / .col)
// are counted from 1, the way a knitter counts: row 1 is the first row
// knitted (rows[0]), column 1 the leftmost stitch seen from the knit side.

import { KnittingInputError } from './errors'
import type { Chart, Colour } from './types'

/** Widest chart accepted: wider than any domestic bed. */
export const MAX_CHART_WIDTH = 1000
/** Tallest chart accepted. */
export const MAX_CHART_HEIGHT = 20000

const MAIN_CHARS = new Set(['.', '0'])
const CONTRAST_CHARS = new Set(['x', 'X', '#', '1'])

/**
 * Read a chart from text rows. rows[0] is the first row knitted.
 * '.' or '0' is the main colour; 'x', 'X', '#' or '1' the contrast colour.
 * Throws on empty input, ragged rows and any other character, naming row and column.
 */
export function chartFromRows(rows: string[]): Chart {
  if (!Array.isArray(rows)) {
    throw new KnittingInputError('chart: expected a list of rows', { field: 'chart' })
  }
  if (rows.length === 0) {
    throw new KnittingInputError('chart: no rows', { field: 'chart' })
  }
  if (rows.length > MAX_CHART_HEIGHT) {
    throw new KnittingInputError(`chart: ${rows.length} rows, at most ${MAX_CHART_HEIGHT} allowed`, { field: 'chart' })
  }
  let width = -1
  let cells = new Uint8Array(0)
  for (let r = 0; r < rows.length; r++) {
    const text = rows[r]
    const rowNo = r + 1
    if (typeof text !== 'string') {
      throw new KnittingInputError(`chart row ${rowNo}: expected text`, { field: 'chart', row: rowNo })
    }
    // Iterate by code point so an emoji is reported whole, not as half a pair.
    const chars = Array.from(text)
    if (chars.length === 0) {
      throw new KnittingInputError(`chart row ${rowNo}: empty row`, { field: 'chart', row: rowNo })
    }
    if (width < 0) {
      width = chars.length
      if (width > MAX_CHART_WIDTH) {
        throw new KnittingInputError(`chart row 1: ${width} stitches, at most ${MAX_CHART_WIDTH} allowed`, { field: 'chart', row: 1 })
      }
      cells = new Uint8Array(width * rows.length)
    }
    for (let c = 0; c < chars.length && c < width; c++) {
      const ch = chars[c]!
      let value: Colour
      if (MAIN_CHARS.has(ch)) value = 0
      else if (CONTRAST_CHARS.has(ch)) value = 1
      else {
        throw new KnittingInputError(
          `chart row ${rowNo}, column ${c + 1}: unexpected character ${JSON.stringify(ch)} (use "." or "0" for main, "x", "X", "#" or "1" for contrast)`,
          { field: 'chart', row: rowNo, col: c + 1 },
        )
      }
      cells[r * width + c] = value
    }
    if (chars.length !== width) {
      throw new KnittingInputError(
        `chart row ${rowNo}: ${chars.length} stitches, expected ${width} like row 1`,
        { field: 'chart', row: rowNo, col: Math.min(chars.length, width) + 1 },
      )
    }
  }
  return { width, height: rows.length, cells }
}

/** Write a chart as text rows, '.' for main and 'x' for contrast; rows[0] is the first row knitted. */
export function chartToRows(chart: Chart): string[] {
  assertChart(chart)
  const { width, height, cells } = chart
  const out: string[] = new Array(height)
  for (let r = 0; r < height; r++) {
    let s = ''
    for (let c = 0; c < width; c++) s += cells[r * width + c] ? 'x' : '.'
    out[r] = s
  }
  return out
}

/** A new chart filled with one colour. */
export function createChart(width: number, height: number, fill: Colour = 0): Chart {
  checkSize(width, height, 'chart')
  if (fill !== 0 && fill !== 1) {
    throw new KnittingInputError(`chart: fill must be 0 (main) or 1 (contrast), got ${String(fill)}`, { field: 'chart' })
  }
  const cells = new Uint8Array(width * height)
  if (fill) cells.fill(1)
  return { width, height, cells }
}

/** The colour at 0-based (row, col); row 0 is the first row knitted. */
export function chartCell(chart: Chart, row: number, col: number): Colour {
  return chart.cells[row * chart.width + col] as Colour
}

function checkSize(width: unknown, height: unknown, field: string): void {
  if (typeof width !== 'number' || !Number.isInteger(width) || width < 1 || width > MAX_CHART_WIDTH) {
    throw new KnittingInputError(`${field}: width must be a whole number from 1 to ${MAX_CHART_WIDTH}, got ${String(width)}`, { field })
  }
  if (typeof height !== 'number' || !Number.isInteger(height) || height < 1 || height > MAX_CHART_HEIGHT) {
    throw new KnittingInputError(`${field}: height must be a whole number from 1 to ${MAX_CHART_HEIGHT}, got ${String(height)}`, { field })
  }
}

/**
 * Check that a value is a well-formed Chart: whole-number width and height
 * within limits, a Uint8Array of width × height cells holding only 0 and 1.
 */
export function assertChart(chart: unknown, field = 'chart'): asserts chart is Chart {
  if (typeof chart !== 'object' || chart === null) {
    throw new KnittingInputError(`${field}: expected a chart`, { field })
  }
  const { width, height, cells } = chart as Partial<Chart>
  checkSize(width, height, field)
  if (!(cells instanceof Uint8Array)) {
    throw new KnittingInputError(`${field}: cells must be a Uint8Array`, { field })
  }
  const w = width as number
  const h = height as number
  if (cells.length !== w * h) {
    throw new KnittingInputError(`${field}: ${cells.length} cells, expected ${w * h} (${w} × ${h})`, { field })
  }
  for (let i = 0; i < cells.length; i++) {
    if (cells[i]! > 1) {
      const row = Math.floor(i / w) + 1
      const col = (i % w) + 1
      throw new KnittingInputError(`${field} row ${row}, column ${col}: colour must be 0 or 1, got ${cells[i]}`, { field, row, col })
    }
  }
}
