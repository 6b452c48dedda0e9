import { computed, shallowRef, triggerRef } from 'vue'
import {
  MAX_CHART_HEIGHT,
  MAX_CHART_WIDTH,
  chartFromRows,
  chartToRows,
  copyChart,
  createHistory,
  fillColumn,
  fillRow,
  invertChart,
  mirrorChart,
  recordHistory,
  redoHistory,
  resizeChart,
  sameChart,
  shiftChart,
  undoHistory,
} from '#shared/engine'
import type { Chart, ChartHistory, Colour } from '#shared/engine'

// The motif editor's state: the current chart, the stroke in progress and the undo history.
// The tools themselves are the engine's chart edits (#shared/engine/chartEdits) and history.

/** Largest motif the editor offers (the tablet grid stays smooth at this size). */
export const EDITOR_MAX_WIDTH = Math.min(200, MAX_CHART_WIDTH)
export const EDITOR_MAX_HEIGHT = Math.min(500, MAX_CHART_HEIGHT)
/** Stitch sizes on screen, in CSS px; 44 and up suit a fingertip. */
export const CELL_SIZES = [6, 8, 10, 12, 16, 20, 24, 28, 36, 44, 56] as const

/** Editor state: the chart, the stroke in progress and the undo history. */
export function useMotifEditor(initialRows: string[], options: { historyLimit?: number } = {}) {
  const chart = shallowRef<Chart>(chartFromRows(initialRows))
  const history = shallowRef<ChartHistory>(createHistory(options.historyLimit))
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
    /** Replace by other rows (another copy of the motif) as one undoable step. */
    take: (rows: string[]) => { endStroke(); apply(chartFromRows(rows)) },
    invert: () => apply(invertChart(chart.value)),
    mirror: () => apply(mirrorChart(chart.value)),
    shiftBy: (right: number, up: number) => apply(shiftChart(chart.value, right, up)),
    resize: (width: number, height: number) => apply(resizeChart(chart.value, width, height)),
    fillRow: (row: number, colour: Colour) => apply(fillRow(chart.value, row, colour)),
    fillColumn: (col: number, colour: Colour) => apply(fillColumn(chart.value, col, colour)),
  }
}

export type MotifEditor = ReturnType<typeof useMotifEditor>
