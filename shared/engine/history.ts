// A bounded undo history of whole-chart snapshots, as plain data (the editor keeps it in a ref).

import type { Chart } from './types'

/** A bounded undo history of whole-chart snapshots (a 200 × 500 motif is 100 kB a step). */
export interface ChartHistory { past: Chart[]; future: Chart[]; limit: number }

export function createHistory(limit = 100): ChartHistory {
  return { past: [], future: [], limit }
}

/** Remember `before` as the state an undo goes back to; a new change clears the redo list. */
export function recordHistory(history: ChartHistory, before: Chart): ChartHistory {
  const past = [...history.past, before]
  if (past.length > history.limit) past.splice(0, past.length - history.limit)
  return { past, future: [], limit: history.limit }
}

export function undoHistory(history: ChartHistory, current: Chart): { history: ChartHistory; chart: Chart } | null {
  const chart = history.past[history.past.length - 1]
  if (!chart) return null
  return { chart, history: { past: history.past.slice(0, -1), future: [...history.future, current], limit: history.limit } }
}

export function redoHistory(history: ChartHistory, current: Chart): { history: ChartHistory; chart: Chart } | null {
  const chart = history.future[history.future.length - 1]
  if (!chart) return null
  return { chart, history: { past: [...history.past, current], future: history.future.slice(0, -1), limit: history.limit } }
}
