import { computed, shallowRef, triggerRef } from 'vue'
import { MAX_CHART_HEIGHT, MAX_CHART_WIDTH, chartFromRows, chartToRows, createChart } from '../shared/knitting'
import type { Chart, Colour } from '../shared/knitting'

// The motif editor's state and tools. The operations are plain functions over a Chart
// (row 0 is the first row knitted, drawn at the bottom) that return a new chart, so they can
// be unit tested without Vue; the composable below only holds the current chart and history.

/** Largest motif the editor offers (the tablet grid stays smooth at this size). */
export const EDITOR_MAX_WIDTH = Math.min(200, MAX_CHART_WIDTH)
export const EDITOR_MAX_HEIGHT = Math.min(500, MAX_CHART_HEIGHT)
/** Stitch sizes on screen, in CSS px; 44 and up suit a fingertip. */
export const CELL_SIZES = [6, 8, 10, 12, 16, 20, 24, 28, 36, 44, 56] as const

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

/** A bounded undo history of whole-chart snapshots (a 200 × 500 motif is 100 kB a step). */
export interface History { past: Chart[]; future: Chart[]; limit: number }

export function createHistory(limit = 100): History {
  return { past: [], future: [], limit }
}

/** Remember `before` as the state an undo goes back to; a new change clears the redo list. */
export function recordHistory(history: History, before: Chart): History {
  const past = [...history.past, before]
  if (past.length > history.limit) past.splice(0, past.length - history.limit)
  return { past, future: [], limit: history.limit }
}

export function undoHistory(history: History, current: Chart): { history: History; chart: Chart } | null {
  const chart = history.past[history.past.length - 1]
  if (!chart) return null
  return { chart, history: { past: history.past.slice(0, -1), future: [...history.future, current], limit: history.limit } }
}

export function redoHistory(history: History, current: Chart): { history: History; chart: Chart } | null {
  const chart = history.future[history.future.length - 1]
  if (!chart) return null
  return { chart, history: { past: [...history.past, current], future: history.future.slice(0, -1), limit: history.limit } }
}

/** Editor state: the chart, the stroke in progress and the undo history. */
export function useMotifEditor(initialRows: string[], options: { historyLimit?: number } = {}) {
  const chart = shallowRef<Chart>(chartFromRows(initialRows))
  const history = shallowRef<History>(createHistory(options.historyLimit))
  /** Bumped on every change so the canvas and the float check know to look again. */
  const version = shallowRef(0)
  let strokeStart: Chart | null = null

  function changed() {
    version.value++
    triggerRef(chart)
  }

  /** Replace the chart by a tool's result as one undoable step. */
  function apply(next: Chart) {
    if (sameChart(next, chart.value)) return
    history.value = recordHistory(history.value, chart.value)
    chart.value = next
    changed()
  }

  /** A drag paints in place; the whole stroke is one undo step. */
  function beginStroke() { strokeStart = copyChart(chart.value) }
  function paint(row: number, col: number, colour: Colour): boolean {
    const c = chart.value
    if (row < 0 || col < 0 || row >= c.height || col >= c.width) return false
    const i = row * c.width + col
    if (c.cells[i] === colour) return false
    if (!strokeStart) beginStroke()
    c.cells[i] = colour
    changed()
    return true
  }
  function endStroke() {
    if (strokeStart && !sameChart(strokeStart, chart.value)) history.value = recordHistory(history.value, strokeStart)
    strokeStart = null
  }

  function undo() {
    endStroke()
    const step = undoHistory(history.value, chart.value)
    if (!step) return
    history.value = step.history
    chart.value = step.chart
    changed()
  }
  function redo() {
    const step = redoHistory(history.value, chart.value)
    if (!step) return
    history.value = step.history
    chart.value = step.chart
    changed()
  }

  /** Replace without an undo step (the server's copy after a reload). */
  function load(rows: string[]) {
    chart.value = chartFromRows(rows)
    history.value = createHistory(options.historyLimit)
    changed()
  }

  return {
    chart, version,
    rows: () => chartToRows(chart.value),
    canUndo: computed(() => history.value.past.length > 0),
    canRedo: computed(() => history.value.future.length > 0),
    beginStroke, paint, endStroke, undo, redo, load,
    invert: () => apply(invertChart(chart.value)),
    mirror: () => apply(mirrorChart(chart.value)),
    shiftBy: (right: number, up: number) => apply(shiftChart(chart.value, right, up)),
    resize: (width: number, height: number) => apply(resizeChart(chart.value, width, height)),
    fillRow: (row: number, colour: Colour) => apply(fillRow(chart.value, row, colour)),
    fillColumn: (col: number, colour: Colour) => apply(fillColumn(chart.value, col, colour)),
  }
}

export type MotifEditor = ReturnType<typeof useMotifEditor>
