// Spreading shaping evenly: steps over rows (the handbooks' "magic formula")
// and changes across a row.

import { KnittingInputError } from './errors'
import { requireInteger } from './validate'

/** Most rows a shaping may be spread over. */
export const MAX_SHAPING_ROWS = 100000

export interface ShapingStep {
  /** Shape on every `every`-th row … */
  every: number
  /** … this many times. */
  times: number
}

/** Shaping of one section (null for sections that keep their width). */
export interface SectionShaping { change: 'increase' | 'decrease'; steps: ShapingStep[] }

/**
 * Spread `steps` shapings over `rows` rows as evenly as whole rows allow.
 * With q = ⌊rows / steps⌋ and r = rows mod steps: every q-th row (steps − r)
 * times, then every (q + 1)-th row r times. Entries with times 0 are left out;
 * the shorter interval comes first (declared order: shaping faster first).
 * sum(times) = steps, sum(every × times) = rows.
 */
export function spreadShaping(steps: number, rows: number): ShapingStep[] {
  requireInteger(steps, 'steps', 1, MAX_SHAPING_ROWS)
  requireInteger(rows, 'rows', 1, MAX_SHAPING_ROWS)
  if (steps > rows) {
    throw new KnittingInputError(`steps: ${steps} shaping steps do not fit in ${rows} rows (at most one per row)`, { field: 'steps' })
  }
  const q = Math.floor(rows / steps)
  const r = rows % steps
  const out: ShapingStep[] = [{ every: q, times: steps - r }]
  if (r > 0) out.push({ every: q + 1, times: r })
  return out
}

/** English ordinal: 1st, 2nd, 3rd, 4th, 11th, 12th, 13th, 21st, 22nd, 101st, 111th … */
export function ordinal(n: number): string {
  requireInteger(n, 'n', 0)
  const mod100 = n % 100
  if (mod100 >= 11 && mod100 <= 13) return `${n}th`
  switch (n % 10) {
    case 1: return `${n}st`
    case 2: return `${n}nd`
    case 3: return `${n}rd`
    default: return `${n}th`
  }
}

/** "every 3rd row ×4, every 4th row ×32"; an interval of 1 reads "every row". */
export function describeShaping(steps: ShapingStep[]): string {
  if (!Array.isArray(steps) || steps.length === 0) {
    throw new KnittingInputError('shaping: no steps to describe', { field: 'shaping' })
  }
  return steps.map((s, i) => {
    const every = requireInteger(s?.every, `shaping[${i}].every`, 1)
    const times = requireInteger(s?.times, `shaping[${i}].times`, 1)
    return `${every === 1 ? 'every row' : `every ${ordinal(every)} row`} ×${times}`
  }).join(', ')
}

export interface RowSpacing {
  /** Stitches in each group between changes: changes + 1 groups, sizes differ by at most 1. */
  groups: number[]
  /** For each change, the number of stitches to its left (1 … stitches − 1), ascending. */
  positions: number[]
}

/**
 * Space `changes` increases or decreases evenly across a row of `stitches`.
 *
 * Convention (declared; handbooks use both): changes + 1 gaps. Changes fall
 * between stitches, never at an edge, so the row splits into changes + 1
 * groups whose sizes differ by at most 1, the larger groups spread through
 * the row (change j sits after round((j + 1) × stitches / (changes + 1))
 * stitches, half up), which keeps the layout symmetric where the counts allow.
 * An increase is made in each gap; a decrease joins the stitches either side of it.
 * Needs changes ≤ stitches − 1 so every group holds a stitch.
 */
export function spaceAcrossRow(stitches: number, changes: number): RowSpacing {
  requireInteger(stitches, 'stitches', 2, MAX_SHAPING_ROWS)
  requireInteger(changes, 'changes', 1)
  if (changes > stitches - 1) {
    throw new KnittingInputError(
      `changes: ${changes} changes need at least ${changes + 1} stitches (one between each), the row has ${stitches}`,
      { field: 'changes' },
    )
  }
  const gaps = changes + 1
  const positions: number[] = new Array(changes)
  const groups: number[] = new Array(gaps)
  let prev = 0
  for (let j = 0; j < changes; j++) {
    // Integer form of round((j + 1) × stitches / gaps), half up.
    const pos = Math.floor((2 * (j + 1) * stitches + gaps) / (2 * gaps))
    positions[j] = pos
    groups[j] = pos - prev
    prev = pos
  }
  groups[changes] = stitches - prev
  return { groups, positions }
}
