// Where the motif sits: which chart column each needle in work knits, how the
// repeat is centred on the needles in work, and needle numbers on the bed.
//
// Bed numbering (common practice): needles are numbered outward from the
// centre of the bed, left and right. The centre lies between L1 and R1; there
// is no needle 0. In code a bed position is a signed whole number: −12 is L12,
// +12 is R12.

import { KnittingInputError } from './errors'
import type { Placement } from './types'
import { requireInteger } from './validate'

/** Most needles in work accepted: more than any domestic bed holds. */
export const MAX_NEEDLES = 1000

/** Validate a placement; returns needles and offset with the default applied. */
export function checkPlacement(placement: Placement, field = 'placement'): { needles: number; offset: number } {
  if (typeof placement !== 'object' || placement === null) {
    throw new KnittingInputError(`${field}: expected { needles, offset? }`, { field })
  }
  const needles = requireInteger(placement.needles, `${field}.needles`, 1, MAX_NEEDLES)
  const offset = placement.offset === undefined ? 0 : requireInteger(placement.offset, `${field}.offset`, 0)
  return { needles, offset }
}

/**
 * The chart column knitted by each needle in work: column[i] = (offset + i) mod width.
 * Precomputed once so the per-stitch loops do no division.
 */
export function needleColumns(width: number, needles: number, offset = 0): Int32Array {
  const out = new Int32Array(needles)
  let col = offset % width
  for (let i = 0; i < needles; i++) {
    out[i] = col
    col++
    if (col === width) col = 0
  }
  return out
}

export interface RepeatsAcross {
  /** Complete repeats knitted between the edges of the needles in work. */
  fullRepeats: number
  /** Stitches of a partial repeat at the left edge (before the first column 0). */
  leftoverLeft: number
  /** Stitches of a partial repeat at the right edge (after the last complete repeat). */
  leftoverRight: number
}

/**
 * How a motif of `chartWidth` columns falls across the needles in work with
 * a given offset: complete repeats and partial stitches at each edge.
 * A repeat counts as complete when needles knit its columns 0 … width−1 in order.
 */
export function repeatsAcross(needles: number, chartWidth: number, offset = 0): RepeatsAcross {
  requireInteger(needles, 'needles', 1, MAX_NEEDLES)
  requireInteger(chartWidth, 'chartWidth', 1)
  requireInteger(offset, 'offset', 0)
  const before = (chartWidth - (offset % chartWidth)) % chartWidth
  if (before >= needles) return { fullRepeats: 0, leftoverLeft: needles, leftoverRight: 0 }
  const rest = needles - before
  const fullRepeats = Math.floor(rest / chartWidth)
  return { fullRepeats, leftoverLeft: before, leftoverRight: rest - fullRepeats * chartWidth }
}

/**
 * The offset that centres the motif on the needles in work: the centre of a
 * repeat lines up with the centre of the needles in work, so a symmetric motif
 * knits symmetric about the middle of the piece. When one of needles and chart
 * width is odd and the other even, exact centring is impossible and the repeat
 * sits half a stitch to the right of centre.
 */
export function centredOffset(needles: number, chartWidth: number): number {
  requireInteger(needles, 'needles', 1, MAX_NEEDLES)
  requireInteger(chartWidth, 'chartWidth', 1)
  const raw = Math.floor((chartWidth - needles) / 2)
  return ((raw % chartWidth) + chartWidth) % chartWidth
}

/** Bed position (signed, never 0) → label: −12 → 'L12', 12 → 'R12'. */
export function needleLabel(position: number): string {
  if (!Number.isInteger(position) || position === 0) {
    throw new KnittingInputError(`needle position: expected a whole number other than 0, got ${String(position)}`, { field: 'needle' })
  }
  return position < 0 ? `L${-position}` : `R${position}`
}

/** Label → bed position: 'L12' → −12, 'R12' → 12 (letter in either case). */
export function parseNeedleLabel(label: string): number {
  const m = typeof label === 'string' ? /^\s*([LRlr])\s*(\d+)\s*$/.exec(label) : null
  if (!m || Number(m[2]) === 0) {
    throw new KnittingInputError(`needle ${JSON.stringify(label)}: expected L or R followed by a needle number from 1, like L12`, { field: 'needle' })
  }
  const n = Number(m[2])
  return m[1]!.toUpperCase() === 'L' ? -n : n
}

// A bed position on a plain number line with no gap: L1 → −1, R1 → 0.
function toLine(position: number): number {
  return position < 0 ? position : position - 1
}
function fromLine(line: number): number {
  return line < 0 ? line : line + 1
}

/** Bed position `steps` needles to the right of `position` (skipping the centre gap). */
export function stepNeedle(position: number, steps: number): number {
  return fromLine(toLine(position) + steps)
}

/**
 * Bed position of the leftmost needle when `needles` are put in work centred
 * on the bed. With an odd count the extra needle goes on the left:
 * 7 needles → L4 … R3; 6 needles → L3 … R3.
 */
export function centredLeftmost(needles: number): number {
  requireInteger(needles, 'needles', 1, MAX_NEEDLES)
  return -Math.ceil(needles / 2)
}

/** Needles on each side of a bed of `bedNeedles` (an odd one extra on the left, as for work). */
function bedSides(bedNeedles: number): { left: number; right: number } {
  requireInteger(bedNeedles, 'bedNeedles', 1, 2 * MAX_NEEDLES)
  return { left: Math.ceil(bedNeedles / 2), right: Math.floor(bedNeedles / 2) }
}

export interface NeedlesOnBed {
  /** Bed position of the leftmost needle in work (signed). Default: centred. */
  leftmost?: number
  /** Needles on the whole bed; when given, needles outside it throw. */
  bedNeedles?: number
}

/**
 * Label on the bed ('L12' / 'R12') of needle `index` (0-based from the leftmost
 * needle in work) when `needles` are in work, centred unless `leftmost` says
 * otherwise.
 */
export function needleInWorkLabel(index: number, needles: number, where: NeedlesOnBed = {}): string {
  requireInteger(needles, 'needles', 1, MAX_NEEDLES)
  requireInteger(index, 'needle index', 0, needles - 1)
  const leftmost = resolveLeftmost(needles, where)
  return needleLabel(stepNeedle(leftmost, index))
}

function resolveLeftmost(needles: number, where: NeedlesOnBed): number {
  const leftmost = where.leftmost === undefined ? centredLeftmost(needles) : where.leftmost
  if (!Number.isInteger(leftmost) || leftmost === 0) {
    throw new KnittingInputError(`leftmost: expected a bed position other than 0, got ${String(leftmost)}`, { field: 'leftmost' })
  }
  if (where.bedNeedles !== undefined) {
    const { left, right } = bedSides(where.bedNeedles)
    const rightmost = stepNeedle(leftmost, needles - 1)
    if (leftmost < -left || rightmost > right) {
      throw new KnittingInputError(
        `needles in work ${needleLabel(leftmost)} to ${needleLabel(rightmost)} do not fit a bed of ${where.bedNeedles} needles (L${left} to R${right})`,
        { field: 'needles' },
      )
    }
  }
  return leftmost
}

export interface MotifPlacementInput {
  needles: number
  chartWidth: number
  bedNeedles?: number
  /** Bed position of the leftmost needle in work; default centred on the bed. */
  leftmost?: number
}

export interface MotifPlacement extends RepeatsAcross {
  /** Chart column knitted by the leftmost needle in work (centred motif). */
  offset: number
  /** Bed positions and labels of the outermost needles in work. */
  leftmostPosition: number
  rightmostPosition: number
  leftmostLabel: string
  rightmostLabel: string
}

/**
 * Centre a motif on the needles in work and put the needles on the bed:
 * the centred offset (see centredOffset), complete repeats and partial
 * stitches at each edge, and the outermost needles as bed labels.
 */
export function placeMotif(input: MotifPlacementInput): MotifPlacement {
  const needles = requireInteger(input.needles, 'needles', 1, MAX_NEEDLES)
  const chartWidth = requireInteger(input.chartWidth, 'chartWidth', 1)
  const leftmost = resolveLeftmost(needles, { leftmost: input.leftmost, bedNeedles: input.bedNeedles })
  const offset = centredOffset(needles, chartWidth)
  const rightmost = stepNeedle(leftmost, needles - 1)
  return {
    offset,
    ...repeatsAcross(needles, chartWidth, offset),
    leftmostPosition: leftmost,
    rightmostPosition: rightmost,
    leftmostLabel: needleLabel(leftmost),
    rightmostLabel: needleLabel(rightmost),
  }
}
