// Float analysis over the real knitted width.
//
// Model (declared; trade notes in DESIGN.md §2):
// - Needle i of the needles in work knits chart column (offset + i) mod width,
//   so floats run across repeat boundaries but stop at the edges of the work.
// - A float of yarn k is a run of consecutive stitches of the other colour
//   (1 − k). Runs that reach an edge of the work count in full.
// - A row where yarn k knits no stitch at all is reported as `unused: k` (a
//   full-width float, usually cut and woven in) and left out of yarn k's
//   maxima; that row's own maxFloat[k] is 0.
// - Verdict from the longest float of either yarn: ≤ 3 tidy, 4–5 moderate,
//   ≥ 6 long (machine knitters' common practice).

import { assertChart } from './chart'
import { KnittingInputError } from './errors'
import { checkPlacement, needleColumns } from './placement'
import type { Chart, Colour, Placement } from './types'
import { requireInteger, requirePositive } from './validate'

/** Longest float still counted tidy, in stitches. */
export const TIDY_FLOAT_MAX = 3
/** Longest float still counted moderate; anything longer is long. */
export const MODERATE_FLOAT_MAX = 5
/** Default limit for `longRows`, in stitches. */
export const DEFAULT_FLOAT_LIMIT = 5

export type FloatVerdict = 'tidy' | 'moderate' | 'long'

export interface FloatOptions {
  /** Rows with a float longer than this (stitches) are listed in longRows. Default 5. */
  limit?: number
  /** Stitch width from the swatch gauge; when given, maxFloatMm is filled in. */
  stitchWidthMm?: number
}

export interface RowFloats {
  /** Longest float per yarn (index = colour) in this row; 0 for an unused yarn. */
  maxFloat: [number, number]
  /** The yarn that knits no stitch in this row, if any. */
  unused: Colour | null
}

export interface FloatAnalysis {
  maxFloat: [number, number]
  maxFloatMm?: [number, number]
  rows: RowFloats[]
  longRows: number[]
  verdict: FloatVerdict
  /** The limit used for longRows. */
  limit: number
  /** Chart rows where each yarn knits nothing (index = colour). */
  unusedRows: [number[], number[]]
}

/** Verdict for a longest float of `stitches`: ≤ 3 tidy, 4–5 moderate, ≥ 6 long. */
export function floatVerdict(stitches: number): FloatVerdict {
  if (stitches <= TIDY_FLOAT_MAX) return 'tidy'
  if (stitches <= MODERATE_FLOAT_MAX) return 'moderate'
  return 'long'
}

/**
 * Floats of both yarns in every chart row, over the needles in work.
 * O(needles × chart height), one pass per row and no allocation per stitch.
 */
export function analyseFloats(chart: Chart, placement: Placement, opts: FloatOptions = {}): FloatAnalysis {
  assertChart(chart)
  const { needles, offset } = checkPlacement(placement)
  if (typeof opts !== 'object' || opts === null) {
    throw new KnittingInputError('options: expected { limit?, stitchWidthMm? }', { field: 'options' })
  }
  const limit = opts.limit === undefined ? DEFAULT_FLOAT_LIMIT : requireInteger(opts.limit, 'limit', 1)
  const stitchWidthMm = opts.stitchWidthMm === undefined ? undefined : requirePositive(opts.stitchWidthMm, 'stitchWidthMm')

  const { width, height, cells } = chart
  const cols = needleColumns(width, needles, offset)
  const rows: RowFloats[] = new Array(height)
  const longRows: number[] = []
  const unusedRows: [number[], number[]] = [[], []]
  let max0 = 0
  let max1 = 0

  for (let r = 0; r < height; r++) {
    const base = r * width
    // Longest run of each colour; a run of colour c is a float of yarn 1 − c.
    let run0 = 0
    let run1 = 0
    let best0 = 0
    let best1 = 0
    for (let i = 0; i < needles; i++) {
      if (cells[base + cols[i]!] === 0) {
        run0++
        if (run1 > best1) best1 = run1
        run1 = 0
      }
      else {
        run1++
        if (run0 > best0) best0 = run0
        run0 = 0
      }
    }
    if (run0 > best0) best0 = run0
    if (run1 > best1) best1 = run1

    let unused: Colour | null = null
    let float0 = best1 // yarn 0 (main) floats behind contrast stitches
    let float1 = best0
    if (best1 === needles) { unused = 0; float0 = 0; float1 = 0; unusedRows[0].push(r) }
    else if (best0 === needles) { unused = 1; float0 = 0; float1 = 0; unusedRows[1].push(r) }
    if (float0 > max0) max0 = float0
    if (float1 > max1) max1 = float1
    if (float0 > limit || float1 > limit) longRows.push(r)
    rows[r] = { maxFloat: [float0, float1], unused }
  }

  const result: FloatAnalysis = {
    maxFloat: [max0, max1],
    rows,
    longRows,
    verdict: floatVerdict(Math.max(max0, max1)),
    limit,
    unusedRows,
  }
  if (stitchWidthMm !== undefined) result.maxFloatMm = [max0 * stitchWidthMm, max1 * stitchWidthMm]
  return result
}
