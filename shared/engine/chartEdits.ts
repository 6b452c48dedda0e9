// Chart edits for the motif editor: plain functions over a Chart (row 0 is the first row
// knitted, drawn at the bottom) that return a new chart and leave the old one as it was.

import { createChart } from './chart'
import type { Chart, Colour } from './types'

export function copyChart(chart: Chart): Chart {
  return { width: chart.width, height: chart.height, cells: chart.cells.slice() }
}

export function sameChart(a: Chart, b: Chart): boolean {
  if (a.width !== b.width || a.height !== b.height) return false
  for (let i = 0; i < a.cells.length; i++) if (a.cells[i] !== b.cells[i]) return false
  return true
}

/** Main and contrast swapped in every stitch. */
export function invertChart(chart: Chart): Chart {
  const out = copyChart(chart)
  for (let i = 0; i < out.cells.length; i++) out.cells[i] = out.cells[i] ? 0 : 1
  return out
}

/** Left and right swapped (a mirror standing beside the chart). */
export function mirrorChart(chart: Chart): Chart {
  const { width, height, cells } = chart
  const out = new Uint8Array(cells.length)
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) out[r * width + c] = cells[r * width + (width - 1 - c)]!
  }
  return { width, height, cells: out }
}

/**
 * Every stitch moved `right` stitches to the right and `up` rows up (negative moves the
 * other way); what falls off one edge comes back at the opposite edge, as in a repeat.
 */
export function shiftChart(chart: Chart, right: number, up: number): Chart {
  const { width, height, cells } = chart
  const out = new Uint8Array(cells.length)
  const dx = ((right % width) + width) % width
  const dy = ((up % height) + height) % height
  for (let r = 0; r < height; r++) {
    const to = ((r + dy) % height) * width
    for (let c = 0; c < width; c++) out[to + ((c + dx) % width)] = cells[r * width + c]!
  }
  return { width, height, cells: out }
}

/**
 * A new size that keeps the bottom-left corner: the first rows knitted and the leftmost
 * stitches stay where they are; new stitches and rows are in the main colour.
 */
export function resizeChart(chart: Chart, width: number, height: number): Chart {
  const out = createChart(width, height)
  const w = Math.min(width, chart.width)
  const h = Math.min(height, chart.height)
  for (let r = 0; r < h; r++) {
    for (let c = 0; c < w; c++) out.cells[r * width + c] = chart.cells[r * chart.width + c]!
  }
  return out
}

export function fillRow(chart: Chart, row: number, colour: Colour): Chart {
  const out = copyChart(chart)
  out.cells.fill(colour, row * chart.width, (row + 1) * chart.width)
  return out
}

export function fillColumn(chart: Chart, col: number, colour: Colour): Chart {
  const out = copyChart(chart)
  for (let r = 0; r < chart.height; r++) out.cells[r * chart.width + col] = colour
  return out
}

/** The cells on a straight line between two cells (both ends included), so a fast drag leaves no gaps. */
export function cellsBetween(from: { row: number; col: number }, to: { row: number; col: number }): { row: number; col: number }[] {
  const out: { row: number; col: number }[] = []
  const steps = Math.max(Math.abs(to.row - from.row), Math.abs(to.col - from.col))
  for (let i = 0; i <= steps; i++) {
    const t = steps === 0 ? 0 : i / steps
    out.push({ row: Math.round(from.row + (to.row - from.row) * t), col: Math.round(from.col + (to.col - from.col) * t) })
  }
  return out
}
