// Plan compilation: a list of sections → one entry per machine row (carriage
// pass), in knitting order.
//
// Declared model:
// - plain: `rows` machine rows in [yarn].
// - motif, 'together': both yarns in one pass, one machine row per chart row,
//   yarns [main, contrast].
// - motif, 'colour-by-colour': per chart row, passesPerColour rows in [main]
//   then passesPerColour rows in [contrast]; a section starts with the main colour.
// - chartRow runs 0 … height − 1 and starts again (chartRows may exceed the
//   chart height); plain rows have chartRow null.
// - changes: every row r ≥ 1 whose yarn list differs from row r − 1, compared
//   in order (swapping which yarn is main counts as a change: the feeder
//   positions change).
// - An empty section list compiles to an empty timeline (a plan being drafted).

import { assertChart } from './chart'
import { KnittingInputError } from './errors'
import type { Chart } from './types'
import { requireInteger, requireName, requireObject } from './validate'

export type Technique = 'together' | 'colour-by-colour'

export interface PlainSection { kind: 'plain'; rows: number; yarn: string }
export interface MotifSection { kind: 'motif'; chart: Chart; chartRows: number; main: string; contrast: string }
export type PlanSection = PlainSection | MotifSection

export interface PlanInput {
  technique: Technique
  /** colour-by-colour only (ignored for 'together'); default 2. */
  passesPerColour?: number
  sections: PlanSection[]
}

export interface PlanRow {
  /** Index into plan.sections. */
  section: number
  /** Yarns in the feeder for this pass; main first in a 'together' motif row. */
  yarns: string[]
  /** Chart row knitted (0-based), null for plain rows. */
  chartRow: number | null
  /** 0-based machine row within the section. */
  rowInSection: number
}

export interface CompiledPlan {
  rows: PlanRow[]
  changes: number[]
}

export const DEFAULT_PASSES_PER_COLOUR = 2
export const MAX_PASSES_PER_COLOUR = 8
/** Most machine rows one plan may compile to. */
export const MAX_PLAN_ROWS = 200000

/** Validate a plan and return the passes per colour that apply. */
export function checkPlan(plan: PlanInput): { passes: number; machineRows: number } {
  const p = requireObject(plan, 'plan')
  if (p.technique !== 'together' && p.technique !== 'colour-by-colour') {
    throw new KnittingInputError(
      `plan.technique: expected "together" or "colour-by-colour", got ${JSON.stringify(p.technique) ?? 'nothing'}`,
      { field: 'plan.technique' },
    )
  }
  let passes = 1
  if (p.technique === 'colour-by-colour') {
    passes = p.passesPerColour === undefined
      ? DEFAULT_PASSES_PER_COLOUR
      : requireInteger(p.passesPerColour, 'plan.passesPerColour', 1, MAX_PASSES_PER_COLOUR)
  }
  if (!Array.isArray(p.sections)) {
    throw new KnittingInputError('plan.sections: expected a list of sections', { field: 'plan.sections' })
  }
  let machineRows = 0
  p.sections.forEach((raw: unknown, i: number) => {
    const field = `plan.sections[${i}]`
    const s = requireObject(raw, field)
    if (s.kind === 'plain') {
      requireInteger(s.rows, `${field}.rows`, 1, MAX_PLAN_ROWS)
      requireName(s.yarn, `${field}.yarn`)
      machineRows += s.rows as number
    }
    else if (s.kind === 'motif') {
      assertChart(s.chart, `${field}.chart`)
      requireInteger(s.chartRows, `${field}.chartRows`, 1, MAX_PLAN_ROWS)
      requireName(s.main, `${field}.main`)
      requireName(s.contrast, `${field}.contrast`)
      if (s.main === s.contrast) {
        throw new KnittingInputError(`${field}: main and contrast are the same yarn ${JSON.stringify(s.main)}`, { field: `${field}.contrast` })
      }
      machineRows += (s.chartRows as number) * (p.technique === 'together' ? 1 : 2 * passes)
    }
    else {
      throw new KnittingInputError(`${field}.kind: expected "plain" or "motif", got ${JSON.stringify(s.kind) ?? 'nothing'}`, { field: `${field}.kind` })
    }
    if (machineRows > MAX_PLAN_ROWS) {
      throw new KnittingInputError(`plan: more than ${MAX_PLAN_ROWS} machine rows`, { field: `${field}` })
    }
  })
  return { passes, machineRows }
}

function sameYarns(a: string[], b: string[]): boolean {
  if (a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false
  return true
}

/** Compile a plan into its row timeline and the rows where the yarns change. */
export function compilePlan(plan: PlanInput): CompiledPlan {
  const { passes, machineRows } = checkPlan(plan)
  const rows: PlanRow[] = new Array(machineRows)
  let n = 0
  plan.sections.forEach((s, section) => {
    if (s.kind === 'plain') {
      for (let k = 0; k < s.rows; k++) rows[n++] = { section, yarns: [s.yarn], chartRow: null, rowInSection: k }
      return
    }
    const height = s.chart.height
    let k = 0
    for (let c = 0; c < s.chartRows; c++) {
      const chartRow = c % height
      if (plan.technique === 'together') {
        rows[n++] = { section, yarns: [s.main, s.contrast], chartRow, rowInSection: k++ }
      }
      else {
        for (let q = 0; q < passes; q++) rows[n++] = { section, yarns: [s.main], chartRow, rowInSection: k++ }
        for (let q = 0; q < passes; q++) rows[n++] = { section, yarns: [s.contrast], chartRow, rowInSection: k++ }
      }
    }
  })
  const changes: number[] = []
  for (let r = 1; r < n; r++) {
    if (!sameYarns(rows[r]!.yarns, rows[r - 1]!.yarns)) changes.push(r)
  }
  return { rows, changes }
}

/**
 * The next row index ≥ `row` (0-based) where the yarns change, or null if none
 * is left. `changes` is CompiledPlan.changes (ascending).
 */
export function nextChange(changes: number[], row: number): number | null {
  let lo = 0
  let hi = changes.length
  while (lo < hi) {
    const mid = (lo + hi) >>> 1
    if (changes[mid]! < row) lo = mid + 1
    else hi = mid
  }
  return lo < changes.length ? changes[lo]! : null
}
